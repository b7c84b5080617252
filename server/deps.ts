import type { Config } from './config';
import { createDb } from './db/client';
import { createMailer } from './infra/mail';
import { createRedis } from './infra/redis';
import { createStorage } from './infra/storage';

/** The connections one process holds. Built once at start and handed to the app and workers. */
export function createDeps(config: Config) {
  const { db, pool } = createDb(config.databaseUrl);
  const redis = createRedis(config.redisUrl);
  const storage = createStorage(config.s3);
  const mailer = createMailer(config.smtpUrl, config.mailFrom);
  return {
    config,
    db,
    pool,
    redis,
    storage,
    mailer,
    async close() {
      mailer.close();
      redis.disconnect();
      storage.client.destroy();
      await pool.end();
    },
  };
}
export type Deps = ReturnType<typeof createDeps>;
