import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { csrf, testApp } from '../helpers/app';
import { inDays, newCompany } from '../helpers/orders';
import { move, moveOk, newStation } from '../helpers/floor';
import { recordTest, workOrdersInTesting } from '../helpers/test-records';
import { renderMail } from '../../jobs/mail/templates';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let foreman: Agent;
let engineer: Agent;
let admin: Agent;
let office: Agent;
type W = Awaited<ReturnType<typeof workOrdersInTesting>>[number];
let pool: W[] = [];
const fresh = () => {
  const w = pool.shift();
  if (!w) throw new Error('out of work orders');
  return w;
};
const LOT = `TEST-RECORDS-${process.pid}`;
let station: { id: number };
const serialOf = (w: W, u: number) => `${w.number}-${String(u).padStart(3, '0')}`;

/** Copper, IEC 60034-1 / IEEE Std 118 resistance method: R20 = R·(234.5 + 20)/(234.5 + θ). */
const K_CU = 234.5;
/** The measured resistance at θ that corrects to r20 (the inverse of the formula above). */
const atTemp = (r20: number, theta: number) => (r20 * (K_CU + theta)) / (K_CU + 20);

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  engineer = await t.signIn('engineer');
  admin = await t.signIn('admin');
  office = await t.signIn('office');
  const company = await newCompany(office);
  station = await newStation(admin);
  pool = await workOrdersInTesting(t, foreman, company.id, 10, LOT, station.id);
});

