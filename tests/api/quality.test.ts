import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp } from '../helpers/app';
import { newCompany } from '../helpers/orders';
import { newStation } from '../helpers/floor';
import { recordTest, workOrdersInTesting } from '../helpers/test-records';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let foreman: Agent;
let engineer: Agent;
let station: { id: number; name: string };
let w: Awaited<ReturnType<typeof workOrdersInTesting>>[number];
const LOT = `QUALITY-${process.pid}`;
const K_CU = 234.5;

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  engineer = await t.signIn('engineer');
  const admin = await t.signIn('admin');
  const company = await newCompany(await t.signIn('office'));
  station = await newStation(admin);
  // The work order's own station (the winding station the summary groups by).
  [w] = await workOrdersInTesting(t, foreman, company.id, 1, LOT, station.id);
  const assign = await foreman.post('/api/work-orders/assign').set({ 'X-Requested-By': 'spoolwright' }).send({ ids: [w.id], stationId: station.id });
  expect(assign.status).toBe(200);
});

describe('the quality summary', () => {
  it('gives first-pass yield by week, coil kind and station, and the common failure reasons', async () => {
    const serial = (u: number) => `${w.number}-Q${u}`;
    // 4 first tests: 3 pass, 1 fails on resistance (its retest passes but does not count as first pass).
    for (const u of [1, 2, 3]) expect((await recordTest(foreman, w.id, { serial: serial(u), resistance: w.nominal, temperature: 20 })).status).toBe(201);
    await recordTest(foreman, w.id, { serial: serial(4), resistance: w.nominal * 1.5, temperature: 20 });
    await recordTest(foreman, w.id, { serial: serial(4), resistance: w.nominal, temperature: 20, retest: true });
    const res = await foreman.get('/api/quality/summary');
    expect(res.status).toBe(200);
    expect(res.body.byStation.find((r: { key: string }) => r.key === station.name)).toEqual({ key: station.name, firstTests: 4, firstPassed: 3, firstPassYield: 0.75 });
    expect(res.body.byCoilKind.map((r: { key: string }) => r.key)).toContain('copper · voltage drive');
    expect(res.body.byWeek.at(-1).key).toMatch(/^\d{4}-W\d{2}$/);
    expect(res.body.failureReasons.find((r: { name: string }) => r.name === 'resistance').count).toBeGreaterThanOrEqual(1);
    const tests = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(tests.body.firstPassYield).toBe(0.75);
    expect((await (await t.signIn('floor')).get('/api/quality/summary')).status).toBe(403);
    expect((await (await t.signIn('office')).get('/api/quality/summary')).status).toBe(200);
  });
});

describe('design feedback', () => {
  it('recovers a known heat-transfer coefficient from synthetic heat runs', async () => {
    const sheet = await engineer.get(`/api/build-sheets/${w.buildSheetId}`);
    expect(sheet.status).toBe(200);
    const result = sheet.body.result ?? sheet.body.buildSheet.result;
    const spec = sheet.body.spec ?? sheet.body.buildSheet.spec;
    expect(spec.heatTransferCoefficient).toBeUndefined(); // the engine used its default, 10 W/(m²·K)
    const predicted: number = result.temperatureRise;
    // A shop whose coils shed heat with h = 12.5 W/(m²·K): at fixed power ΔT ∝ 1/h, so the
    // measured rise is predicted × 10 / 12.5; the fit h_eff = h_used × ΔT_predicted / ΔT_measured must give 12.5.
    const hTrue = 12.5;
    const rise = (predicted * 10) / hTrue;
    for (const [u, cold, ambient] of [
      [1, 20, 20],
      [2, 22, 21.5],
      [3, 18, 19],
    ]) {
      const r1 = w.nominal * ((K_CU + cold) / (K_CU + 20));
      // Inverse of the resistance method (IEC 60034-1 / IEEE Std 118): R2 = R1 · (1 + (Δθ − θ1 + θa)/(k + θ1)).
      const r2 = r1 * (1 + (rise - cold + ambient) / (K_CU + cold));
      const res = await recordTest(foreman, w.id, { serial: `${w.number}-H${u}`, resistance: r1, temperature: cold, heatRun: { coldResistance: r1, coldTemperature: cold, hotResistance: r2, ambient } });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const heat = res.body.readings.find((r: { name: string }) => r.name === 'heat_run');
      expect(heat.derived.rise).toBeCloseTo(rise, 9);
      expect(heat.value).toBeCloseTo(spec.ambient + rise, 9);
    }
    const fb = await engineer.get('/api/quality/design-feedback');
    expect(fb.status).toBe(200);
    const row = fb.body.designs.find((d: { buildSheetId: number }) => d.buildSheetId === w.buildSheetId);
    expect(row.heatRuns).toBe(3);
    expect(row.heatTransferUsed).toBe(10);
    expect(row.heatTransferEffective.mean).toBeCloseTo(hTrue, 9);
    expect(row.heatTransferEffective.spread).toBeCloseTo(0, 9);
    expect(row.meanMeasuredRise).toBeCloseTo(rise, 9);
    expect(row.computedResistance20).toBeCloseTo(w.nominal, 12);
    expect(fb.body.relation).toMatch(/h_eff = h_used × ΔT_predicted \/ ΔT_measured/);
    expect((await foreman.get('/api/quality/design-feedback')).status).toBe(403);
  });

  it('takes each unit’s R20 as it stands and leaves a unit with a failed resistance (a defect) out of the mean', async () => {
    const before = (await engineer.get('/api/quality/design-feedback')).body.designs.find((d: { buildSheetId: number }) => d.buildSheetId === w.buildSheetId);
    // Every unit so far stands at the nominal R20 (the summary's failed unit passed its retest).
    expect(before.meanMeasuredResistance20).toBeCloseTo(w.nominal, 9);
    // An open circuit reads a thousand times the nominal; it fails and opens a nonconformance.
    const open = await recordTest(foreman, w.id, { serial: `${w.number}-OPEN`, resistance: w.nominal * 1000, temperature: 20 });
    expect(open.body.passed).toBe(false);
    const after = (await engineer.get('/api/quality/design-feedback')).body.designs.find((d: { buildSheetId: number }) => d.buildSheetId === w.buildSheetId);
    expect(after.meanMeasuredResistance20).toBeCloseTo(w.nominal, 9);
    expect(after.meanDeviationPercent).toBeCloseTo(0, 6);
    expect(after.units).toBe(before.units + 1);
  });
});
