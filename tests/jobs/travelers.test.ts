import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startWorkers } from '../../jobs/runtime';
import { CAUTIONS } from '../../jobs/travelers/render';
import { travelers } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, approvedSheet, coilSpec, receiveSpool } from '../helpers/build-sheets';
import { waitUntil } from '../helpers/mail';
import { newCompany } from '../helpers/orders';

const t = testApp();
let workers: ReturnType<typeof startWorkers>;
let office: Awaited<ReturnType<typeof t.signIn>>;
let engineer: Awaited<ReturnType<typeof t.signIn>>;
let order: { id: number; number: string; purchaseOrder?: unknown; lines: { id: number }[] };
let workOrders: { id: number; number: string; quantity: number }[];
const tmp = mkdtempSync(path.join(os.tmpdir(), 'spoolwright-travelers-'));

beforeAll(async () => {
  office = await t.signIn('office');
  engineer = await t.signIn('engineer');
  const company = await newCompany(office, [], `Traveler Test Works ${Date.now()}`);
  // 30 units: two work orders at the shop's default batch size of 25.
  order = await acknowledgedOrder(office, company.id, [30]);
  await receiveSpool(engineer, 33, 5);
  const sheet = await approvedSheet(engineer, order.lines[0].id, coilSpec(33));
  const rel = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
  expect(rel.status, JSON.stringify(rel.body)).toBe(200);
  workOrders = rel.body.workOrders;
  workers = startWorkers(t.deps, { dispatchIntervalMs: 60_000 });
});
afterAll(async () => {
  await workers?.close();
  await t.close();
  rmSync(tmp, { recursive: true, force: true });
});

async function finished(agent: typeof office, jobId: string) {
  let last: { state: string; progress: number; result?: unknown; error?: string } = { state: 'waiting', progress: 0 };
  const seen: number[] = [];
  await waitUntil(async () => {
    const res = await agent.get(`/api/jobs/${jobId}`);
    expect(res.status).toBe(200);
    last = res.body;
    seen.push(last.progress);
    return last.state === 'completed' || last.state === 'failed';
  }, 60_000);
  expect(last.state, last.error).toBe('completed');
  return { ...last, seen };
}

function savePdf(name: string, bytes: Buffer) {
  const file = path.join(tmp, name);
  writeFileSync(file, bytes);
  return file;
}