describe('correction to 20 °C and the resistance judgement', () => {
  it('corrects by the resistance method against a hand-computed value', async () => {
    const w = fresh();
    // IEC 60034-1 / IEEE Std 118, copper k = 234.5: 100 Ω read at 30 °C → 100 × 254.5 / 264.5 = 96.219281663… Ω.
    const res = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: 100, temperature: 30 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.resistance20).toBeCloseTo(96.2192816635, 8);
    expect(res.body.deviationOhms).toBeCloseTo(96.2192816635 - w.nominal, 8);
    expect(res.body.deviationPercent).toBeCloseTo(((96.2192816635 - w.nominal) / w.nominal) * 100, 8);
    expect(res.body.readings[0]).toMatchObject({ name: 'resistance', limit: { min: expect.any(Number), max: expect.any(Number) } });
    // The nominal at 40 °C reads R20 × 274.5 / 254.5 (same formula): deviation 0, passed.
    const hot = await recordTest(foreman, w.id, { serial: serialOf(w, 2), resistance: atTemp(w.nominal, 40), temperature: 40 });
    expect(hot.body.resistance20).toBeCloseTo(w.nominal, 9);
    expect(hot.body.deviationPercent).toBeCloseTo(0, 9);
    expect(hot.body).toMatchObject({ passed: true, reasons: [] });
  });

  it('passes exactly at ± tolerance (inclusive) and fails just beyond, at 20 °C and at 35 °C', async () => {
    const w = fresh();
    expect(w.tolerance).toBe(10); // the line's default tolerance
    const cases: [number, number, boolean][] = [
      [1.1, 20, true],
      [0.9, 20, true],
      [1.1001, 20, false],
      [0.8999, 20, false],
      [1.1, 35, true],
      [0.9, 35, true],
      [1.1001, 35, false],
      [0.8999, 35, false],
    ];
    let u = 0;
    for (const [f, theta, passed] of cases) {
      const res = await recordTest(foreman, w.id, { serial: serialOf(w, ++u), resistance: atTemp(w.nominal * f, theta), temperature: theta });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.passed, `${f} at ${theta} °C`).toBe(passed);
      expect(res.body.deviationPercent).toBeCloseTo((f - 1) * 100, 6);
      if (!passed) expect(res.body.reasons[0]).toMatch(/outside ± 10 %/);
    }
  });

  it('judges hi-pot (1000 V + 2 × 24 V = 1048 V for 60 s), insulation resistance (100 MΩ at 500 V), inductance, turns', async () => {
    const w = fresh();
    const good = { resistance: w.nominal, temperature: 20, hipot: { voltage: 1048, seconds: 60, leakage: 0.001, breakdown: false }, insulationResistance: { voltage: 500, resistance: 100e6 } };
    const ok = await recordTest(foreman, w.id, { serial: serialOf(w, 1), ...good });
    expect(ok.body.passed).toBe(true);
    const hipot = ok.body.readings.find((r: { name: string }) => r.name === 'hipot');
    expect(hipot.derived.requiredVoltage).toBe(1048);
    const bad = await recordTest(foreman, w.id, { serial: serialOf(w, 2), ...good, hipot: { voltage: 1000, seconds: 60, leakage: 0.001, breakdown: true }, insulationResistance: { voltage: 500, resistance: 99e6 } });
    expect(bad.body.passed).toBe(false);
    expect(bad.body.reasons.join(' ')).toMatch(/broke down/);
    expect(bad.body.reasons.join(' ')).toMatch(/below the test voltage 1048 V/);
    expect(bad.body.reasons.join(' ')).toMatch(/99 MΩ below 100 MΩ/);
    const sheet = await engineer.get(`/api/build-sheets/${w.buildSheetId}`);
    const { inductance, turns } = sheet.body.result ?? sheet.body.buildSheet.result;
    // Turns band: ± max(2, 1 % of the design's turns) (common practice, no published source); inductance ± 25 %.
    const band = Math.floor(Math.max(2, turns * 0.01));
    const lc = await recordTest(foreman, w.id, { serial: serialOf(w, 3), resistance: w.nominal, temperature: 20, inductance: inductance * 1.25, turns: turns + band });
    expect(lc.body.passed).toBe(true);
    const lcBad = await recordTest(foreman, w.id, { serial: serialOf(w, 4), resistance: w.nominal, temperature: 20, inductance: inductance * 1.3, turns: turns - band - 1 });
    expect(lcBad.body.readings.filter((r: { passed: boolean }) => !r.passed).map((r: { name: string }) => r.name)).toEqual(['inductance', 'turns']);
    // No computed pull on this design: a pull reading is refused, not judged.
    const pull = await recordTest(foreman, w.id, { serial: serialOf(w, 5), resistance: w.nominal, temperature: 20, pull: 10 });
    expect(pull.status).toBe(422);
    expect(pull.body.error.fields).toHaveProperty('pull');
  });

  it('answers nonsense with 400 and fields, writing nothing', async () => {
    const w = pool[0];
    for (const [body, field] of [
      [{ serial: 'X-1', resistance: -1, temperature: 20 }, 'resistance'],
      [{ serial: 'X-1', resistance: 10, temperature: 251 }, 'temperature'],
      [{ serial: 'X-1', resistance: 10, temperature: -41 }, 'temperature'],
      [{ resistance: 10, temperature: 20 }, 'serial'],
      [{ serial: '', resistance: 10, temperature: 20 }, 'serial'],
      [{ serial: 'X-1', resistance: 10, temperature: 20, hipot: { voltage: 1000 } }, 'hipot.seconds'],
      [{ serial: 'X-1', resistance: 10, temperature: 20, heatRun: { coldResistance: 10, coldTemperature: 20, hotResistance: 9, ambient: 20 } }, 'heatRun.hotResistance'],
      [{ serial: 'X-1', resistance: 10, temperature: 20, instrumentIds: [0] }, 'instrumentIds.0'],
    ] as const) {
      const res = await recordTest(foreman, w.id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.fields).toHaveProperty(field);
    }
    const list = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(list.body.records).toEqual([]);
  });
});

