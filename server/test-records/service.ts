/**
 * Test records: instruments, recording a unit's test (the server judges it, judge.ts), the
 * nonconformance and foreman notice a failure opens (same transaction), dispositions, the
 * packing gate's unit count, and the quality views.
 *
 * THE PACKING GATE RULE (unitTests): each serial's LATEST record decides the unit —
 *   passed                                   → settled
 *   failed, use as is approved by engineer   → settled
 *   failed, scrapped                         → leaves the batch (good quantity = quantity − scrapped)
 *   failed, open / rework (awaiting retest) / use as is awaiting approval → open failure
 * 'clear' when there is no open failure AND settled units ≥ good quantity; otherwise 'open' with
 * outstanding = max(good quantity − settled, open failures). A work order with no records is
 * 'open' (every unit outstanding): nothing is claimed that nobody recorded.
 */
import type { SessionUser } from '../../src/contracts/auth';
import { flowIndex } from '../../src/contracts/stages';
import type {
  CreateInstrumentRequest,
  DesignFeedback,
  DesignFeedbackRow,
  DispositionRequest,
  InstrumentRecord,
  Nonconformance,
  QualitySummary,
  ReadingName,
  RecordTestRequest,
  TestRecord,
  UpdateInstrumentRequest,
  WorkOrderTests,
  YieldRow,
} from '../../src/contracts/test-records';
import { ADOPT_TOLERANCE_PERCENT, type AdoptHeatTransferRequest, type HeatTransferDefault } from '../../src/contracts/settings';
import { CoilSpecError, DEFAULT_HEAT_TRANSFER_COEFFICIENT } from '../coil';
import { getHeatTransferDefault, getShopSettings, setShopSetting } from '../settings/service';
import type { Db, Tx } from '../db/client';
import { buildSheets, nonconformances, notifications, orderLines, orders, stations, testRecords, workOrders } from '../db/schema';
import { localDate } from '../floor/estimate';
import type { UnitTestState } from '../floor/moves';
import { applyMove } from '../floor/service';
import { badRequest, conflict, HttpError, notFound, ruleBroken } from '../http/errors';
import { eq, inArray, isNull, asc } from 'drizzle-orm';
import { heatTransferUsed, judgeUnit } from './judge';
import * as repo from './repository';

const isUniqueViolation = (e: unknown) =>
  (e as { code?: string }).code === '23505' || (e as { cause?: { code?: string } }).cause?.code === '23505';

// ── Instruments ────────────────────────────────────────────────────────────────────────────

function toInstrument(r: repo.InstrumentRow, today = localDate()): InstrumentRecord {
  return { id: r.id, name: r.name, kind: r.kind, serial: r.serial, calibrationDue: r.calibrationDue, active: r.active, overdue: r.calibrationDue < today, createdAt: r.createdAt.toISOString() };
}
const instrumentTaken = () => new HttpError(409, 'conflict', 'An instrument of this kind with this serial exists', { serial: 'Already listed' });

export async function listInstruments(db: Db): Promise<InstrumentRecord[]> {
  return (await repo.listInstruments(db)).map((r) => toInstrument(r));
}
export async function createInstrument(db: Db | Tx, input: CreateInstrumentRequest): Promise<InstrumentRecord> {
  try {
    return toInstrument(await repo.insertInstrument(db, input));
  } catch (e) {
    if (isUniqueViolation(e)) throw instrumentTaken();
    throw e;
  }
}
export async function updateInstrument(db: Db, id: number, input: UpdateInstrumentRequest): Promise<InstrumentRecord> {
  try {
    const row = await repo.updateInstrument(db, id, input);
    if (!row) throw notFound('No such instrument');
    return toInstrument(row);
  } catch (e) {
    if (isUniqueViolation(e)) throw instrumentTaken();
    throw e;
  }
}

