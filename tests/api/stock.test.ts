import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notifications, spoolReservations, workOrders } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, approvedSheet, coilSpec, receiveSpool } from '../helpers/build-sheets';
import { newCompany } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let engineer: Agent;
let company: { id: number };

/** Shop default scrap allowance, 5 % (common practice, no published source). */
const SCRAP = 1.05;

beforeAll(async () => {
  office = await t.signIn('office');
  engineer = await t.signIn('engineer');
  company = await newCompany(office, [{ name: 'Stock Buyer', email: 'stock@example.test', notifyOrders: true }]);
});

const db = () => t.deps.db;

describe('receiving spools', () => {
  it('receives a spool (201) with its free mass; bad input is 400 with fields', async () => {
    const spool = await receiveSpool(office, 20, 12.5, '2024-05-01', 'LOT-RECEIVE-1');
    expect(spool).toMatchObject({ netMass: 12.5, reservedMass: 0, freeMass: 12.5, lot: 'LOT-RECEIVE-1' });
    const list = await (await t.signIn('foreman')).get('/api/spools');
    expect(list.status).toBe(200);
    expect(list.body.spools.find((s: { id: number }) => s.id === spool.id)).toMatchObject({
      conductor: 'copper',
      wire: { standard: 'AWG', gauge: 20 },
      insulationGrade: 3,
      receivedAt: '2024-05-01T00:00:00.000Z',
      receivedBy: { id: expect.any(Number) },
    });

    const empty = await office.post('/api/spools').set(csrf).send({});
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields)).toEqual(expect.arrayContaining(['conductor', 'wire', 'insulationGrade', 'supplier', 'lot', 'netMass']));
    const bad = await office
      .post('/api/spools')
      .set(csrf)
      .send({ conductor: 'silver', wire: { standard: 'AWG', gauge: 99 }, insulationGrade: 4, supplier: ' ', lot: 'x', netMass: -1, receivedAt: 'yesterday' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['conductor', 'insulationGrade', 'netMass', 'receivedAt', 'supplier', 'wire.gauge']);
  });

  it('lets the office, engineers and admins receive; the foreman reads only; shipping neither', async () => {
    const body = { conductor: 'copper', wire: { standard: 'AWG', gauge: 20 }, insulationGrade: 3, supplier: 'S', lot: 'L', netMass: 1 };
    expect((await (await t.signIn('foreman')).post('/api/spools').set(csrf).send(body)).status).toBe(403);
    expect((await (await t.signIn('engineer')).post('/api/spools').set(csrf).send(body)).status).toBe(201);
    expect((await (await t.signIn('shipping')).get('/api/spools')).status).toBe(403);
  });
});

