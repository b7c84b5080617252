import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { Counter, Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client';
import { sql } from 'drizzle-orm';
import type { Deps } from '../deps';
import { QUEUES, type QueueKey } from '../../jobs/queues';

/** Seconds; from 5 ms (a cached read) to 10 s (a batch of travelers asked for at once). */
const DURATION_BUCKETS = [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10];
const JOB_STATES = ['waiting', 'active', 'delayed', 'failed', 'completed'] as const;

/** The route pattern a request matched ("/api/orders/:id"), so ids never become label values. */
function routeLabel(req: Request): string {
  const pattern = (req.route as { path?: string } | undefined)?.path;
  if (typeof pattern === 'string') return (req.originalUrl.startsWith('/api/') ? '/api' : '') + pattern;
  return req.originalUrl.startsWith('/api/') ? 'unmatched' : 'client';
}

/**
 * The process's Prometheus metrics, one registry per app: request durations by route pattern,
 * each queue's jobs by state (failures included), the outbox's unsent rows and the age of the
 * oldest, the database pool's connections, and Node's own (event loop, memory, GC).
 */
export function createMetrics(deps: Deps) {
  const registry = new Registry();
  collectDefaultMetrics({ register: registry, prefix: 'spoolwright_' });

  const duration = new Histogram({
    name: 'spoolwright_http_request_duration_seconds',
    help: 'Time to answer an HTTP request, by method, route pattern and status code',
    labelNames: ['method', 'route', 'status'],
    buckets: DURATION_BUCKETS,
    registers: [registry],
  });

  new Gauge({
    name: 'spoolwright_queue_jobs',
    help: 'Jobs on each background queue by state (failed: given up after every retry, until retried or cleared)',
    labelNames: ['queue', 'state'],
    registers: [registry],
    async collect() {
      this.reset();
      for (const key of Object.keys(QUEUES) as QueueKey[]) {
        const counts = await deps.queues.get(key).getJobCounts(...JOB_STATES).catch(() => null);
        if (!counts) continue;
        for (const state of JOB_STATES) this.set({ queue: QUEUES[key].name, state }, counts[state] ?? 0);
      }
    },
  });
  new Gauge({
    name: 'spoolwright_queue_failed_jobs',
    help: 'Jobs each queue gave up on after every retry (kept until an admin retries or clears them)',
    labelNames: ['queue'],
    registers: [registry],
    async collect() {
      this.reset();
      for (const key of Object.keys(QUEUES) as QueueKey[]) {
        const n = await deps.queues.get(key).getFailedCount().catch(() => null);
        if (n !== null) this.set({ queue: QUEUES[key].name }, n);
      }
    },
  });
  const queueUp = new Gauge({ name: 'spoolwright_queue_reachable', help: '1 when the queue store (Redis) answered this scrape', registers: [registry] });

  const outboxRows = new Gauge({ name: 'spoolwright_outbox_unsent', help: 'Outbox rows (e-mail) not sent yet: pending or being sent', registers: [registry] });
  const outboxAge = new Gauge({
    name: 'spoolwright_outbox_oldest_unsent_age_seconds',
    help: 'Age of the oldest outbox row not sent yet (0 when none waits)',
    registers: [registry],
  });
  /** Both outbox figures from one query, read before the registry renders. */
  async function readOutbox() {
    const r = await deps.db.execute<{ n: string; age: string | null }>(
      sql`select count(*)::bigint as n, extract(epoch from now() - min(created_at))::float8 as age from notifications where status in ('pending', 'sending')`,
    );
    outboxRows.set(Number(r.rows[0].n));
    outboxAge.set(Number(r.rows[0].age ?? 0));
  }

  new Gauge({
    name: 'spoolwright_db_pool_connections',
    help: "This process's PostgreSQL pool: connections by state (total, idle, in_use) and requests waiting for one",
    labelNames: ['state'],
    registers: [registry],
    collect() {
      const { totalCount, idleCount, waitingCount } = deps.pool;
      this.set({ state: 'total' }, totalCount);
      this.set({ state: 'idle' }, idleCount);
      this.set({ state: 'in_use' }, totalCount - idleCount);
      this.set({ state: 'waiting' }, waitingCount);
    },
  });
  new Gauge({
    name: 'spoolwright_db_pool_max',
    help: "The most connections this process's pool opens",
    registers: [registry],
    collect() {
      this.set((deps.pool as unknown as { options: { max: number } }).options.max);
    },
  });
  const scrapeErrors = new Counter({ name: 'spoolwright_metrics_scrape_errors_total', help: 'Scrapes in which a source (database, Redis) did not answer', registers: [registry] });

  /** Times every request; the label is read when the response is finished, after routing. */
  const observe: RequestHandler = (req: Request, res: Response, next: NextFunction) => {
    const end = duration.startTimer();
    res.once('finish', () => end({ method: req.method, route: routeLabel(req), status: String(res.statusCode) }));
    next();
  };

  async function render(): Promise<{ contentType: string; body: string }> {
    const up = await deps.redis.ping().then(() => 1, () => 0);
    queueUp.set(up);
    try {
      await readOutbox();
      return { contentType: registry.contentType, body: await registry.metrics() };
    } catch {
      scrapeErrors.inc();
      return { contentType: registry.contentType, body: await registry.metrics().catch(() => '') };
    }
  }

  return { registry, observe, render };
}
export type Metrics = ReturnType<typeof createMetrics>;
