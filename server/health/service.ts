import { sql } from 'drizzle-orm';
import type { Deps } from '../deps';

export type CheckName = 'database' | 'redis' | 'mail' | 'storage';

async function within<T>(ms: number, what: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms);
  });
  try {
    return await Promise.race([what, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

/** Asks each service a cheap question; the answer names every check that failed and why. */
export async function checkHealth(deps: Deps) {
  const checks: Record<CheckName, () => Promise<unknown>> = {
    database: () => deps.db.execute(sql`select 1`),
    redis: () => deps.redis.ping(),
    mail: () => deps.mailer.check(),
    storage: () => deps.storage.check(),
  };
  const entries = await Promise.all(
    Object.entries(checks).map(async ([name, fn]) => {
      try {
        await within(3_000, fn());
        return [name, 'ok', undefined] as const;
      } catch (e) {
        return [name, 'failed', e instanceof Error ? e.message : String(e)] as const;
      }
    }),
  );
  const result = Object.fromEntries(entries.map(([n, s]) => [n, s])) as Record<CheckName, 'ok' | 'failed'>;
  const errors = Object.fromEntries(entries.filter(([, s]) => s !== 'ok').map(([n, , m]) => [n, m]));
  const ok = entries.every(([, s]) => s === 'ok');
  return { ok, body: { status: ok ? 'ok' : 'degraded', checks: result, ...(ok ? {} : { errors }) } };
}