/** Every instrument named exists, is in use and is not past its calibration due date (ISO 9001 traceability). */
async function usableInstruments(tx: Tx, ids: number[]) {
  const unique = [...new Set(ids)];
  const rows = await repo.instrumentsByIds(tx, unique);
  const found = new Map(rows.map((r) => [r.id, r]));
  const unknown = unique.filter((i) => !found.has(i));
  if (unknown.length) throw ruleBroken(`No instrument with id ${unknown.join(', ')}`, { instrumentIds: `Unknown: ${unknown.join(', ')}` });
  const today = localDate();
  for (const r of rows) {
    if (!r.active) throw ruleBroken(`Instrument ${r.name} (${r.serial}) is not in use`, { instrumentIds: `${r.name} is not in use` });
    if (r.calibrationDue < today) {
      throw ruleBroken(`Instrument ${r.name} (${r.serial}) was due for calibration on ${r.calibrationDue}; a reading taken with it is not traceable. Use a calibrated instrument.`, {
        instrumentIds: `${r.name}: calibration overdue since ${r.calibrationDue}`,
      });
    }
  }
  return unique.map((i) => found.get(i)!);
}

// ── Serials ────────────────────────────────────────────────────────────────────────────────

/**
 * The next `count` serials of a work order: `<WO number>-001` …, after the highest used. A
 * suggestion, not a reservation: uniqueness is enforced when a first test is recorded.
 */
export async function nextSerials(db: Db, workOrderId: number, count: number): Promise<string[]> {
  const wo = await repo.findWorkOrder(db, workOrderId);
  if (!wo) throw notFound('No such work order');
  const prefix = `${wo.number}-`;
  let max = 0;
  for (const s of await repo.serialsOf(db, workOrderId)) {
    if (s.startsWith(prefix) && /^\d+$/.test(s.slice(prefix.length))) max = Math.max(max, Number(s.slice(prefix.length)));
  }
  return Array.from({ length: count }, (_, i) => `${prefix}${String(max + i + 1).padStart(3, '0')}`);
}

// ── Recording a test ───────────────────────────────────────────────────────────────────────

/** Tests are recorded from testing on (and in rework or on hold), never after shipping. */
const testable = (stage: string) => stage !== 'shipped' && (stage === 'rework' || stage === 'on_hold' || flowIndex(stage as never) >= flowIndex('testing'));

export async function recordTest(db: Db, actor: SessionUser, workOrderId: number, input: RecordTestRequest): Promise<TestRecord> {
  try {
    const id = await db.transaction((tx) => applyRecordTest(tx, actor, workOrderId, input));
    return (await getRecords(db, [id]))[0];
  } catch (e) {
    if (isUniqueViolation(e)) throw conflict(`Serial ${input.serial} has a first test in this work order already; record a retest`);
    throw e;
  }
}

/** The recording itself, inside the caller's transaction (the route's, or the demo seed's). Returns the record id. */
export async function applyRecordTest(tx: Tx, actor: SessionUser, workOrderId: number, input: RecordTestRequest, testedAt?: Date): Promise<number> {
  const found = await repo.lockWorkOrderWithSheet(tx, workOrderId);
  if (!found) throw notFound('No such work order');
  const { wo, sheet, line } = found;
  if (!testable(wo.stage)) throw ruleBroken(`${wo.number} is in ${wo.stage}; units are tested from testing on`, { workOrder: `In ${wo.stage}` });
  if (input.pull !== undefined && sheet.result.pullForce === undefined) throw ruleBroken('This design has no computed pull to check against', { pull: 'No computed pull on the build sheet' });
  const instruments = await usableInstruments(tx, input.instrumentIds ?? []);

  const earlier = await repo.latestForSerial(tx, workOrderId, input.serial);
  if (earlier && !input.retest) throw conflict(`Serial ${input.serial} was tested already in ${wo.number}; record a retest (nothing is overwritten)`, { fields: { serial: 'Tested already: retest' } });
  if (!earlier && input.retest) throw ruleBroken(`Serial ${input.serial} has no earlier test in ${wo.number} to retest`, { serial: 'No earlier test' });
  if (earlier && !earlier.passed) {
    const ncs = await repo.nonconformancesOf(tx, [workOrderId]);
    const scrapped = ncs.find((x) => x.nc.testRecordId === earlier.id && x.d?.action === 'scrap');
    if (scrapped) throw ruleBroken(`Serial ${input.serial} was scrapped; a scrapped unit is not retested`, { serial: 'Scrapped' });
  }

  let j;
  try {
    j = judgeUnit(input, sheet, line.tolerancePercent);
  } catch (e) {
    if (e instanceof CoilSpecError) throw badRequest(e.message, { [e.field]: e.message });
    throw e;
  }
  const record = await repo.insertTestRecord(tx, {
    workOrderId,
    buildSheetId: sheet.id,
    serial: input.serial,
    retestOfId: earlier?.id ?? null,
    resistance: input.resistance,
    temperature: input.temperature,
    // The judgement's values as stored columns (Judgement is exactly those).
    ...j,
    entered: input,
    instrumentIds: instruments.map((i) => i.id),
    stationId: wo.stationId,
    testedBy: actor.id,
    ...(testedAt && { testedAt }),
  });
  if (!j.passed) {
    const failed = j.readings.filter((r) => !r.passed).map((r) => ({ name: r.name, value: r.value, limit: r.limit.text, reason: r.reason }));
    const summary = `${wo.number} unit ${input.serial}: ${j.reasons.join('; ')}`;
    const nc = await repo.insertNonconformance(tx, { workOrderId, testRecordId: record.id, serial: input.serial, summary, failed });
    // The foreman's internal notice, in the same transaction as the failing record (outbox).
    const recipients = await repo.activeForemen(tx);
    await tx.insert(notifications).values({
      kind: 'unit_failed',
      recipients,
      orderId: wo.orderId,
      payload: { workOrderId, workOrderNumber: wo.number, lineTitle: line.title, serial: input.serial, testRecordId: record.id, nonconformanceId: nc.id, reasons: j.reasons, retest: !!earlier },
      status: recipients.length ? 'pending' : 'skipped',
      reason: recipients.length ? null : 'No active foreman to tell',
    });
  }
  return record.id;
}

