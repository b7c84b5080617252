/**
 * The engineer adopts the shop's effective heat-transfer coefficient (from heat runs, design
 * feedback) as the default for new build sheets: who may, what is refused, and that a draft and
 * the engineer's desk (/api/coil/calculate) afterwards carry it, with the temperature rise the
 * engine's relation gives.
 *
 * Check relation: steady state of a winding cooled by its surface, ΔT = d·P_hot / (h·A)
 * (Newton's law of cooling; d the duty cycle, P_hot the dissipation at the hot resistance, A the
 * cooling surface) — the relation server/coil/thermal.ts solves with its resistance feedback.
 * The coil is the invented demo coil of tests/helpers/build-sheets.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, coilSpec, draftSheet } from '../helpers/build-sheets';
import { newCompany } from '../helpers/orders';

const t = testApp();
type Agent = Awaited<ReturnType<typeof t.signIn>>;
let engineer: Agent;
let admin: Agent;
let lineId: number;
let shopMean: number;
/** A wire the engine winds on the helper bobbin within class 155 (tests/helpers/build-sheets.ts). */
const GAUGE = 33;

beforeAll(async () => {
  engineer = await t.signIn('engineer');
  admin = await t.signIn('admin');
  const office = await t.signIn('office');
  const order = await acknowledgedOrder(office, (await newCompany(office)).id, [5]);
  lineId = order.lines[0].id;
  // The demo shop's heat runs (server/seed/test-records.ts) give the shop a measured h_eff.
  const fb = await engineer.get('/api/quality/design-feedback');
  expect(fb.status).toBe(200);
  expect(fb.body.shop.heatRuns).toBeGreaterThan(0);
  shopMean = fb.body.shop.heatTransferEffective.mean;
  expect(shopMean).toBeGreaterThan(0);
});

afterAll(async () => {
  // Leave the shop on the engine's default for the other files (admin clears the setting).
  const res = await admin.patch('/api/settings').set(csrf).send({ defaultHeatTransferCoefficient: null });
  expect(res.status).toBe(200);
  expect(res.body.settings.defaultHeatTransferCoefficient).toBeNull();
  await t.close();
});

const adopt = (agent: Agent, body: unknown) => agent.post('/api/quality/design-feedback/adopt').set(csrf).send(body as object);

describe('adopting the shop-wide heat-transfer coefficient', () => {
  it('admits only the engineer and the admin', async () => {
    for (const role of ['floor', 'foreman', 'office', 'shipping'] as const) {
      expect((await adopt(await t.signIn(role), { value: shopMean })).status, role).toBe(403);
    }
    expect((await t.request().post('/api/quality/design-feedback/adopt').set(csrf).send({ value: shopMean })).status).toBe(401);
  });

  it('refuses nonsense with 400 naming the field, and a value the heat runs do not support with 422', async () => {
    for (const value of [-3, 0, 0.5, 5000, 'ten', null]) {
      const res = await adopt(engineer, { value });
      expect(res.status, String(value)).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['value']);
    }
    expect((await adopt(engineer, {})).body.error.fields.value).toBeTruthy();
    // Twice the measured mean is not what the heat runs say (rule: within 10 % of the mean).
    const far = Math.min(shopMean * 2, 499);
    const res = await adopt(engineer, { value: far });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.value).toMatch(/Within 10 %/);
  });

  it('sets the default; a new draft and the engineer’s desk carry it, and the rise follows ΔT = d·P/(h·A)', async () => {
    const before = await draftSheet(engineer, lineId, coilSpec(GAUGE));
    expect(before.spec.heatTransferCoefficient).toBeUndefined();

    const value = Math.round(shopMean * 10) / 10;
    const res = await adopt(engineer, { value });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.value).toBe(value);
    expect(res.body.engineDefault).toBe(10);
    expect(res.body.adoptedBy.name).toBeTruthy();
    expect(Date.now() - Date.parse(res.body.adoptedAt)).toBeLessThan(10 * 60_000);
    expect((await admin.get('/api/settings')).body.settings.defaultHeatTransferCoefficient).toBe(value);
    expect((await engineer.get('/api/quality/design-feedback')).body.shopDefault.value).toBe(value);

    const after = await draftSheet(engineer, lineId, coilSpec(GAUGE));
    expect(after.spec.heatTransferCoefficient).toBe(value);
    const r = after.result as unknown as { temperatureRise: number; powerHot: number; surfaceArea: number };
    const spec = coilSpec(GAUGE);
    // ΔT = d·P_hot / (h·A) with the adopted h (Newton's law of cooling, the engine's relation).
    expect(r.temperatureRise).toBeCloseTo((spec.dutyCycle * r.powerHot) / (value * r.surfaceArea), 6);
    // A different h gives a different rise: the default changed the design's numbers.
    const rb = before.result as unknown as { temperatureRise: number; powerHot: number; surfaceArea: number };
    expect(rb.temperatureRise).toBeCloseTo((spec.dutyCycle * rb.powerHot) / (10 * rb.surfaceArea), 6);
    if (Math.abs(value - 10) > 0.5) expect(Math.abs(r.temperatureRise - rb.temperatureRise)).toBeGreaterThan(0.01);

    // The engineer's desk computes the same sheet as the saved draft.
    const calc = await engineer.post('/api/coil/calculate').set(csrf).send(spec);
    expect(calc.status).toBe(200);
    expect(calc.body.temperatureRise).toBeCloseTo(r.temperatureRise, 9);
    // A spec that names its own h keeps it.
    const own = await draftSheet(engineer, lineId, coilSpec(GAUGE, { heatTransferCoefficient: 20 }));
    expect(own.spec.heatTransferCoefficient).toBe(20);
  });

  it('an admin clearing the setting returns new drafts to the engine’s default and forgets the adoption', async () => {
    const res = await admin.patch('/api/settings').set(csrf).send({ defaultHeatTransferCoefficient: null });
    expect(res.status).toBe(200);
    const fb = await engineer.get('/api/quality/design-feedback');
    expect(fb.body.shopDefault).toMatchObject({ value: null, adoptedBy: null, adoptedAt: null });
    expect((await draftSheet(engineer, lineId, coilSpec(GAUGE))).spec.heatTransferCoefficient).toBeUndefined();
    const bad = await admin.patch('/api/settings').set(csrf).send({ defaultHeatTransferCoefficient: 0 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.defaultHeatTransferCoefficient).toBeTruthy();
  });
});
