import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Db = ReturnType<typeof createDb>['db'];
/** A transaction handle: the same query API as `Db`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export function createDb(databaseUrl: string, max = 10) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max, connectionTimeoutMillis: 5_000 });
  // An idle client losing its connection must not take the process down.
  pool.on('error', () => {});
  const db = drizzle(pool, { schema });
  return { db, pool };
}
export { schema };
