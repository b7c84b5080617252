/**
 * Demo seed: test instruments and unit test records. Readings are invented, spread around each
 * design's nominal values with a fixed-seed pseudo-random generator (deterministic), through the
 * same service the API uses (applyRecordTest, applyDisposition, applyApproval).
 *
 * The floor step (server/seed/floor.ts) calls `testBatchForPacking` before it moves a work order
 * into packing, because the packing gate now needs every unit's test passed or dispositioned.
 * This step then adds the instruments and the tests of work orders in testing, inspection and
 * rework. Shipped history has no test records (it left the shop before records were kept here).
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { SessionUser } from '../../src/contracts/auth';
import type { RecordTestRequest } from '../../src/contracts/test-records';
import { correctResistance } from '../coil';
import type { Db, Tx } from '../db/client';
import { buildSheets, instruments, nonconformances, notifications, orderLines, testRecords, workOrders } from '../db/schema';
import { addDays, localDate } from '../floor/estimate';
import { hipotTestVoltage } from '../test-records/judge';
import { applyApproval, applyDisposition, applyRecordTest, createInstrument } from '../test-records/service';
import { findUserByEmail } from '../users/repository';
import { toSessionUser } from '../users/service';

/** mulberry32: a small deterministic generator (fixed seed → the same demo every reset). */
export function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
/** Roughly normal (sum of three uniforms), mean 0, sd ≈ 1. */
const gauss = (r: () => number) => (r() + r() + r() - 1.5) * 2;

/** Invented instruments; the LCR meter's calibration comes due in 4 days, none is overdue. */
export async function ensureInstruments(tx: Tx) {
  const existing = await tx.select().from(instruments).orderBy(asc(instruments.id));
  if (existing.length) return existing.map((i) => i.id);
  const today = localDate();
  const list = [
    { name: 'Bench micro-ohmmeter', kind: 'ohmmeter' as const, serial: 'MO-4471', calibrationDue: addDays(today, 160) },
    { name: 'Hi-pot tester 5 kV', kind: 'hipot_tester' as const, serial: 'HP-2208', calibrationDue: addDays(today, 95) },
    { name: 'Insulation tester 1 kV', kind: 'insulation_tester' as const, serial: 'IR-0913', calibrationDue: addDays(today, 210) },
    { name: 'LCR meter', kind: 'lcr_meter' as const, serial: 'LCR-3356', calibrationDue: addDays(today, 4) },
    { name: 'Contact thermometer', kind: 'thermometer' as const, serial: 'TH-1187', calibrationDue: addDays(today, 300) },
  ];
  const ids: number[] = [];
  for (const i of list) ids.push((await createInstrument(tx, i)).id);
  return ids;
}

async function foremanOf(tx: Tx) {
  const row = await findUserByEmail(tx as unknown as Db, 'foreman@spoolwright.test');
  return row ? toSessionUser(row) : null;
}

type Sheet = typeof buildSheets.$inferSelect;

/** A unit's readings around nominal; `off` pushes the resistance that far (fraction) from nominal. */
export function readings(r: () => number, sheet: Sheet, tolerancePercent: number, serial: string, instrumentIds: number[], opts: { off?: number; heatRun?: boolean } = {}): RecordTestRequest {
  const res = sheet.result;
  const temperature = Math.round((21 + gauss(r) * 2) * 10) / 10;
  // Spread: about a sixth of the line's tolerance (sd), so a passing unit stays well inside it.
  const r20 = res.resistance20 * (1 + (opts.off ?? (gauss(r) * tolerancePercent) / 600));
  // The ohmmeter reads the winding at its temperature: R = R20 · (k + θ)/(k + 20), the inverse correction.
  const resistance = Number((r20 / correctResistance(1, temperature, 20, sheet.spec.conductor)).toPrecision(5));
  const input: RecordTestRequest = {
    serial,
    resistance,
    temperature,
    hipot: { voltage: hipotTestVoltage(sheet.spec, res), seconds: 60, leakage: Number(((0.4 + r() * 0.8) * 1e-3).toPrecision(3)), breakdown: false },
    insulationResistance: { voltage: 500, resistance: Math.round((800 + r() * 4000) * 1e6) },
    inductance: Number((res.inductance * (1 + gauss(r) * 0.05)).toPrecision(4)),
    turns: res.turns + (r() < 0.2 ? 1 : 0),
    instrumentIds,
  };
  if (opts.heatRun && sheet.spec.ambient + res.temperatureRise < sheet.spec.insulationClass) {
    // A shop whose coils run a little cooler than the engine says (effective h ≈ 11–12.5 W/(m²·K)
    // against the default 10): measured rise = predicted × 10 / h.
    const h = 11 + r() * 1.5;
    const rise = Math.max(res.temperatureRise * ((sheet.spec.heatTransferCoefficient ?? 10) / h), 1);
    const coldTemperature = temperature;
    const ambient = Math.round((coldTemperature + gauss(r) * 0.5) * 10) / 10;
    const k = sheet.spec.conductor === 'copper' ? 234.5 : 225;
    // Inverse of the resistance method: R2 = R1 · (1 + (Δθ − θ1 + θa)/(k + θ1)).
    const hotResistance = Number((resistance * (1 + (rise - coldTemperature + ambient) / (k + coldTemperature))).toPrecision(6));
    input.heatRun = { coldResistance: resistance, coldTemperature, hotResistance, ambient };
  }
  return input;
}

