import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dispatchDue } from '../../jobs/dispatcher';
import { mailJobId } from '../../jobs/queues';
import { startWorkers } from '../../jobs/runtime';
import { notifications } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { mailForNotification, sleep, waitUntil } from '../helpers/mail';
import { newCompany, newOrder } from '../helpers/orders';

const root = path.resolve(import.meta.dirname, '..', '..');
const t = testApp();
let office: Awaited<ReturnType<typeof t.signIn>>;
let companyId: number;

beforeAll(async () => {
  office = await t.signIn('office');
  const company = await newCompany(office, [{ name: 'Wren Abernathy', email: 'wren@buyer.example', phone: '', notifyOrders: true, notifyShipping: true }]);
  companyId = company.id;
});
afterAll(() => t.close());

/** Enters and acknowledges an order; returns the outbox row id the acknowledgement wrote. */
async function acknowledgedOrder(agent = office) {
  const order = await newOrder(agent, companyId);
  const res = await agent.post(`/api/orders/${order.id}/acknowledge`).set(csrf).send({});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  const [row] = await t.deps.db.select().from(notifications).where(eq(notifications.orderId, order.id));
  expect(row.status).toBe('pending');
  const mail = () => mailForNotification(row.id, String(order.purchaseOrder));
  return { order, notificationId: row.id, mail };
}

const rowOf = async (id: number) => (await t.deps.db.select().from(notifications).where(eq(notifications.id, id)))[0];

describe('the outbox delivers each notification exactly once', () => {
  it('sends the acknowledgement to the order contact with the PO, the lines and a link', async () => {
    const { order, notificationId, mail: mailOf } = await acknowledgedOrder();
    const workers = startWorkers(t.deps, { dispatchIntervalMs: 200 });
    try {
      await waitUntil(async () => (await mailOf()).length > 0);
      await sleep(1_000); // would a second copy follow?
      const mail = await mailOf();
      expect(mail).toHaveLength(1);
      expect(mail[0].to.map((x) => x.address)).toEqual(['wren@buyer.example']);
      expect(mail[0].subject).toContain(String(order.purchaseOrder));
      expect(mail[0].text).toContain(order.number);
      expect(mail[0].html).toContain(`/orders/${order.id}`);
      const row = await rowOf(notificationId);
      expect(row.status).toBe('sent');
      expect(row.messageId).toContain(`notification-${notificationId}@`);
      expect(row.sentAt).toBeInstanceOf(Date);
    } finally {
      await workers.close();
    }
  });

  it('the dispatcher run twice at once (and by two workers) still sends one message', async () => {
    const { notificationId, mail } = await acknowledgedOrder();
    await Promise.all([dispatchDue(t.deps.db, t.deps.queues), dispatchDue(t.deps.db, t.deps.queues), dispatchDue(t.deps.db, t.deps.queues)]);
    const a = startWorkers(t.deps, { dispatchIntervalMs: 100 });
    const b = startWorkers(t.deps, { dispatchIntervalMs: 100 });
    try {
      await waitUntil(async () => (await mail()).length > 0);
      await sleep(1_500);
      expect(await mail()).toHaveLength(1);
      expect((await rowOf(notificationId)).status).toBe('sent');
    } finally {
      await Promise.all([a.close(), b.close()]);
    }
  });

  it('a worker killed in the middle of sending leaves the row unsent; another worker sends it once', async () => {
    const { notificationId, mail } = await acknowledgedOrder();
    // A worker process that pauses 20 s between rendering and sending (test-only setting).
    // One process (node with tsx's loader), so SIGKILL really kills the worker.
    const child = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
      cwd: root,
      env: { ...process.env, NODE_ENV: 'test', SPOOLWRIGHT_TEST_MAIL_DELAY_MS: '20000' },
      stdio: 'ignore',
    });
    try {
      // Wait until that worker holds the job.
      const until = Date.now() + 30_000;
      for (;;) {
        const job = await t.deps.queues.mail.getJob(mailJobId(notificationId));
        if (job && (await job.getState()) === 'active') break;
        if (Date.now() > until) throw new Error('the worker never picked the job up');
        await sleep(200);
      }
      child.kill('SIGKILL');
      await new Promise((r) => child.once('exit', r));
      expect(await mail()).toHaveLength(0);
      expect((await rowOf(notificationId)).status).toBe('pending');
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
    }
    // A healthy worker takes over once the dead one's lock runs out (stalled-job recovery).
    const healthy = startWorkers(t.deps, { dispatchIntervalMs: 500 });
    try {
      await waitUntil(async () => (await mail()).length > 0, 60_000);
      await sleep(1_500);
      expect(await mail()).toHaveLength(1);
      expect((await rowOf(notificationId)).status).toBe('sent');
    } finally {
      await healthy.close();
    }
  }, 120_000);

  it('a message that keeps failing is marked failed, shown to the admin, and sent once after a retry', async () => {
    const { notificationId, mail } = await acknowledgedOrder();
    // Queue the job ourselves with a single attempt, and run a worker whose SMTP relay is down.
    await t.deps.queues.mail.add('send', { notificationId }, { jobId: mailJobId(notificationId), attempts: 1 });
    const brokenApp = testApp({ SMTP_URL: 'smtp://127.0.0.1:9' });
    const broken = startWorkers(brokenApp.deps, { dispatchIntervalMs: 60_000 });
    try {
      const until = Date.now() + 30_000;
      while ((await rowOf(notificationId)).status !== 'failed') {
        if (Date.now() > until) throw new Error('the row never became failed');
        await sleep(200);
      }
    } finally {
      await broken.close();
      await brokenApp.close();
    }
    const row = await rowOf(notificationId);
    expect(row.lastError).toBeTruthy();
    expect(row.attempts).toBe(1);

    const admin = await t.signIn('admin');
    const listed = await admin.get('/api/notifications?status=failed');
    expect(listed.status).toBe(200);
    expect(listed.body.notifications.map((n: { id: number }) => n.id)).toContain(notificationId);
    const jobs = await admin.get('/api/jobs');
    expect(jobs.body.jobs.map((j: { id: string }) => j.id)).toContain(`mail.${mailJobId(notificationId)}`);
    const state = await admin.get(`/api/jobs/mail.${mailJobId(notificationId)}`);
    expect(state.body).toMatchObject({ state: 'failed', error: expect.any(String) });

    const retry = await admin.post(`/api/notifications/${notificationId}/retry`).set(csrf).send({});
    expect(retry.status).toBe(200);
    expect(retry.body.notification.status).toBe('pending');
    const healthy = startWorkers(t.deps, { dispatchIntervalMs: 200 });
    try {
      await waitUntil(async () => (await mail()).length > 0);
      await sleep(1_000);
      expect(await mail()).toHaveLength(1);
      const again = await admin.post(`/api/notifications/${notificationId}/retry`).set(csrf).send({});
      expect(again.status).toBe(422); // a sent message is never sent twice
    } finally {
      await healthy.close();
    }
  }, 90_000);
});

