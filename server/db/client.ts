import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Db = ReturnType<typeof createDb>['db'];
/** A transaction handle: the same query API as `Db`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export function createDb(databaseUrl: string, max = 10) {
  // Named prepared statements (the board's queries, server/floor/board-repository.ts) are planned
  // once per connection and reused; other queries are unnamed and planned each time as before.
  const pool = new pg.Pool({ connectionString: databaseUrl, max, connectionTimeoutMillis: 5_000, options: '-c plan_cache_mode=force_generic_plan' });
  // An idle client losing its connection must not take the process down.
  pool.on('error', () => {});
  const db = drizzle(pool, { schema });
  return { db, pool };
}
export { schema };
