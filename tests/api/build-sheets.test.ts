import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WORK_ORDER_NUMBER_PATTERN } from '../../src/contracts/work-orders';
import { notifications, orderEvents, workOrderEvents, workOrders } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, approvedSheet, coilSpec, draftSheet, receiveSpool } from '../helpers/build-sheets';
import { customerAgent, newCompany, newOrder } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let engineer: Agent;
let company: { id: number };

/** This file's clean wire (copper grade 3 AWG 33: within class 155 on the test bobbin) and a hot one. */
const CLEAN = 33;
const HOT = 28;

beforeAll(async () => {
  office = await t.signIn('office');
  engineer = await t.signIn('engineer');
  company = await newCompany(office, [{ name: 'Order Desk', email: 'orders@example.test', notifyOrders: true }]);
  // Plenty of this file's wire (the stock rules are tested in stock.test.ts).
  await receiveSpool(office, CLEAN, 1500, '2020-01-01');
});

const db = () => t.deps.db;

describe('drafting versions', () => {
  it('shows the line with its order, customer, requirement and a starting spec; each POST is a new draft version', async () => {
    const order = await acknowledgedOrder(office, company.id, [10]);
    const lineId = order.lines[0].id;
    const line = await engineer.get(`/api/order-lines/${lineId}`);
    expect(line.status).toBe(200);
    expect(line.body).toMatchObject({ id: lineId, quantity: 10, order: { id: order.id, status: 'acknowledged' }, customer: { id: company.id }, sheets: [], releasedSheetId: null });
    // The helper's requirement: 24 V, 900 ampere-turns — the target carries straight over.
    expect(line.body.starting.target).toEqual({ ampereTurns: 900 });
    expect(line.body.starting.spec).toMatchObject({ drive: { kind: 'voltage', volts: 24 }, insulationClass: 155 });

    const v1 = await draftSheet(engineer, lineId, coilSpec(CLEAN), { notes: 'first try' });
    expect(v1).toMatchObject({ version: 1, status: 'draft', spec: coilSpec(CLEAN) });
    expect(v1.result.turns).toBeGreaterThan(0);
    // The bare CoilSpec is accepted as the body too.
    const bare = await engineer.post(`/api/order-lines/${lineId}/build-sheet`).set(csrf).send(coilSpec(34));
    expect(bare.status, JSON.stringify(bare.body)).toBe(201);
    expect(bare.body).toMatchObject({ version: 2, status: 'draft', engineVersion: expect.any(String) });

    const again = await engineer.get(`/api/order-lines/${lineId}`);
    expect(again.body.sheets.map((s: { version: number }) => s.version)).toEqual([2, 1]);
  });

  it('refuses a malformed spec with 400 and fields under spec., writing nothing', async () => {
    const order = await acknowledgedOrder(office, company.id, [5]);
    const lineId = order.lines[0].id;
    const res = await engineer.post(`/api/order-lines/${lineId}/build-sheet`).set(csrf).send({ spec: { ...coilSpec(CLEAN), wire: { standard: 'AWG', gauge: 99 }, dutyCycle: 2 } });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['spec.wire.gauge', 'spec.dutyCycle']));
    const empty = await engineer.post(`/api/order-lines/${lineId}/build-sheet`).set(csrf).send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields['spec.conductor']).toBeTruthy();
    const line = await engineer.get(`/api/order-lines/${lineId}`);
    expect(line.body.sheets).toEqual([]);
    expect((await engineer.post('/api/order-lines/999999999/build-sheet').set(csrf).send({ spec: coilSpec(CLEAN) })).status).toBe(404);
  });

  it('keeps approved and released sheets as they were; a change is a new version', async () => {
    const order = await acknowledgedOrder(office, company.id, [4]);
    const lineId = order.lines[0].id;
    const v1 = await approvedSheet(engineer, lineId, coilSpec(CLEAN));
    expect(v1.status).toBe('approved');
    const twice = await engineer.post(`/api/build-sheets/${v1.id}/approve`).set(csrf).send({});
    expect(twice.status).toBe(422);
    expect(twice.body.error.fields.status).toMatch(/approved/);

    const rel = await engineer.post(`/api/build-sheets/${v1.id}/release`).set(csrf).send({});
    expect(rel.status, JSON.stringify(rel.body)).toBe(200);
    for (const action of ['approve', 'release']) {
      const r = await engineer.post(`/api/build-sheets/${v1.id}/${action}`).set(csrf).send({ overrideReason: 'trying to change it again' });
      expect([409, 422]).toContain(r.status);
    }
    const v2 = await draftSheet(engineer, lineId, coilSpec(CLEAN, { pattern: 'orthocyclic' }));
    expect(v2.version).toBe(2);
    const still = await engineer.get(`/api/build-sheets/${v1.id}`);
    expect(still.body).toMatchObject({ status: 'released', spec: coilSpec(CLEAN), result: v1.result });

    // Releasing v2 supersedes v1; v1's work orders that had not started go on hold and give back their wire.
    await engineer.post(`/api/build-sheets/${v2.id}/approve`).set(csrf).send({});
    const rel2 = await engineer.post(`/api/build-sheets/${v2.id}/release`).set(csrf).send({});
    expect(rel2.status, JSON.stringify(rel2.body)).toBe(200);
    expect(rel2.body.notification).toBeNull();
    expect((await engineer.get(`/api/build-sheets/${v1.id}`)).body.status).toBe('superseded');
    const old = await db().select().from(workOrders).where(eq(workOrders.buildSheetId, v1.id));
    expect(old.map((w) => [w.stage, w.version])).toEqual([['on_hold', 2]]);
  });
});