describe('a work order’s traveler', () => {
  it('prints on the queue with the number as text, as a Code 128 barcode and a QR code of its page', async () => {
    const wo = workOrders[0];
    const res = await engineer.post(`/api/work-orders/${wo.id}/traveler`).set(csrf).send({});
    expect(res.status).toBe(202);
    expect(res.body.jobId).toMatch(/^travelers\./);
    const job = await finished(engineer, res.body.jobId);
    expect(job.progress).toBe(100);

    const pdf = await engineer.get(`/api/work-orders/${wo.id}/traveler.pdf`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const file = savePdf('one.pdf', pdf.body as Buffer);

    // The words on the page (poppler's pdftotext).
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    expect(text).toContain(wo.number);
    expect(text).toContain(order.number);
    expect(text).toContain('Sign-off at each stage');
    expect(text).toContain('Larkspur Coil Works'); // the demo shop's name (seed)
    for (const stage of ['Winding', 'Terminating', 'Impregnating', 'Curing', 'Testing', 'Inspection', 'Packing']) expect(text).toContain(stage);
    expect(text).toMatch(/R at 20 °C/);
    expect(text).toContain('Ω');
    expect(text.replace(/\s+/g, ' ')).toContain(CAUTIONS[0].slice(0, 40));
    expect(text).toMatch(/lifting/);
    // Engine 2 sheets: the corners, the band, duty and switch-off, and the engine's own cautions.
    expect(text).toContain('Operating corners');
    for (const corner of ['Low', 'Nominal', 'High']) expect(text).toMatch(new RegExp(`\\b${corner}\\b`));
    expect(text).toContain('Band, duty and switch-off');
    expect(text).toMatch(/Switching off releases/);
    expect(text).toMatch(/discharge it/);

    // Fonts shipped with the app are embedded (poppler's pdffonts: the "emb" column says yes).
    const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' });
    expect(fonts).toMatch(/Barlow[^\n]*\byes\b/);
    expect(fonts).toMatch(/NotoSans[^\n]*\byes\b/);
    expect(fonts).not.toMatch(/\bno\s+no\s+no\b/);

    // What a scanner reads (zbar): exactly the work order number, and the page's address.
    execFileSync('pdftoppm', ['-r', '150', '-png', '-f', '1', '-l', '1', file, path.join(tmp, 'page')]);
    const png = path.join(tmp, readdirSync(tmp).find((f) => f.startsWith('page') && f.endsWith('.png'))!);
    const scanned = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Scode128.enable', png], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    expect(scanned).toBe(wo.number);
    const qr = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Sqrcode.enable', png], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    expect(qr).toMatch(new RegExp(`/work-orders/${wo.id}$`));

    const info = await engineer.get(`/api/work-orders/${wo.id}/traveler`);
    expect(info.body).toMatchObject({ exists: true, stale: false, buildSheetVersion: 1 });
    expect(info.body.sha256).toMatch(/^[a-f0-9]{64}$/);
  });

  it('asking again never prints twice: the same job answers and one file is kept', async () => {
    const wo = workOrders[0];
    const first = await t.deps.db.select().from(travelers).where(eq(travelers.workOrderId, wo.id));
    const again = await office.post(`/api/work-orders/${wo.id}/traveler`).set(csrf).send({});
    expect(again.status).toBe(202);
    await finished(office, again.body.jobId);
    const after = await t.deps.db.select().from(travelers).where(eq(travelers.workOrderId, wo.id));
    expect(after).toHaveLength(1);
    expect(after[0].sha256).toBe(first[0].sha256);
  });

  it('a whole order prints as one merged PDF, with progress up to 100', async () => {
    const res = await office.post('/api/travelers/batch').set(csrf).send({ orderId: order.id });
    expect(res.status).toBe(202);
    expect(res.body.count).toBe(workOrders.length);
    const job = await finished(office, res.body.jobId);
    expect(job.progress).toBe(100);
    const result = job.result as { count: number; pages: number; downloadUrl: string };
    expect(result.count).toBe(workOrders.length);
    const rows = await t.deps.db.select().from(travelers);
    const mine = rows.filter((r) => workOrders.some((w) => w.id === r.workOrderId));
    expect(result.pages).toBe(mine.reduce((n, r) => n + r.pages, 0));
    const file = await office.get(result.downloadUrl).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(file.status).toBe(200);
    const text = execFileSync('pdftotext', [savePdf('batch.pdf', file.body as Buffer), '-'], { encoding: 'utf8' });
    for (const wo of workOrders) expect(text).toContain(wo.number);
  });

  it('refuses nonsense: unknown work orders, an empty selection, another role', async () => {
    expect((await office.post('/api/work-orders/99999999/traveler').set(csrf).send({})).status).toBe(404);
    const bad = await office.post('/api/travelers/batch').set(csrf).send({ workOrderIds: [] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.workOrderIds).toBeTruthy();
    const unknown = await office.post('/api/travelers/batch').set(csrf).send({ workOrderIds: [workOrders[0].id, 99999999] });
    expect(unknown.status).toBe(400);
    const floor = await t.signIn('floor');
    expect((await floor.post(`/api/work-orders/${workOrders[0].id}/traveler`).set(csrf).send({})).status).toBe(403);
    expect((await floor.get(`/api/work-orders/${workOrders[0].id}/traveler.pdf`)).status).toBe(200);
    const customer = await t.signIn('customer');
    expect((await customer.get(`/api/work-orders/${workOrders[0].id}/traveler.pdf`)).status).toBe(403);
  });
});
