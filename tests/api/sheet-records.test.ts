/**
 * Build sheets are records: a sheet keeps the numbers and the engine version it was computed with;
 * a new draft of the line uses the current engine and says what changed. Stock is reserved by
 * the insulated wire mass (a spool's net mass counts the enamel).
 */
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildSheets, customers, orderLines, orders, spoolReservations, workOrders } from '../../server/db/schema';
import { DEMO_COMPANIES } from '../../server/seed/orders';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, coilSpec, draftSheet, receiveSpool } from '../helpers/build-sheets';
import { newCompany } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let engineer: Agent;
let company: { id: number };

/** This file's wire: copper grade 3 AWG 34 (grade 3 is never stocked by the demo seed). */
const GAUGE = 34;

beforeAll(async () => {
  office = await t.signIn('office');
  engineer = await t.signIn('engineer');
  company = await newCompany(office, [{ name: 'Order Desk', email: 'records@example.test', notifyOrders: true }]);
  await receiveSpool(office, GAUGE, 400, '2020-01-01');
});

const db = () => t.deps.db;

/** Insulated mass per metre by hand: copper 8.89 g/cm³ (IEC 60028) plus enamel 1.4 g/cm³ (from memory) up to the overall diameter. */
const insulatedPerMetre = (bare: number, overall: number) => 8890 * (Math.PI / 4) * bare * bare + 1400 * (Math.PI / 4) * (overall * overall - bare * bare);

describe('a sheet computed by the first engine', () => {
  it('stays as it was through approval, reserves insulated wire, and a new draft says what changed', async () => {
    const order = await acknowledgedOrder(office, company.id, [20]);
    const lineId = order.lines[0].id;
    const v1 = await draftSheet(engineer, lineId, coilSpec(GAUGE));
    // The record as engine 1.0.0 stored it: no corners, duty, switch-off or band, and wireMass
    // counting the bare copper only (what that engine computed).
    const { corners: _c, duty: _d, switchOff: _s, resistanceBand: _b, cautions: _k, conductorMass, packingFactor: _p, hotSpotAllowance: _h, ...rest } = v1.result as Record<string, unknown>;
    const old = { ...rest, wireMass: conductorMass };
    await db().update(buildSheets).set({ engineVersion: '1.0.0', result: old as never }).where(eq(buildSheets.id, v1.id));

    const approved = await engineer.post(`/api/build-sheets/${v1.id}/approve`).set(csrf).send({});
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    expect(approved.body.engineVersion).toBe('1.0.0');
    expect(approved.body.result).toEqual(old);
    expect(approved.body.result.corners).toBeUndefined();

    // Stock: the record's own wire length and diameters, with the enamel counted.
    const check = await engineer.get(`/api/build-sheets/${v1.id}/stock-check`);
    expect(check.status).toBe(200);
    const r = old as { wireLength: number; wireMass: number; wire: { bareDiameter: number; overallDiameter: number } };
    expect(check.body.massPerUnit).toBeCloseTo(r.wireLength * insulatedPerMetre(r.wire.bareDiameter, r.wire.overallDiameter), 9);
    expect(check.body.massPerUnit).toBeGreaterThan(r.wireMass);

    // A new draft of the same line: computed now, by engine 2, with what changed listed.
    const v2 = await draftSheet(engineer, lineId, coilSpec(GAUGE));
    const rec = await engineer.get(`/api/build-sheets/${v2.id}`);
    expect(rec.body.engineVersion).toMatch(/^2\./);
    expect(rec.body.result.corners.low.ampereTurns).toBeGreaterThan(0);
    expect(rec.body.changes).toMatchObject({ fromVersion: 1, fromEngine: '1.0.0', engineChanged: true, specChanged: [] });
    const mass = rec.body.changes.figures.find((f: { key: string }) => f.key === 'wireMass');
    expect(mass.before).toBeCloseTo(r.wireMass, 12);
    expect(mass.after).toBeCloseTo(rec.body.result.wireMass, 12);
    // the first version has nothing to compare with; the line lists both
    expect((await engineer.get(`/api/build-sheets/${v1.id}`)).body.changes).toBeNull();
    const line = await engineer.get(`/api/order-lines/${lineId}`);
    expect(line.body.sheets[0].changes.fromVersion).toBe(1);
  });
});

describe('releasing reserves the insulated wire mass', () => {
  it('per unit: wire length × (copper + enamel per metre), times quantity and scrap allowance', async () => {
    const order = await acknowledgedOrder(office, company.id, [12]);
    const lineId = order.lines[0].id;
    const d = await draftSheet(engineer, lineId, coilSpec(GAUGE));
    expect((await engineer.post(`/api/build-sheets/${d.id}/approve`).set(csrf).send({})).status).toBe(200);
    const res = await engineer.post(`/api/build-sheets/${d.id}/release`).set(csrf).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const r = d.result as unknown as { wireLength: number; wireMass: number; conductorMass: number; wire: { bareDiameter: number; overallDiameter: number } };
    const perUnit = r.wireLength * insulatedPerMetre(r.wire.bareDiameter, r.wire.overallDiameter);
    expect(r.wireMass).toBeCloseTo(perUnit, 9);
    expect(r.wireMass).toBeGreaterThan(r.conductorMass * 1.02);
    const wos = await db().select().from(workOrders).where(eq(workOrders.buildSheetId, d.id));
    const reserved = await db().select().from(spoolReservations).where(inArray(spoolReservations.workOrderId, wos.map((w) => w.id)));
    const total = reserved.reduce((a, x) => a + x.mass, 0);
    expect(total).toBeCloseTo(perUnit * 12 * (1 + res.body.stock.scrapAllowancePercent / 100), 6);
  });
});

describe('the demo shop', () => {
  it('is drawn with engine 2, and none of its sheets carries a warning', async () => {
    const rows = await db()
      .select({ engine: buildSheets.engineVersion, result: buildSheets.result, title: orderLines.title })
      .from(buildSheets)
      .innerJoin(orderLines, eq(orderLines.id, buildSheets.lineId))
      .innerJoin(orders, eq(orders.id, orderLines.orderId))
      .innerJoin(customers, eq(customers.id, orders.customerId))
      .where(inArray(customers.name, DEMO_COMPANIES.map((c) => c.name)));
    expect(rows.length).toBeGreaterThan(20);
    for (const r of rows) {
      expect(r.engine, r.title).toMatch(/^2\./);
      expect(r.result.warnings.map((w) => w.code), r.title).toEqual([]);
      // within its class less the hot-spot allowance at the high corner, and through its duty cycle
      expect(r.result.corners.high.windingTemperature, r.title).toBeLessThanOrEqual(r.result.duty.limitTemperature);
      expect(r.result.duty.peakTemperature, r.title).toBeLessThanOrEqual(r.result.duty.limitTemperature);
    }
  });
});
