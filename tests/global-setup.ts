import { loadConfig } from '../server/config';
import { createDb } from '../server/db/client';
import { dropEverything, ensureDatabase, runMigrations } from '../server/db/migrate';
import { seed } from '../server/seed/demo';
import { createStorage } from '../server/infra/storage';

/** A clean test database: dropped, migrated and seeded once per run of the suite, and its bucket. */
export default async function setup() {
  process.env.NODE_ENV = 'test';
  const config = loadConfig();
  if (!new URL(config.databaseUrl).pathname.endsWith('_test')) {
    throw new Error(`Refusing to reset ${config.databaseUrl}: tests run against a database whose name ends in _test`);
  }
  await ensureDatabase(config.databaseUrl);
  const { db, pool } = createDb(config.databaseUrl, 2);
  try {
    await dropEverything(pool);
    await runMigrations(db);
    await seed(db);
    const storage = createStorage(config.s3);
    await storage.ensureBucket();
    storage.client.destroy();
  } finally {
    await pool.end();
  }
}