async function sheetOf(tx: Tx, workOrderId: number) {
  const [row] = await tx
    .select({ wo: workOrders, sheet: buildSheets, tolerancePercent: orderLines.tolerancePercent })
    .from(workOrders)
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .where(eq(workOrders.id, workOrderId));
  return row;
}

const daysAgo = (d: number, minutes: number) => new Date(Date.now() - d * 86_400_000 - minutes * 60_000);

/**
 * Tests every unit of a work order bound for packing. Every third batch has one unit scrapped
 * (resistance far out) and one used as is with the engineer's approval; every batch has two heat runs.
 */
export async function testBatchForPacking(tx: Tx, actor: SessionUser, workOrderId: number, batchNo: number) {
  const r = rng(7919 * (batchNo + 1));
  const ids = await ensureInstruments(tx);
  const { wo, sheet, tolerancePercent } = await sheetOf(tx, workOrderId);
  const engineerRow = await findUserByEmail(tx as unknown as Db, 'engineer@spoolwright.test');
  const day = 2 + (batchNo % 12);
  for (let u = 1; u <= wo.quantity; u++) {
    const serial = `${wo.number}-${String(u).padStart(3, '0')}`;
    const withFailures = batchNo % 3 === 1;
    const off = withFailures && u === 7 ? 0.16 + tolerancePercent / 100 : withFailures && u === 12 ? -0.02 - tolerancePercent / 100 : undefined;
    const id = await applyRecordTest(tx, actor, workOrderId, readings(r, sheet, tolerancePercent, serial, ids, { off, heatRun: u === 3 || u === 15 }), daysAgo(day, (wo.quantity - u) * 4));
    if (withFailures && u === 7) await applyDisposition(tx, actor, await ncOf(tx, id), { action: 'scrap', reason: 'Resistance far too high: a layer wound with the wrong gauge; not worth rewinding' });
    if (withFailures && u === 12 && engineerRow) {
      const nc = await ncOf(tx, id);
      await applyDisposition(tx, actor, nc, { action: 'use_as_is', reason: 'Resistance just under the band; the customer runs it on a current driver, so the coil still meets its ampere-turns' });
      await applyApproval(tx, toSessionUser(engineerRow), nc, 'Checked against the requirement: acceptable on current drive');
    }
  }
}

async function ncOf(tx: Tx, testRecordId: number) {
  const [row] = await tx.select({ id: nonconformances.id }).from(nonconformances).where(eq(nonconformances.testRecordId, testRecordId));
  return row.id;
}

export async function seedTestRecords(db: Db) {
  const tx = db as unknown as Tx;
  const foreman = await foremanOf(tx);
  if (!foreman) return; // not a demo installation
  const ids = await ensureInstruments(tx);
  const wos = await tx
    .select({ id: workOrders.id, stage: workOrders.stage })
    .from(workOrders)
    .where(inArray(workOrders.stage, ['testing', 'inspection', 'rework']))
    .orderBy(asc(workOrders.id));
  let n = 0;
  for (const w of wos) {
    const [any] = await tx.select({ id: testRecords.id }).from(testRecords).where(and(eq(testRecords.workOrderId, w.id))).limit(1);
    if (any) continue;
    n += 1;
    const r = rng(104729 + w.id);
    const { wo, sheet, tolerancePercent } = await sheetOf(tx, w.id);
    // Testing: part of the batch so far; inspection and rework: the whole batch.
    const count = w.stage === 'testing' ? Math.min(wo.quantity, 8 + (n % 5)) : wo.quantity;
    for (let u = 1; u <= count; u++) {
      const serial = `${wo.number}-${String(u).padStart(3, '0')}`;
      // Rework batches: three units read open circuit (the floor's rework note); testing: the odd one out of tolerance, left open for the foreman.
      const open = w.stage === 'rework' && (u === 4 || u === 9 || u === 17);
      const off = open ? 40 : w.stage === 'testing' && n % 2 === 0 && u === 5 ? 0.03 + tolerancePercent / 100 : undefined;
      const id = await applyRecordTest(tx, foreman, w.id, readings(r, sheet, tolerancePercent, serial, ids, { off, heatRun: w.stage === 'inspection' && u === 2 }), daysAgo(1 + (n % 3), (count - u) * 3));
      if (open) await applyDisposition(tx, foreman, await ncOf(tx, id), { action: 'rework', reason: 'Open circuit: broken lead at the start of the winding; rewind', returnTo: 'winding' });
    }
  }
  // Notices of failures dispositioned before the demo began are history: recorded, not sent.
  await tx
    .update(notifications)
    .set({ status: 'skipped', reason: 'Demo history: dispositioned before the demo began; not sent' })
    .where(
      and(
        eq(notifications.kind, 'unit_failed'),
        eq(notifications.status, 'pending'),
        inArray(sql`(${notifications.payload}->>'nonconformanceId')::int`, tx.select({ id: nonconformances.id }).from(nonconformances).where(eq(nonconformances.state, 'dispositioned'))),
      ),
    );
}

/** The seed step registered in SEED_STEPS (server/seed/demo.ts), after the floor and history steps. */
export const demoTestRecordsStep = {
  id: 'demo-test-records',
  run: (db: Db) => seedTestRecords(db),
};
