import { Redis } from 'ioredis';

/**
 * Redis connections for BullMQ. Workers block on Redis and must retry forever
 * (maxRetriesPerRequest: null); producers in the API fail fast instead, so a request never hangs
 * while Redis is away.
 */
export function workerConnection(url: string) {
  const r = new Redis(url, { maxRetriesPerRequest: null, retryStrategy: (n) => Math.min(n * 250, 3_000) });
  r.on('error', () => {});
  return r;
}

export function producerConnection(url: string) {
  const r = new Redis(url, {
    maxRetriesPerRequest: 1,
    enableOfflineQueue: false,
    connectTimeout: 3_000,
    retryStrategy: (n) => Math.min(n * 250, 3_000),
  });
  r.on('error', () => {});
  return r;
}