// ── Reading records ────────────────────────────────────────────────────────────────────────

async function getRecords(db: Db | Tx, ids: number[]): Promise<TestRecord[]> {
  const rows = await db.select().from(testRecords).where(inArray(testRecords.id, ids.length ? ids : [-1]));
  if (!rows.length) return [];
  return toRecords(db, rows);
}

async function toRecords(db: Db | Tx, rows: repo.TestRecordRow[]): Promise<TestRecord[]> {
  const instIds = [...new Set(rows.flatMap((r) => r.instrumentIds))];
  const [insts, people, ncs] = await Promise.all([
    repo.instrumentsByIds(db, instIds),
    repo.userNames(db, [...new Set(rows.map((r) => r.testedBy).filter((x): x is number => x !== null))]),
    repo.nonconformancesOf(db, [...new Set(rows.map((r) => r.workOrderId))]),
  ]);
  const inst = new Map(insts.map((i) => [i.id, i]));
  const who = new Map(people.map((p) => [p.id, p]));
  const ncBy = new Map(ncs.map((x) => [x.nc.testRecordId, x.nc.id]));
  return rows.map((r) => ({
    id: r.id,
    workOrderId: r.workOrderId,
    serial: r.serial,
    retestOfId: r.retestOfId,
    firstTest: r.retestOfId === null,
    resistance: r.resistance,
    temperature: r.temperature,
    resistance20: r.resistance20,
    nominalResistance20: r.nominalResistance20,
    tolerancePercent: r.tolerancePercent,
    deviationPercent: r.deviationPercent,
    deviationOhms: r.deviationOhms,
    passed: r.passed,
    reasons: r.reasons,
    readings: r.readings,
    entered: r.entered,
    instruments: r.instrumentIds.map((i) => inst.get(i)).filter((i) => !!i).map((i) => ({ id: i!.id, name: i!.name, serial: i!.serial, calibrationDue: i!.calibrationDue })),
    nonconformanceId: ncBy.get(r.id) ?? null,
    testedBy: r.testedBy !== null && who.has(r.testedBy) ? who.get(r.testedBy)! : null,
    testedAt: r.testedAt.toISOString(),
  }));
}

type NcJoin = Awaited<ReturnType<typeof repo.nonconformancesOf>>[number];

async function toNonconformances(db: Db | Tx, list: NcJoin[]): Promise<Nonconformance[]> {
  const ids = list.flatMap((x) => [x.d?.decidedBy, x.d?.approvedBy]).filter((x): x is number => typeof x === 'number');
  const who = new Map((await repo.userNames(db, [...new Set(ids)])).map((p) => [p.id, p]));
  const person = (id: number | null | undefined) => (id != null && who.has(id) ? who.get(id)! : null);
  return list.map(({ nc, d }) => ({
    id: nc.id,
    workOrderId: nc.workOrderId,
    testRecordId: nc.testRecordId,
    serial: nc.serial,
    summary: nc.summary,
    failed: nc.failed,
    state: nc.state,
    disposition: d
      ? {
          action: d.action,
          reason: d.reason,
          returnTo: d.returnTo,
          by: person(d.decidedBy),
          at: d.decidedAt.toISOString(),
          approvedBy: person(d.approvedBy),
          approvedAt: d.approvedAt?.toISOString() ?? null,
          approvalNote: d.approvalNote,
        }
      : null,
    createdAt: nc.createdAt.toISOString(),
  }));
}

