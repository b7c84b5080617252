import type { Config } from './config';
import { createDb } from './db/client';
import { createMailer } from './infra/mail';
import { createRedis, createSessionRedis } from './infra/redis';
import { createStorage } from './infra/storage';
import { producerConnection } from '../jobs/connection';
import { createQueues } from '../jobs/queues';

/** The connections one process holds. Built once at start and handed to the app and workers. */
export function createDeps(config: Config) {
  const { db, pool } = createDb(config.databaseUrl);
  const redis = createRedis(config.redisUrl);
  // Only when sessions live in Redis (SESSION_STORE).
  const sessionRedis = config.sessionStore === 'redis' ? createSessionRedis(config.redisUrl) : null;
  const storage = createStorage(config.s3);
  const mailer = createMailer(config.smtpUrl, config.mailFrom);
  // Producers: add jobs and read their state; they fail fast while Redis is away.
  const queueConnection = producerConnection(config.redisUrl);
  const queues = createQueues(queueConnection);
  return {
    config,
    db,
    pool,
    redis,
    sessionRedis,
    storage,
    mailer,
    queues,
    async close() {
      mailer.close();
      await queues.close().catch(() => {});
      queueConnection.disconnect();
      redis.disconnect();
      sessionRedis?.disconnect();
      storage.client.destroy();
      await pool.end();
    },
  };
}
export type Deps = ReturnType<typeof createDeps>;