describe('job state', () => {
  it('is readable by the roles of its queue only; unknown ids are 404', async () => {
    const admin = await t.signIn('admin');
    expect((await admin.get('/api/jobs/mail.no-such-job')).status).toBe(404);
    expect((await admin.get('/api/jobs/nonsense')).status).toBe(404);
    expect((await admin.get('/api/jobs/unknownqueue.x')).status).toBe(404);
  });
});

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

describe('when Redis is down', () => {
  it('the API still acknowledges orders, and the mail goes out once Redis is back', async () => {
    const port = await freePort();
    const dir = mkdtempSync(path.join(os.tmpdir(), 'spoolwright-redis-'));
    const startRedis = () =>
      spawnSync('redis-server', ['--bind', '127.0.0.1', '--port', String(port), '--dir', dir, '--daemonize', 'yes', '--save', '', '--appendonly', 'no']);
    const stopRedis = () => spawnSync('redis-cli', ['-p', String(port), 'shutdown', 'nosave']);
    expect(startRedis().status).toBe(0);
    const own = testApp({ REDIS_URL: `redis://127.0.0.1:${port}/0` });
    const workers = startWorkers(own.deps, { dispatchIntervalMs: 300 });
    try {
      const agent = await own.signIn('office');
      stopRedis();
      await sleep(500);
      const { notificationId, mail } = await acknowledgedOrder(agent);
      await sleep(2_000);
      expect(await mail()).toHaveLength(0);
      expect((await rowOf(notificationId)).status).toBe('pending');
      expect(startRedis().status).toBe(0);
      await waitUntil(async () => (await mail()).length > 0, 60_000);
      await sleep(1_000);
      expect(await mail()).toHaveLength(1);
    } finally {
      await workers.close().catch(() => {});
      await own.close().catch(() => {});
      stopRedis();
      rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);
});