type UnitState = WorkOrderTests['units'][number]['state'];

/** Where each unit of a work order stands, and the gate (the rule at the top of this file). */
function standing(quantity: number, records: Pick<repo.TestRecordRow, 'id' | 'serial' | 'passed'>[], ncs: NcJoin[]) {
  const latest = new Map<string, Pick<repo.TestRecordRow, 'id' | 'serial' | 'passed'>>();
  for (const r of [...records].sort((a, b) => a.id - b.id)) latest.set(r.serial, r);
  const ncByRecord = new Map(ncs.map((x) => [x.nc.testRecordId, x]));
  const units: { serial: string; latestRecordId: number; passed: boolean; state: UnitState }[] = [];
  for (const r of latest.values()) {
    let state: UnitState = 'passed';
    if (!r.passed) {
      const x = ncByRecord.get(r.id);
      const d = x?.d;
      if (!d) state = 'failed_open';
      else if (d.action === 'scrap') state = 'scrapped';
      else if (d.action === 'rework') state = 'rework';
      else state = d.approvedAt ? 'use_as_is' : 'awaiting_approval';
    }
    units.push({ serial: r.serial, latestRecordId: r.id, passed: r.passed, state });
  }
  const scrapped = units.filter((u) => u.state === 'scrapped').length;
  const settled = units.filter((u) => u.state === 'passed' || u.state === 'use_as_is').length;
  const openFailures = units.filter((u) => u.state === 'failed_open' || u.state === 'rework' || u.state === 'awaiting_approval').length;
  const goodQuantity = Math.max(quantity - scrapped, 0);
  const gate: UnitTestState & ({ state: 'clear' } | { state: 'open'; outstanding: number }) =
    openFailures === 0 && settled >= goodQuantity ? { state: 'clear' } : { state: 'open', outstanding: Math.max(goodQuantity - settled, openFailures) };
  return { units, scrapped, goodQuantity, gate };
}

/** The packing gate's unit-test state for work orders (floor/unit-tests.ts asks here). */
export async function unitTestStates(db: Db | Tx, workOrderIds: number[]): Promise<Map<number, UnitTestState>> {
  const out = new Map<number, UnitTestState>();
  if (!workOrderIds.length) return out;
  const [wos, recs, ncs] = await Promise.all([
    db.select({ id: workOrders.id, quantity: workOrders.quantity }).from(workOrders).where(inArray(workOrders.id, workOrderIds)),
    db.select({ id: testRecords.id, serial: testRecords.serial, passed: testRecords.passed, workOrderId: testRecords.workOrderId }).from(testRecords).where(inArray(testRecords.workOrderId, workOrderIds)),
    repo.nonconformancesOf(db, workOrderIds),
  ]);
  for (const w of wos) {
    out.set(w.id, standing(w.quantity, recs.filter((r) => r.workOrderId === w.id), ncs.filter((x) => x.nc.workOrderId === w.id)).gate);
  }
  return out;
}

/** Each unit's state, the good quantity and the gate of work orders (shipping asks which serials may leave). */
export async function unitStandings(db: Db | Tx, workOrderIds: number[]) {
  const out = new Map<number, ReturnType<typeof standing>>();
  if (!workOrderIds.length) return out;
  // One after another: `db` may be a transaction, whose single connection takes one query at a time.
  const wos = await db.select({ id: workOrders.id, quantity: workOrders.quantity }).from(workOrders).where(inArray(workOrders.id, workOrderIds));
  const recs = await db.select({ id: testRecords.id, serial: testRecords.serial, passed: testRecords.passed, workOrderId: testRecords.workOrderId }).from(testRecords).where(inArray(testRecords.workOrderId, workOrderIds));
  const ncs = await repo.nonconformancesOf(db, workOrderIds);
  for (const w of wos) out.set(w.id, standing(w.quantity, recs.filter((r) => r.workOrderId === w.id), ncs.filter((x) => x.nc.workOrderId === w.id)));
  return out;
}