describe('reserving wire on release', () => {
  it('shows the need before release and reserves oldest lot first, splitting across spools', async () => {
    // Copper grade 3 AWG 32: no other test stocks it.
    const oldest = await receiveSpool(office, 32, 0.5, '2021-01-01', 'LOT-OLDEST');
    const middle = await receiveSpool(office, 32, 0.5, '2022-01-01', 'LOT-MIDDLE');
    const newest = await receiveSpool(office, 32, 20, '2023-01-01', 'LOT-NEWEST');
    const order = await acknowledgedOrder(office, company.id, [30]);
    const sheet = await approvedSheet(engineer, order.lines[0].id, coilSpec(32));
    const perUnit = sheet.result.wireMass;
    const need = (units: number) => perUnit * units * SCRAP;

    const check = await office.get(`/api/build-sheets/${sheet.id}/stock-check`);
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ quantity: 30, massPerUnit: perUnit, scrapAllowancePercent: 5, short: false, shortfall: 0 });
    expect(check.body.needed).toBeCloseTo(need(30), 9);
    expect(check.body.available).toBeCloseTo(21, 9);
    expect(check.body.spools.map((s: { lot: string }) => s.lot)).toEqual(['LOT-OLDEST', 'LOT-MIDDLE', 'LOT-NEWEST']);
    expect(check.body.spools.map((s: { take: number }) => s.take)).toEqual([0.5, 0.5, expect.closeTo(need(30) - 1, 9)]);

    const rel = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
    expect(rel.status, JSON.stringify(rel.body)).toBe(200);
    const [wo1, wo2] = rel.body.workOrders as { id: number; quantity: number }[];
    expect([wo1.quantity, wo2.quantity]).toEqual([25, 5]);
    const reservations = await db().select().from(spoolReservations).where(inArray(spoolReservations.workOrderId, [wo1.id, wo2.id]));
    const of = (wo: number) => reservations.filter((r) => r.workOrderId === wo).map((r) => [r.spoolId, r.mass]);
    expect(of(wo1.id)).toEqual([
      [oldest.id, 0.5],
      [middle.id, 0.5],
      [newest.id, expect.closeTo(need(25) - 1, 9)],
    ]);
    expect(of(wo2.id)).toEqual([[newest.id, expect.closeTo(need(5), 9)]]);

    const spools = (await engineer.get('/api/spools')).body.spools as { id: number; reservedMass: number; freeMass: number }[];
    const byId = new Map(spools.map((s) => [s.id, s]));
    expect(byId.get(oldest.id)).toMatchObject({ reservedMass: 0.5, freeMass: 0 });
    expect(byId.get(middle.id)).toMatchObject({ reservedMass: 0.5, freeMass: 0 });
    expect(byId.get(newest.id)!.freeMass).toBeCloseTo(21 - need(30), 9);
  });

  it('refuses a release on short stock; an engineer may release with a note, which is recorded', async () => {
    // Copper grade 1 AWG 32: no other test or the seed stocks it. One small spool.
    const spool = await receiveSpool(office, 32, 0.2, '2024-01-01', 'LOT-SHORT', 1);
    const order = await acknowledgedOrder(office, company.id, [40]);
    const sheet = await approvedSheet(engineer, order.lines[0].id, coilSpec(32, { insulationGrade: 1 }));
    const check = await engineer.get(`/api/build-sheets/${sheet.id}/stock-check`);
    expect(check.body).toMatchObject({ short: true, available: 0.2 });
    expect(check.body.shortfall).toBeCloseTo(check.body.needed - 0.2, 9);

    const refused = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
    expect(refused.status).toBe(422);
    expect(refused.body.error.fields.stock).toMatch(/Short by/);
    expect(refused.body.error.fields.shortStockNote).toBeTruthy();
    // Nothing half-written: no work orders, no notice, the order still acknowledged, the sheet still approved.
    expect(await db().select().from(workOrders).where(eq(workOrders.buildSheetId, sheet.id))).toEqual([]);
    expect(await db().select().from(notifications).where(and(eq(notifications.orderId, order.id), eq(notifications.kind, 'order_released')))).toEqual([]);
    expect((await office.get(`/api/orders/${order.id}`)).body.order.status).toBe('acknowledged');
    expect((await engineer.get(`/api/build-sheets/${sheet.id}`)).body.status).toBe('approved');

    const tooShort = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({ shortStockNote: 'ordered' });
    expect(tooShort.status).toBe(422);
    expect(tooShort.body.error.fields.shortStockNote).toMatch(/10 characters/);

    const note = 'Two more spools arrive Thursday; start with what is here';
    const ok = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({ shortStockNote: note });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.buildSheet.shortStockNote).toBe(note);
    expect(ok.body.stock).toMatchObject({ short: true });
    const wo = await engineer.get(`/api/work-orders/${ok.body.workOrders[0].id}`);
    expect(wo.body.events[0].note).toContain(note);
    // What there was is reserved; the spool has nothing free left.
    const s = (await engineer.get('/api/spools')).body.spools.find((x: { id: number }) => x.id === spool.id);
    expect(s.freeMass).toBeCloseTo(0, 9);
  });
});
