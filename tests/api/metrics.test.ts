import { afterAll, describe, expect, it } from 'vitest';
import { testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

/** The value of one sample line of the Prometheus text format, by its name and labels as printed. */
function sample(text: string, nameAndLabels: string): number {
  const line = text.split('\n').find((l) => l.startsWith(`${nameAndLabels} `));
  if (!line) throw new Error(`no sample ${nameAndLabels}`);
  return Number(line.slice(nameAndLabels.length + 1));
}

describe('GET /metrics', () => {
  it('shows request durations by route pattern, queues, outbox lag and the database pool', async () => {
    const office = await t.signIn('office');
    const orders = await office.get('/api/orders');
    const first = orders.body.orders[0].id as number;
    await office.get(`/api/orders/${first}`);
    await office.get(`/api/orders/${first}`);
    // An unsent outbox row created two minutes ago, due far ahead so no worker sends it meanwhile.
    const { rows } = await t.deps.pool.query<{ id: string }>(
      `insert into notifications (kind, status, created_at, due_at) values ('metrics_probe', 'pending', now() - interval '120 seconds', now() + interval '1 day') returning id`,
    );
    try {
      const res = await t.request().get('/metrics');
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
      const text = res.text;
      expect(text).toContain('# TYPE spoolwright_http_request_duration_seconds histogram');
      // Both reads of one order count under its pattern, never under its id.
      expect(sample(text, 'spoolwright_http_request_duration_seconds_count{method="GET",route="/api/orders/:id",status="200"}')).toBe(2);
      expect(text).not.toContain(`route="/api/orders/${first}"`);
      for (const queue of ['mail', 'travelers', 'documents']) {
        expect(sample(text, `spoolwright_queue_jobs{queue="${queue}",state="waiting"}`)).toBeGreaterThanOrEqual(0);
        expect(sample(text, `spoolwright_queue_failed_jobs{queue="${queue}"}`)).toBeGreaterThanOrEqual(0);
      }
      expect(sample(text, 'spoolwright_outbox_oldest_unsent_age_seconds')).toBeGreaterThanOrEqual(120);
      expect(sample(text, 'spoolwright_outbox_unsent')).toBeGreaterThanOrEqual(1);
      const total = sample(text, 'spoolwright_db_pool_connections{state="total"}');
      expect(total).toBeGreaterThanOrEqual(1);
      expect(sample(text, 'spoolwright_db_pool_connections{state="idle"}') + sample(text, 'spoolwright_db_pool_connections{state="in_use"}')).toBe(total);
      expect(sample(text, 'spoolwright_db_pool_max')).toBe(10);
      expect(sample(text, 'spoolwright_queue_reachable')).toBe(1);
    } finally {
      await t.deps.pool.query('delete from notifications where id = $1', [rows[0].id]);
    }
  });
});