export async function workOrderTests(db: Db, workOrderId: number): Promise<WorkOrderTests> {
  const wo = await repo.findWorkOrder(db, workOrderId);
  if (!wo) throw notFound('No such work order');
  const [rows, ncs] = await Promise.all([repo.recordsOf(db, [workOrderId]), repo.nonconformancesOf(db, [workOrderId])]);
  const records = await toRecords(db, rows.map((x) => x.r));
  const s = standing(wo.quantity, records, ncs);
  const first = records.filter((r) => r.firstTest);
  return {
    workOrderId,
    number: wo.number,
    quantity: wo.quantity,
    scrapped: s.scrapped,
    goodQuantity: s.goodQuantity,
    records,
    units: s.units,
    nonconformances: await toNonconformances(db, ncs),
    openNonconformances: ncs.filter((x) => x.nc.state !== 'dispositioned').length,
    firstPassYield: first.length ? first.filter((r) => r.passed).length / first.length : null,
    gate: s.gate,
  };
}

// ── Dispositions ───────────────────────────────────────────────────────────────────────────

async function readNonconformance(db: Db | Tx, id: number): Promise<Nonconformance> {
  const found = await db.select({ workOrderId: nonconformances.workOrderId }).from(nonconformances).where(eq(nonconformances.id, id));
  if (!found.length) throw notFound('No such nonconformance');
  const list = (await repo.nonconformancesOf(db, [found[0].workOrderId])).filter((x) => x.nc.id === id);
  return (await toNonconformances(db, list))[0];
}

/**
 * The foreman's disposition of a nonconformance (one per nonconformance; never replaced).
 *   rework    — the work order goes to rework through the floor's move (unless it is there already);
 *               the unit needs a passing retest; it comes back to `returnTo` by a normal move later.
 *   scrap     — the unit leaves the batch: the work order's good quantity drops by one.
 *   use_as_is — needs the engineer's approval before it counts as dispositioned.
 */
export async function disposition(db: Db, actor: SessionUser, id: number, input: DispositionRequest): Promise<Nonconformance> {
  await db.transaction((tx) => applyDisposition(tx, actor, id, input));
  return readNonconformance(db, id);
}

export async function applyDisposition(tx: Tx, actor: SessionUser, id: number, input: DispositionRequest) {
  const found = await repo.lockNonconformance(tx, id);
  if (!found) throw notFound('No such nonconformance');
  if (found.d) throw conflict(`This nonconformance was dispositioned already (${found.d.action}); a disposition is never replaced`);
  if (input.returnTo && input.action !== 'rework') throw ruleBroken('Only rework returns to a stage', { returnTo: 'Only with rework' });
  await repo.insertDisposition(tx, { nonconformanceId: id, action: input.action, reason: input.reason, returnTo: input.returnTo ?? null, decidedBy: actor.id });
  await repo.setNonconformanceState(tx, id, input.action === 'use_as_is' ? 'awaiting_approval' : 'dispositioned');
  if (input.action === 'rework') {
    const [wo] = await tx.select().from(workOrders).where(eq(workOrders.id, found.nc.workOrderId));
    if (wo.stage !== 'rework') {
      await applyMove(tx, actor, wo.id, {
        to: 'rework',
        version: wo.version,
        note: `Nonconformance ${id}, unit ${found.nc.serial}: ${input.reason}${input.returnTo ? ` (back to ${input.returnTo} after rework)` : ''}`,
      });
    }
  }
}

/** The engineer approves a use-as-is disposition; only then it counts. */
export async function approve(db: Db, actor: SessionUser, id: number, note?: string): Promise<Nonconformance> {
  await db.transaction((tx) => applyApproval(tx, actor, id, note));
  return readNonconformance(db, id);
}

export async function applyApproval(tx: Tx, actor: SessionUser, id: number, note?: string) {
  const found = await repo.lockNonconformance(tx, id);
  if (!found) throw notFound('No such nonconformance');
  if (!found.d || found.d.action !== 'use_as_is') throw ruleBroken('Only a use-as-is disposition needs approval', { action: found.d ? found.d.action : 'No disposition yet' });
  if (found.d.approvedAt) throw conflict('Approved already');
  await repo.approveDisposition(tx, found.d.id, actor.id, note ?? null);
  await repo.setNonconformanceState(tx, id, 'dispositioned');
}