describe('the override rule', () => {
  it('needs a written reason (≥ 10 characters) to approve a sheet with an over-temperature warning', async () => {
    const order = await acknowledgedOrder(office, company.id, [3]);
    const hot = await draftSheet(engineer, order.lines[0].id, coilSpec(HOT));
    // The engine's own verdict on this spec (AWG 28 fills the bobbin: too little resistance at 24 V).
    expect(hot.result.warnings.map((w) => w.code)).toContain('over-temperature');
    const without = await engineer.post(`/api/build-sheets/${hot.id}/approve`).set(csrf).send({});
    expect(without.status).toBe(422);
    expect(without.body.error.fields.overrideReason).toBeTruthy();
    const short = await engineer.post(`/api/build-sheets/${hot.id}/approve`).set(csrf).send({ overrideReason: 'ok fine' });
    expect(short.status).toBe(422);
    expect(short.body.error.fields.overrideReason).toMatch(/10 characters/);
    expect((await engineer.get(`/api/build-sheets/${hot.id}`)).body.status).toBe('draft');
    const reason = 'Customer pulses it for 2 s at most; confirmed in writing';
    const ok = await engineer.post(`/api/build-sheets/${hot.id}/approve`).set(csrf).send({ overrideReason: reason });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toMatchObject({ status: 'approved', overrideReason: reason, approvedBy: { id: expect.any(Number) } });
  });

  it('never approves a coil that does not fit, reason or not', async () => {
    const order = await acknowledgedOrder(office, company.id, [3]);
    const spec = coilSpec(10, { bobbin: { innerDiameter: 0.01, outerDiameter: 0.0105, length: 0.002 } });
    const sheet = await draftSheet(engineer, order.lines[0].id, spec);
    expect(sheet.result.warnings.map((w) => w.code)).toContain('does-not-fit');
    const res = await engineer.post(`/api/build-sheets/${sheet.id}/approve`).set(csrf).send({ overrideReason: 'We will make it fit somehow' });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.result).toBeTruthy();
  });
});