describe('instruments', () => {
  it('refuses a reading with an overdue instrument (422 naming it and its due date) and writes nothing', async () => {
    const w = fresh();
    const due = inDays(-1);
    const over = await admin.post('/api/instruments').set(csrf).send({ name: 'Overdue ohmmeter', kind: 'ohmmeter', serial: `OV-${process.pid}-${Date.now()}`, calibrationDue: due });
    expect(over.status, JSON.stringify(over.body)).toBe(201);
    expect(over.body.instrument.overdue).toBe(true);
    const today = await foreman.post('/api/instruments').set(csrf).send({ name: 'Fresh ohmmeter', kind: 'ohmmeter', serial: `OK-${process.pid}-${Date.now()}`, calibrationDue: inDays(1) });
    expect(today.status).toBe(201);
    const res = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal, temperature: 20, instrumentIds: [today.body.instrument.id, over.body.instrument.id] });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toContain('Overdue ohmmeter');
    expect(res.body.error.message).toContain(due);
    expect(res.body.error.fields.instrumentIds).toContain(due);
    expect((await foreman.get(`/api/work-orders/${w.id}/test-records`)).body.records).toEqual([]);
    const ok = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal, temperature: 20, instrumentIds: [today.body.instrument.id] });
    expect(ok.status).toBe(201);
    expect(ok.body.instruments[0]).toMatchObject({ name: 'Fresh ohmmeter', calibrationDue: inDays(1) });
    // Recalibrated: the foreman records the new due date, and the instrument may be used again.
    const recal = await foreman.patch(`/api/instruments/${over.body.instrument.id}`).set(csrf).send({ calibrationDue: inDays(365) });
    expect(recal.status, JSON.stringify(recal.body)).toBe(200);
    expect(recal.body.instrument).toMatchObject({ overdue: false, calibrationDue: inDays(365) });
    const after = await recordTest(foreman, w.id, { serial: serialOf(w, 2), resistance: w.nominal, temperature: 20, instrumentIds: [over.body.instrument.id] });
    expect(after.status).toBe(201);
    expect((await foreman.patch(`/api/instruments/${over.body.instrument.id}`).set(csrf).send({ calibrationDue: '2026-02-30' })).status).toBe(400);
    const list = await (await t.signIn('floor')).get('/api/instruments');
    expect(list.status).toBe(200);
    expect((await (await t.signIn('floor')).post('/api/instruments').set(csrf).send({})).status).toBe(403);
  });
});

describe('serials and retests', () => {
  it('generates the next serials, refuses a second first test of a serial, and records retests without overwriting', async () => {
    const w = fresh();
    const s = await foreman.post(`/api/work-orders/${w.id}/serials`).set(csrf).send({ count: 3 });
    expect(s.status).toBe(201);
    expect(s.body.serials).toEqual([`${w.number}-001`, `${w.number}-002`, `${w.number}-003`]);
    const first = await recordTest(foreman, w.id, { serial: s.body.serials[0], resistance: w.nominal * 1.5, temperature: 20 });
    expect(first.body.passed).toBe(false);
    const next = await foreman.post(`/api/work-orders/${w.id}/serials`).set(csrf).send({ count: 1 });
    expect(next.body.serials).toEqual([`${w.number}-002`]);
    const again = await recordTest(foreman, w.id, { serial: s.body.serials[0], resistance: w.nominal, temperature: 20 });
    expect(again.status).toBe(409);
    const noEarlier = await recordTest(foreman, w.id, { serial: 'NEVER-TESTED', resistance: w.nominal, temperature: 20, retest: true });
    expect(noEarlier.status).toBe(422);
    const re = await recordTest(foreman, w.id, { serial: s.body.serials[0], resistance: w.nominal, temperature: 20, retest: true });
    expect(re.status).toBe(201);
    expect(re.body).toMatchObject({ retestOfId: first.body.id, firstTest: false, passed: true });
    const list = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(list.body.records.map((r: { id: number; passed: boolean }) => [r.id, r.passed])).toEqual([
      [first.body.id, false],
      [re.body.id, true],
    ]);
    expect(list.body.firstPassYield).toBe(0);
    expect(list.body.units).toEqual([{ serial: s.body.serials[0], latestRecordId: re.body.id, passed: true, state: 'passed' }]);
  });
});