// ── Quality views ──────────────────────────────────────────────────────────────────────────

/** ISO 8601 week of a date, as "YYYY-Www" (UTC). */
export function isoWeek(d: Date): string {
  const t = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  const day = t.getUTCDay() || 7;
  t.setUTCDate(t.getUTCDate() + 4 - day);
  const yearStart = Date.UTC(t.getUTCFullYear(), 0, 1);
  const week = Math.ceil(((t.getTime() - yearStart) / 86_400_000 + 1) / 7);
  return `${t.getUTCFullYear()}-W${String(week).padStart(2, '0')}`;
}

/**
 * First-pass yield (first tests passed ÷ first tests) by ISO week of the test, by coil kind
 * (conductor and drive, e.g. "copper · voltage drive") and by the work order's station when tested
 * (its winding station); the most common failing readings over every record.
 */
export async function qualitySummary(db: Db): Promise<QualitySummary> {
  const rows = await db
    .select({ passed: testRecords.passed, first: isNull(testRecords.retestOfId), testedAt: testRecords.testedAt, readings: testRecords.readings, spec: buildSheets.spec, stationName: stations.name })
    .from(testRecords)
    .innerJoin(buildSheets, eq(buildSheets.id, testRecords.buildSheetId))
    .leftJoin(stations, eq(stations.id, testRecords.stationId));
  const group = (key: (r: (typeof rows)[number]) => string): YieldRow[] => {
    const m = new Map<string, { n: number; p: number }>();
    for (const r of rows) {
      if (!r.first) continue;
      const k = key(r);
      const g = m.get(k) ?? { n: 0, p: 0 };
      g.n += 1;
      if (r.passed) g.p += 1;
      m.set(k, g);
    }
    return [...m.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([k, g]) => ({ key: k, firstTests: g.n, firstPassed: g.p, firstPassYield: g.n ? g.p / g.n : null }));
  };
  const reasons = new Map<ReadingName, number>();
  for (const r of rows) for (const x of r.readings) if (!x.passed) reasons.set(x.name, (reasons.get(x.name) ?? 0) + 1);
  return {
    byWeek: group((r) => isoWeek(r.testedAt)),
    byCoilKind: group((r) => `${r.spec.conductor} · ${r.spec.drive.kind} drive`),
    byStation: group((r) => r.stationName ?? 'no station'),
    failureReasons: [...reasons.entries()].map(([name, count]) => ({ name, count })).sort((a, b) => b.count - a.count || a.name.localeCompare(b.name)),
  };
}

const meanSpread = (xs: number[]) => {
  if (!xs.length) return null;
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  const spread = xs.length > 1 ? Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1)) : null;
  return { mean, spread };
};

export const HEAT_TRANSFER_RELATION =
  'At fixed dissipated power the rise is inversely proportional to h (P = h·A·ΔT), so h_eff = h_used × ΔT_predicted / ΔT_measured; an approximation that ignores the change of power with the hot resistance. Spread: sample standard deviation.';

