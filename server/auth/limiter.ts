import { RateLimiterRedis, RateLimiterRes } from 'rate-limiter-flexible';
import type { Redis } from '../infra/redis';

/** Failed sign-ins allowed per account and address before a pause. */
export const LOGIN_FAILURES_ALLOWED = 5;
export const LOGIN_BLOCK_SECONDS = 15 * 60;

/**
 * Counts failed sign-ins in Redis, keyed by account and address, so every API process shares the
 * count. A success clears it. When Redis is away, sign-in still works (no counting).
 */
export function createLoginLimiter(redis: Redis) {
  const limiter = new RateLimiterRedis({
    storeClient: redis,
    keyPrefix: 'spoolwright:login-fail',
    points: LOGIN_FAILURES_ALLOWED,
    duration: LOGIN_BLOCK_SECONDS,
    blockDuration: LOGIN_BLOCK_SECONDS,
    useRedisPackage: false,
  });
  const key = (email: string, ip: string) => `${email.trim().toLowerCase()}|${ip}`;

  return {
    /** Seconds to wait when this pair is blocked, else 0. */
    async blockedFor(email: string, ip: string): Promise<number> {
      try {
        const r = await limiter.get(key(email, ip));
        return r && r.consumedPoints >= LOGIN_FAILURES_ALLOWED ? Math.ceil(r.msBeforeNext / 1000) : 0;
      } catch {
        return 0;
      }
    },
    async failed(email: string, ip: string) {
      try {
        await limiter.consume(key(email, ip));
      } catch (e) {
        if (!(e instanceof RateLimiterRes)) return; // Redis away: do not block sign-in
      }
    },
    async succeeded(email: string, ip: string) {
      try {
        await limiter.delete(key(email, ip));
      } catch {
        /* Redis away */
      }
    },
  };
}
export type LoginLimiter = ReturnType<typeof createLoginLimiter>;