describe('releasing', () => {
  it('splits the quantity into work orders of at most 25 units, moves the order into production and writes the outbox row', async () => {
    const order = await acknowledgedOrder(office, company.id, [60, 8]);
    const [l1, l2] = order.lines;
    const sheet = await approvedSheet(engineer, l1.id, coilSpec(CLEAN));
    const res = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const wos = res.body.workOrders as { id: number; number: string; stage: string; quantity: number; dueDate: string; version: number }[];
    // ceil(60 / 25) = 3 work orders: 25, 25, 10 (shop default unitsPerWorkOrder = 25).
    expect(wos.map((w) => w.quantity)).toEqual([25, 25, 10]);
    for (const w of wos) {
      expect(w).toMatchObject({ stage: 'ready', version: 1, dueDate: order.dueDate });
      expect(w.number).toMatch(WORK_ORDER_NUMBER_PATTERN);
      expect(w.number.slice(3, 5)).toBe(String(new Date().getFullYear() % 100).padStart(2, '0'));
    }
    expect(new Set(wos.map((w) => w.number)).size).toBe(3);
    expect(res.body.buildSheet).toMatchObject({ status: 'released', releasedBy: { id: expect.any(Number) } });

    const events = await db().select().from(workOrderEvents).where(eq(workOrderEvents.workOrderId, wos[0].id));
    expect(events).toMatchObject([{ fromStage: null, toStage: 'ready', note: 'Released from build sheet v1', stationId: null }]);

    const o = await office.get(`/api/orders/${order.id}`);
    expect(o.body.order.status).toBe('in_production');
    const statusEvents = await db().select().from(orderEvents).where(and(eq(orderEvents.orderId, order.id), eq(orderEvents.kind, 'status_changed')));
    expect(statusEvents.map((e) => e.changes.status)).toEqual([['acknowledged', 'in_production']]);

    // The outbox row, written with the same timestamp as the release (one transaction).
    const [n] = await db().select().from(notifications).where(and(eq(notifications.orderId, order.id), eq(notifications.kind, 'order_released')));
    expect(n).toMatchObject({ status: 'pending', recipients: [{ name: 'Order Desk', email: 'orders@example.test' }] });
    expect(n.payload).toMatchObject({ orderNumber: order.number, line: { lineNo: 1, quantity: 60 }, workOrderCount: 3 });
    expect(n.dueAt.toISOString()).toBe(res.body.buildSheet.releasedAt);
    expect(res.body.notification).toMatchObject({ id: n.id, status: 'pending' });

    // The second line's release leaves the order in production (no second transition).
    const s2 = await approvedSheet(engineer, l2.id, coilSpec(CLEAN));
    const r2 = await engineer.post(`/api/build-sheets/${s2.id}/release`).set(csrf).send({});
    expect(r2.status, JSON.stringify(r2.body)).toBe(200);
    expect(r2.body.workOrders.map((w: { quantity: number }) => w.quantity)).toEqual([8]);
    expect((await office.get(`/api/orders/${order.id}`)).body.order.status).toBe('in_production');

    // The order page carries each line's sheet: the newest version and the released essentials.
    const lines = (await office.get(`/api/orders/${order.id}`)).body.order.lines;
    expect(lines[0].buildSheet).toMatchObject({ id: sheet.id, version: 1, status: 'released', released: { turns: sheet.result.turns, tolerancePercent: 10 } });
  });

  it('refuses a draft, an entered order, and a cancelled order; nothing is written', async () => {
    const order = await acknowledgedOrder(office, company.id, [5]);
    const draft = await draftSheet(engineer, order.lines[0].id, coilSpec(CLEAN));
    const r = await engineer.post(`/api/build-sheets/${draft.id}/release`).set(csrf).send({});
    expect(r.status).toBe(422);
    expect(r.body.error.fields.status).toBeTruthy();

    const entered = await newOrder(office, company.id);
    const sheet = await approvedSheet(engineer, entered.lines[0].id, coilSpec(CLEAN));
    const e = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
    expect(e.status).toBe(422);
    expect(e.body.error.fields.order).toMatch(/entered/);
    expect(await db().select().from(workOrders).where(eq(workOrders.lineId, entered.lines[0].id))).toEqual([]);
    expect(await db().select().from(notifications).where(and(eq(notifications.orderId, entered.id), eq(notifications.kind, 'order_released')))).toEqual([]);
    expect((await engineer.get(`/api/build-sheets/${sheet.id}`)).body.status).toBe('approved');

    const cancelled = await acknowledgedOrder(office, company.id, [5]);
    const cs = await approvedSheet(engineer, cancelled.lines[0].id, coilSpec(CLEAN));
    await office.post(`/api/orders/${cancelled.id}/cancel`).set(csrf).send({ reason: 'Test cancellation' });
    expect((await engineer.post(`/api/build-sheets/${cs.id}/release`).set(csrf).send({})).status).toBe(422);
    const d = await engineer.post(`/api/order-lines/${cancelled.lines[0].id}/build-sheet`).set(csrf).send({ spec: coilSpec(CLEAN) });
    expect(d.status).toBe(422);
    expect(d.body.error.fields.order).toMatch(/cancelled/);
  });

  it('gives unique numbers to releases of different lines at once (the sequence)', async () => {
    const orders = await Promise.all([1, 2, 3, 4].map(() => acknowledgedOrder(office, company.id, [30])));
    const sheets = [];
    for (const o of orders) sheets.push(await approvedSheet(engineer, o.lines[0].id, coilSpec(CLEAN)));
    const results = await Promise.all(sheets.map((s) => engineer.post(`/api/build-sheets/${s.id}/release`).set(csrf).send({})));
    expect(results.map((r) => r.status)).toEqual([200, 200, 200, 200]);
    const numbers = results.flatMap((r) => r.body.workOrders.map((w: { number: string }) => w.number));
    expect(numbers).toHaveLength(8);
    expect(new Set(numbers).size).toBe(8);
  });

  it('releases the same sheet once when two requests race (the row lock); the other is 409', async () => {
    const order = await acknowledgedOrder(office, company.id, [12]);
    const sheet = await approvedSheet(engineer, order.lines[0].id, coilSpec(CLEAN));
    const admin = await t.signIn('admin');
    const [a, b] = await Promise.all([
      engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({}),
      admin.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({}),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await db().select().from(workOrders).where(eq(workOrders.buildSheetId, sheet.id))).toHaveLength(1);
    expect(await db().select().from(notifications).where(and(eq(notifications.orderId, order.id), eq(notifications.kind, 'order_released')))).toHaveLength(1);
  });
});

describe('the engineering queue and who may do what', () => {
  it('lists lines without a released sheet, oldest due first, with the latest draft; released lines leave it', async () => {
    const order = await acknowledgedOrder(office, company.id, [6, 6], { dueDate: '2020-01-02', orderDate: '2020-01-01' });
    const draft = await draftSheet(engineer, order.lines[0].id, coilSpec(CLEAN));
    const q = await t.signIn('foreman').then((f) => f.get('/api/engineering/queue'));
    expect(q.status).toBe(200);
    const mine = q.body.lines.filter((l: { order: { id: number } }) => l.order.id === order.id);
    expect(mine).toMatchObject([
      { lineNo: 1, quantity: 6, late: true, latestSheet: { id: draft.id, version: 1, status: 'draft' }, customer: { id: company.id } },
      { lineNo: 2, latestSheet: null },
    ]);
    const dues = q.body.lines.map((l: { dueDate: string }) => l.dueDate);
    expect(dues).toEqual([...dues].sort());
    await engineer.post(`/api/build-sheets/${draft.id}/approve`).set(csrf).send({});
    expect((await engineer.post(`/api/build-sheets/${draft.id}/release`).set(csrf).send({})).status).toBe(200);
    const after = await engineer.get('/api/engineering/queue');
    expect(after.body.lines.filter((l: { order: { id: number } }) => l.order.id === order.id).map((l: { lineNo: number }) => l.lineNo)).toEqual([2]);
  });

  it('lets only engineers and admins draft, approve and release; customers read no sheets', async () => {
    const order = await acknowledgedOrder(office, company.id, [2]);
    const lineId = order.lines[0].id;
    for (const role of ['office', 'foreman', 'floor'] as const) {
      const a = await t.signIn(role);
      expect((await a.post(`/api/order-lines/${lineId}/build-sheet`).set(csrf).send({ spec: coilSpec(CLEAN) })).status).toBe(403);
    }
    const sheet = await draftSheet(await t.signIn('admin'), lineId, coilSpec(CLEAN));
    expect((await office.post(`/api/build-sheets/${sheet.id}/approve`).set(csrf).send({})).status).toBe(403);
    expect((await office.get(`/api/build-sheets/${sheet.id}`)).status).toBe(200);
    const buyer = await customerAgent(t, company.id);
    expect((await buyer.get(`/api/order-lines/${lineId}`)).status).toBe(403);
    expect((await buyer.get(`/api/build-sheets/${sheet.id}`)).status).toBe(403);
    // The customer's order page shows that a sheet exists, not the design.
    const mine = await buyer.get(`/api/orders/${order.id}`);
    expect(mine.body.order.lines[0].buildSheet).toMatchObject({ version: 1, status: 'draft', released: null });
  });
});