describe('failures, nonconformances and dispositions', () => {
  const ncCount = async (woId: number) => Number((await t.deps.db.execute<{ n: string }>(sql`select count(*) as n from nonconformances where work_order_id = ${woId}`)).rows[0].n);

  it('a failure opens a nonconformance and writes the foreman notice in the same transaction', async () => {
    const w = fresh();
    const res = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal * 1.2, temperature: 20 });
    expect(res.status).toBe(201);
    expect(res.body.passed).toBe(false);
    expect(res.body.nonconformanceId).toEqual(expect.any(Number));
    const rows = await t.deps.db.execute<{ kind: string; recipients: { email: string }[]; payload: Record<string, unknown>; same_tx: boolean; status: string }>(sql`
      select n.kind, n.recipients, n.payload, n.status, (n.created_at = r.tested_at and n.created_at = c.created_at) as same_tx
        from notifications n, test_records r, nonconformances c
       where n.kind = 'unit_failed' and (n.payload->>'testRecordId')::int = ${res.body.id} and r.id = ${res.body.id} and c.test_record_id = r.id`);
    expect(rows.rows).toHaveLength(1);
    // now() is the transaction's start time: equal stamps mean one transaction wrote all three.
    expect(rows.rows[0]).toMatchObject({ kind: 'unit_failed', status: 'pending', same_tx: true, payload: { serial: serialOf(w, 1), nonconformanceId: res.body.nonconformanceId } });
    expect(rows.rows[0].recipients.map((r) => r.email)).toContain('foreman@spoolwright.test');
    const list = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(list.body.nonconformances[0]).toMatchObject({ id: res.body.nonconformanceId, state: 'open', failed: [{ name: 'resistance' }] });
    expect(list.body.nonconformances[0].summary).toMatch(/\+20\.00 %/);
    // The notice renders (internal e-mail to the foremen).
    const mail = renderMail('unit_failed', rows.rows[0].payload, { shopName: 'Test shop', publicUrl: 'http://localhost' });
    expect(mail.subject).toContain(serialOf(w, 1));
    expect(mail.text).toMatch(/outside ± 10 %/);
    // A passing record writes neither.
    const before = await ncCount(w.id);
    await recordTest(foreman, w.id, { serial: serialOf(w, 2), resistance: w.nominal, temperature: 20 });
    expect(await ncCount(w.id)).toBe(before);
  });

  it('rework moves the work order to rework through the floor move; the retest is a new record; history stays', async () => {
    const w = fresh();
    const fail = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal * 2, temperature: 20 });
    const nc = fail.body.nonconformanceId;
    expect((await (await t.signIn('floor')).post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'rework', reason: 'x' })).status).toBe(403);
    const bad = await foreman.post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'rework' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('reason');
    const d = await foreman.post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'rework', reason: 'Rewind: wrong gauge on the last layer', returnTo: 'winding' });
    expect(d.status, JSON.stringify(d.body)).toBe(200);
    expect(d.body).toMatchObject({ state: 'dispositioned', disposition: { action: 'rework', returnTo: 'winding' } });
    const wo = await foreman.get(`/api/work-orders/${w.id}`);
    expect(wo.body.stage).toBe('rework');
    expect(wo.body.events.at(-1)).toMatchObject({ kind: 'move', fromStage: 'testing', toStage: 'rework', note: expect.stringContaining(serialOf(w, 1)) });
    const twice = await foreman.post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'scrap', reason: 'Changed my mind' });
    expect(twice.status).toBe(409);
    // Back to winding by a normal move, and the retest.
    await moveOk(foreman, w.id, 'winding', { note: 'Rewind unit 1' });
    for (const stage of ['terminating', 'impregnating', 'curing', 'testing']) {
      await moveOk(foreman, w.id, stage, stage === 'terminating' ? { turnsCounter: 1000, spoolLot: LOT, stationId: station.id } : {});
    }
    const re = await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal, temperature: 20, retest: true });
    expect(re.body).toMatchObject({ passed: true, retestOfId: fail.body.id });
    const list = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(list.body.records.find((r: { id: number }) => r.id === fail.body.id)).toMatchObject({ passed: false, resistance: w.nominal * 2 });
    expect(list.body.units[0]).toMatchObject({ state: 'passed', latestRecordId: re.body.id });
  });

  it('scrap reduces the good quantity; the packing gate refuses an undispositioned failure and opens once every unit is settled', async () => {
    const w = fresh();
    for (let u = 1; u <= 24; u++) expect((await recordTest(foreman, w.id, { serial: serialOf(w, u), resistance: w.nominal, temperature: 20 })).status).toBe(201);
    const fail = await recordTest(foreman, w.id, { serial: serialOf(w, 25), resistance: w.nominal * 0.5, temperature: 20 });
    expect(fail.body.passed).toBe(false);
    await moveOk(foreman, w.id, 'inspection');
    const refused = await move(foreman, w.id, 'packing');
    expect(refused.status).toBe(422);
    expect(refused.body.error).toMatchObject({ rule: 'packing_gate', message: expect.stringMatching(/1 unit\(s\) still open/) });
    const gate = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(gate.body.gate).toEqual({ state: 'open', outstanding: 1 });
    const d = await foreman.post(`/api/nonconformances/${fail.body.nonconformanceId}/disposition`).set(csrf).send({ action: 'scrap', reason: 'Shorted turns; not repairable' });
    expect(d.status).toBe(200);
    const after = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(after.body).toMatchObject({ quantity: 25, scrapped: 1, goodQuantity: 24, gate: { state: 'clear' }, openNonconformances: 0 });
    expect(after.body.records).toHaveLength(25);
    await moveOk(foreman, w.id, 'packing');
    // The order line shows the shortfall (this file scraps only this one unit of its line).
    const detail = await foreman.get(`/api/work-orders/${w.id}`);
    const order = await office.get(`/api/orders/${detail.body.order.id}`);
    expect(order.body.order.lines.find((l: { id: number }) => l.id === detail.body.line.id)).toMatchObject({ quantity: 250, scrapped: 1 });
    // A scrapped unit is not retested.
    const re = await recordTest(foreman, w.id, { serial: serialOf(w, 25), resistance: w.nominal, temperature: 20, retest: true });
    expect(re.status).toBe(422);
  });

  it('use as is needs a reason and the engineer’s approval before it counts', async () => {
    const w = fresh();
    for (let u = 1; u <= 24; u++) await recordTest(foreman, w.id, { serial: serialOf(w, u), resistance: w.nominal, temperature: 20 });
    const fail = await recordTest(foreman, w.id, { serial: serialOf(w, 25), resistance: w.nominal * 1.12, temperature: 20 });
    const nc = fail.body.nonconformanceId;
    const noReason = await foreman.post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'use_as_is', reason: '  ' });
    expect(noReason.status).toBe(400);
    const early = await engineer.post(`/api/nonconformances/${nc}/approve`).set(csrf).send({});
    expect(early.status).toBe(422);
    const d = await foreman.post(`/api/nonconformances/${nc}/disposition`).set(csrf).send({ action: 'use_as_is', reason: 'Customer drives it from a current source' });
    expect(d.body.state).toBe('awaiting_approval');
    expect((await foreman.get(`/api/work-orders/${w.id}/test-records`)).body.gate).toEqual({ state: 'open', outstanding: 1 });
    expect((await foreman.post(`/api/nonconformances/${nc}/approve`).set(csrf).send({})).status).toBe(403);
    const ok = await engineer.post(`/api/nonconformances/${nc}/approve`).set(csrf).send({ note: 'Fine on current drive' });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toMatchObject({ state: 'dispositioned', disposition: { action: 'use_as_is', approvedBy: { name: expect.any(String) }, approvalNote: 'Fine on current drive' } });
    expect((await engineer.post(`/api/nonconformances/${nc}/approve`).set(csrf).send({})).status).toBe(409);
    const after = await foreman.get(`/api/work-orders/${w.id}/test-records`);
    expect(after.body).toMatchObject({ goodQuantity: 25, gate: { state: 'clear' } });
    expect(after.body.units.find((u: { serial: string }) => u.serial === serialOf(w, 25))).toMatchObject({ state: 'use_as_is', passed: false });
  });

  it('units outstanding keep the gate open; unknown ids are 404; a customer may not read tests', async () => {
    const w = fresh();
    await recordTest(foreman, w.id, { serial: serialOf(w, 1), resistance: w.nominal, temperature: 20 });
    expect((await foreman.get(`/api/work-orders/${w.id}/test-records`)).body.gate).toEqual({ state: 'open', outstanding: 24 });
    expect((await recordTest(foreman, 999999999, { serial: 'A', resistance: 1, temperature: 20 })).status).toBe(404);
    expect((await foreman.post('/api/nonconformances/999999999/disposition').set(csrf).send({ action: 'scrap', reason: 'x' })).status).toBe(404);
  });
});