/** Per released (or superseded) design: measured R20 and turns against the design, and h_eff from heat runs. */
export async function designFeedback(db: Db): Promise<DesignFeedback> {
  const rows = await db
    .select({ r: testRecords, sheet: buildSheets, lineTitle: orderLines.title, orderNumber: orders.number })
    .from(testRecords)
    .innerJoin(buildSheets, eq(buildSheets.id, testRecords.buildSheetId))
    .innerJoin(orderLines, eq(orderLines.id, buildSheets.lineId))
    .innerJoin(orders, eq(orders.id, orderLines.orderId))
    .where(inArray(buildSheets.status, ['released', 'superseded']))
    .orderBy(asc(buildSheets.id), asc(testRecords.id));
  const by = new Map<number, typeof rows>();
  for (const x of rows) by.set(x.sheet.id, [...(by.get(x.sheet.id) ?? []), x]);
  const allH: number[] = [];
  const designs: DesignFeedbackRow[] = [];
  for (const list of by.values()) {
    const s = list[0].sheet;
    const first = list.filter((x) => x.r.retestOfId === null);
    // R20 of each unit as it stands (its latest record), leaving out units whose resistance
    // reading failed: an open circuit or a shorted turn is a defect of that unit, not a measure
    // of how well the design's computed resistance predicts the built coils.
    const latest = new Map<string, (typeof list)[number]>();
    for (const x of list) latest.set(`${x.r.workOrderId}/${x.r.serial}`, x);
    const conforming = [...latest.values()].filter((x) => x.r.readings.find((g) => g.name === 'resistance')?.passed !== false);
    const r20 = meanSpread(conforming.map((x) => x.r.resistance20));
    const turns = meanSpread(list.map((x) => x.r.entered.turns).filter((t): t is number => typeof t === 'number'));
    const heat = list.map((x) => x.r.readings.find((g) => g.name === 'heat_run')?.derived).filter((d): d is Record<string, number> => !!d);
    const hs = heat.map((d) => d.heatTransferEffective).filter((h): h is number => typeof h === 'number' && Number.isFinite(h));
    allH.push(...hs);
    const rise = meanSpread(heat.map((d) => d.rise));
    designs.push({
      buildSheetId: s.id,
      version: s.version,
      lineTitle: list[0].lineTitle,
      orderNumber: list[0].orderNumber,
      computedResistance20: s.result.resistance20,
      meanMeasuredResistance20: r20?.mean ?? null,
      meanDeviationPercent: r20 ? ((r20.mean - s.result.resistance20) / s.result.resistance20) * 100 : null,
      units: first.length,
      designTurns: s.result.turns,
      meanMeasuredTurns: turns?.mean ?? null,
      heatRuns: heat.length,
      predictedRise: s.result.temperatureRise,
      meanMeasuredRise: rise?.mean ?? null,
      heatTransferUsed: heatTransferUsed(s.spec),
      heatTransferEffective: meanSpread(hs),
    });
  }
  return { designs, shop: { heatRuns: allH.length, heatTransferEffective: meanSpread(allH) }, relation: HEAT_TRANSFER_RELATION, shopDefault: await heatTransferDefault(db) };
}

/** The shop's heat-transfer default for new build sheets, and who adopted it when. */
export async function heatTransferDefault(db: Db | Tx): Promise<HeatTransferDefault> {
  const s = await getShopSettings(db);
  const value = await getHeatTransferDefault(db);
  const byId = Number(s.defaultHeatTransferCoefficientAdoptedBy);
  const people = value !== null && Number.isInteger(byId) && byId > 0 ? await repo.userNames(db, [byId]) : [];
  return {
    value,
    engineDefault: DEFAULT_HEAT_TRANSFER_COEFFICIENT,
    adoptedBy: people[0] ?? null,
    adoptedAt: value !== null && s.defaultHeatTransferCoefficientAdoptedAt ? s.defaultHeatTransferCoefficientAdoptedAt : null,
  };
}

/**
 * The engineer adopts the shop's effective heat-transfer coefficient (from heat runs) as the
 * default for new build sheets. Only a value the heat runs support: there must be at least one,
 * and the value within ADOPT_TOLERANCE_PERCENT of their mean (the screen sends the mean, rounded).
 * Sheets drafted before keep the coefficient they were computed with (each stores its spec).
 */
export async function adoptHeatTransfer(db: Db, actor: SessionUser, input: AdoptHeatTransferRequest): Promise<HeatTransferDefault> {
  const shop = (await designFeedback(db)).shop.heatTransferEffective;
  if (!shop) throw ruleBroken('No heat run gives an effective heat-transfer coefficient yet; record heat runs first', { value: 'No heat runs to support it' });
  const off = (Math.abs(input.value - shop.mean) / shop.mean) * 100;
  if (off > ADOPT_TOLERANCE_PERCENT) {
    throw ruleBroken(`${input.value} W/(m²·K) is ${off.toFixed(0)} % from the shop's measured ${shop.mean.toPrecision(3)} W/(m²·K); adopt the measured value`, {
      value: `Within ${ADOPT_TOLERANCE_PERCENT} % of ${shop.mean.toPrecision(3)} W/(m²·K)`,
    });
  }
  await db.transaction(async (tx) => {
    await setShopSetting(tx, 'defaultHeatTransferCoefficient', String(input.value));
    await setShopSetting(tx, 'defaultHeatTransferCoefficientAdoptedBy', String(actor.id));
    await setShopSetting(tx, 'defaultHeatTransferCoefficientAdoptedAt', new Date().toISOString());
  });
  return heatTransferDefault(db);
}
