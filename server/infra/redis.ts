import { Redis } from 'ioredis';

/**
 * A Redis connection for the API (login limiter, queue producers). It never throws at start-up
 * and reconnects by itself, so the API keeps answering while Redis is away.
 */
export function createRedis(url: string) {
  const redis = new Redis(url, {
    lazyConnect: false,
    enableOfflineQueue: false,
    maxRetriesPerRequest: 1,
    retryStrategy: (times) => Math.min(times * 200, 2_000),
  });
  redis.on('error', () => {});
  return redis;
}
export type { Redis };

/**
 * A Redis connection for sessions: a request arriving while it (re)connects waits for it (the
 * offline queue) instead of failing at once, a few retries at most, then the request fails.
 */
export function createSessionRedis(url: string) {
  const redis = new Redis(url, {
    enableOfflineQueue: true,
    maxRetriesPerRequest: 2,
    connectTimeout: 5_000,
    retryStrategy: (times) => Math.min(times * 200, 2_000),
  });
  redis.on('error', () => {});
  return redis;
}
