import { loadConfig } from '../server/config';
import { createDb } from '../server/db/client';
import { dropEverything, ensureDatabase, relaxCommitDurabilityForTests, runMigrations } from '../server/db/migrate';
import { seed } from '../server/seed/demo';
import { createStorage } from '../server/infra/storage';
import { Redis } from 'ioredis';

/** A clean test database: dropped, migrated and seeded once per run of the suite, and its bucket. */
export default async function setup() {
  process.env.NODE_ENV = 'test';
  const config = loadConfig();
  if (!new URL(config.databaseUrl).pathname.endsWith('_test')) {
    throw new Error(`Refusing to reset ${config.databaseUrl}: tests run against a database whose name ends in _test`);
  }
  await ensureDatabase(config.databaseUrl);
  // The server is durable (scripts/services.ts); only this throw-away database trades the wait
  // for each commit's disk flush for speed.
  await relaxCommitDurabilityForTests(config.databaseUrl);
  const { db, pool } = createDb(config.databaseUrl, 2);
  try {
    await dropEverything(pool);
    await runMigrations(db);
    await seed(db);
    // Queued jobs are keyed by database ids, which restart with the database: empty the test
    // Redis database too (never database 0, where a local demo keeps its queue).
    const redisDb = Number(new URL(config.redisUrl).pathname.slice(1) || 0);
    if (redisDb === 0) throw new Error(`Refusing to flush ${config.redisUrl}: tests use a Redis database other than 0`);
    const redis = new Redis(config.redisUrl, { maxRetriesPerRequest: 1 });
    await redis.flushdb();
    redis.disconnect();
    const storage = createStorage(config.s3);
    await storage.ensureBucket();
    storage.client.destroy();
  } finally {
    await pool.end();
  }
}
