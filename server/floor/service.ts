/**
 * The floor: stations, stage moves (by the move table in moves.ts), assignment, priority, the
 * load view and "my work". Every change to a work order locks its row, checks the version the
 * user saw, bumps it, writes one event and notifies the live feed, in one transaction.
 */
import type { SessionUser } from '../../src/contracts/auth';
import type {
  AssignWorkOrdersRequest,
  CreateStationRequest,
  FloorChange,
  FloorLoad,
  FloorLoadRow,
  MoveWorkOrderRequest,
  MyWorkItem,
  StationRecord,
  UpdateStationRequest,
  UpdateWorkOrderRequest,
} from '../../src/contracts/floor';
import { PRIORITY_LABELS, type Priority, type WorkOrderDetail, type WorkOrderSummary } from '../../src/contracts/work-orders';
import { sheetEssentials } from '../build-sheets/essentials';
import type { Db, Tx } from '../db/client';
import { conflict, forbidden, HttpError, notFound, ruleBroken } from '../http/errors';
import { getFloorSettings } from '../settings/service';
import * as woRepo from '../work-orders/repository';
import { getWorkOrder, summaries } from '../work-orders/service';
import { addDays, estimateGroup, localDate, workingDays } from './estimate';
import { notifyFloor } from './feed';
import { checkMove, MOVERS } from './moves';
import * as repo from './repository';
import * as stockRepo from '../stock/repository';
import { wireWords } from '../../src/contracts/stock';
import { unitTestGate } from './unit-tests';

const isUniqueViolation = (e: unknown) =>
  (e as { code?: string }).code === '23505' || (e as { cause?: { code?: string } }).cause?.code === '23505';

// ── Stations ───────────────────────────────────────────────────────────────────────────────

function toStation(r: repo.StationRow): StationRecord {
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    wireDiameterMin: r.wireDiameterMin,
    wireDiameterMax: r.wireDiameterMax,
    spindleRpm: r.spindleRpm,
    setupSeconds: r.setupSeconds,
    active: r.active,
    createdAt: r.createdAt.toISOString(),
  };
}

/** The cross-field rules of a station, on the values it would end up with. */
function checkStation(s: Pick<repo.StationRow, 'kind' | 'wireDiameterMin' | 'wireDiameterMax' | 'spindleRpm'>) {
  const fields: Record<string, string> = {};
  if (s.wireDiameterMin !== null && s.wireDiameterMax !== null && s.wireDiameterMin > s.wireDiameterMax) {
    fields.wireDiameterMax = 'The largest wire must not be smaller than the smallest';
  }
  if (s.kind === 'winder' && s.spindleRpm === null) fields.spindleRpm = 'A winding machine states its spindle speed';
  if (Object.keys(fields).length) throw ruleBroken('The station does not add up', fields);
}

const nameTaken = () => new HttpError(409, 'conflict', 'A station with this name exists', { name: 'Pick another name' });

export async function listStations(db: Db, q: { active?: boolean }): Promise<StationRecord[]> {
  return (await repo.listStations(db, q)).map(toStation);
}

export async function createStation(db: Db, input: CreateStationRequest): Promise<StationRecord> {
  checkStation(input);
  try {
    return toStation(await repo.insertStation(db, input));
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken();
    throw e;
  }
}

export async function updateStation(db: Db, id: number, input: UpdateStationRequest): Promise<StationRecord> {
  try {
    return await db.transaction(async (tx) => {
      const current = await repo.lockStation(tx, id);
      if (!current) throw notFound('No such station');
      checkStation({ ...current, ...input });
      return toStation(await repo.updateStation(tx, id, input));
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken();
    throw e;
  }
}

/** An active station, or 422 naming the field. */
async function usableStation(tx: Db | Tx, id: number, field = 'stationId') {
  const s = await repo.findStation(tx, id);
  if (!s) throw ruleBroken('No such station', { [field]: 'No such station' });
  if (!s.active) throw ruleBroken(`Station ${s.name} is not in use`, { [field]: `${s.name} is not in use` });
  return s;
}

/** A millimetre figure for messages: three significant digits. */
const mm = (m: number) => `${Number((m * 1000).toPrecision(3))} mm`;

/**
 * The work orders whose wire lies outside a station's wire-size range (bare diameter, edges
 * inclusive), each with the reason in words. A station without a range takes any wire.
 */
export function wireOutsideStation(
  station: { name: string; wireDiameterMin: number | null; wireDiameterMax: number | null },
  wires: { number: string; bareDiameter: number | null }[],
): { number: string; reason: string }[] {
  const { wireDiameterMin: min, wireDiameterMax: max } = station;
  if (min === null && max === null) return [];
  const range = min !== null && max !== null ? `${mm(min)} to ${mm(max)}` : min !== null ? `${mm(min)} and up` : `up to ${mm(max!)}`;
  return wires
    .filter((w) => w.bareDiameter !== null && ((min !== null && w.bareDiameter < min) || (max !== null && w.bareDiameter > max)))
    .map((w) => ({ number: w.number, reason: `${w.number} winds ${mm(w.bareDiameter!)} wire; ${station.name} takes ${range}` }));
}

/** 422 when a winder's wire-size range does not take these work orders' wire. */
async function checkStationWire(tx: Db | Tx, station: repo.StationRow, workOrderIds: number[]) {
  if (station.kind !== 'winder') return;
  const outside = wireOutsideStation(station, await repo.wireOfWorkOrders(tx, workOrderIds));
  if (outside.length) {
    const why = outside.map((o) => o.reason).join('; ');
    throw new HttpError(422, 'rule', `${why}. Nothing was changed`, { stationId: why }, { rule: 'station_wire_range' });
  }
}

// ── Moves ──────────────────────────────────────────────────────────────────────────────────

const stale = async (tx: Tx, actor: SessionUser, id: number) =>
  conflict('Someone changed this work order since you opened it; here it is as it is now', { current: await getWorkOrder(tx, actor, id) });

const change = (kind: FloorChange['kind'], w: woRepo.WorkOrderRow): FloorChange => ({
  kind,
  id: w.id,
  number: w.number,
  stage: w.stage,
  version: w.version,
  at: w.updatedAt.toISOString(),
});

/**
 * Moves a work order to another stage if the move table allows it. `version` must be the one the
 * user saw (else 409 with the work order as it is now). One event, one notice, one transaction.
 */
export async function moveWorkOrder(db: Db, actor: SessionUser, id: number, input: MoveWorkOrderRequest): Promise<WorkOrderDetail> {
  await db.transaction((tx) => applyMove(tx, actor, id, input));
  return getWorkOrder(db, actor, id);
}

/** The move itself, inside the caller's transaction (the route's, or the demo seed's). */
export async function applyMove(tx: Tx, actor: SessionUser, id: number, input: MoveWorkOrderRequest) {
  if (!MOVERS.includes(actor.role)) throw forbidden();
  const [wo] = await woRepo.lockWorkOrders(tx, [id]);
  if (!wo) throw notFound('No such work order');
  if (wo.version !== input.version) throw await stale(tx, actor, id);

  const stationId = input.stationId ?? wo.stationId;
  const heldFrom = wo.stage === 'on_hold' ? await woRepo.heldFrom(tx, id) : null;
  const unitTests = input.to === 'packing' ? ((await unitTestGate(tx, [id])).get(id) ?? { state: 'not_tracked' as const }) : { state: 'not_tracked' as const };
  const refusal = checkMove({
    actor,
    workOrder: { stage: wo.stage, assigneeId: wo.assigneeId },
    to: input.to,
    note: input.note,
    heldFrom,
    unitTests,
    turnsCounter: input.turnsCounter,
    spoolLot: input.spoolLot,
    stationId,
  });
  if (refusal) throw new HttpError(422, 'rule', refusal.message, refusal.fields, { rule: refusal.rule });
  if (input.stationId != null) {
    const s = await repo.findStation(tx, input.stationId);
    if (!s || !s.active) {
      throw new HttpError(422, 'rule', s ? `Station ${s.name} is not in use` : 'No such station', { stationId: s ? `${s.name} is not in use` : 'No such station' }, { rule: 'station_unusable' });
    }
    await checkStationWire(tx, s, [id]);
  }
  if (input.spoolLot !== undefined) {
    if (!(await repo.spoolLotExists(tx, input.spoolLot))) {
      throw new HttpError(422, 'rule', `No spool with lot ${input.spoolLot} is in stock`, { spoolLot: 'No spool with this lot in stock' }, { rule: 'winding_record' });
    }
    // Traceability: the lot must be of the wire the build sheet winds (conductor, size, grade).
    const key = await repo.wireKeyOfWorkOrder(tx, id);
    if (key && !(await stockRepo.spoolsOfWireWithLot(tx, key, input.spoolLot)).length) {
      const why = `Lot ${input.spoolLot} is not ${wireWords(key)}, the wire ${wo.number} winds`;
      throw new HttpError(422, 'rule', why, { spoolLot: why }, { rule: 'winding_record' });
    }
  }

  const [moved] = await woRepo.updateWorkOrders(tx, [id], { stage: input.to });
  await woRepo.insertEvents(tx, [
    {
      workOrderId: id,
      kind: 'move',
      userId: actor.id,
      fromStage: wo.stage,
      toStage: input.to,
      note: input.note ?? '',
      stationId,
      turnsCounter: input.turnsCounter ?? null,
      spoolLot: input.spoolLot ?? null,
    },
  ]);
  await notifyFloor(tx, change('move', moved));
  return moved;
}

// ── Assignment and priority ────────────────────────────────────────────────────────────────

/**
 * Assigns a person and/or a station to a batch of work orders: all or nothing. The rows are
 * locked in id order; an unknown id, an unusable assignee or station → 422 naming which; a stale
 * version (when given) → 409 with the batch as it is now.
 */
export async function assignWorkOrders(db: Db, actor: SessionUser, input: AssignWorkOrdersRequest): Promise<WorkOrderSummary[]> {
  await db.transaction((tx) => applyAssignment(tx, actor, input));
  const list = await summaries(db, actor, { ids: input.ids });
  const order = new Map(input.ids.map((i, k) => [i, k]));
  return list.map((x) => x.summary).sort((a, b) => order.get(a.id)! - order.get(b.id)!);
}

/** The assignment itself, inside the caller's transaction (the route's, or the demo seed's). */
export async function applyAssignment(tx: Tx, actor: SessionUser, input: AssignWorkOrdersRequest) {
  const rows = await woRepo.lockWorkOrders(tx, input.ids);
  const found = new Map(rows.map((r) => [r.id, r]));
  const unknown = input.ids.filter((i) => !found.has(i));
  if (unknown.length) throw ruleBroken(`No work order with id ${unknown.join(', ')}; nothing was assigned`, { ids: `Unknown: ${unknown.join(', ')}` });
  if (input.versions) {
    const staleIds = input.ids.filter((i, k) => found.get(i)!.version !== input.versions![k]);
    if (staleIds.length) {
      const current = (await summaries(tx, actor, { ids: input.ids })).map((x) => x.summary);
      throw conflict(`Someone changed ${staleIds.length === 1 ? 'a work order' : `${staleIds.length} work orders`} since you opened the board; nothing was assigned`, { current });
    }
  }
  const shipped = rows.filter((r) => r.stage === 'shipped');
  if (shipped.length) throw ruleBroken(`${shipped.map((r) => r.number).join(', ')} shipped already; nothing was assigned`, { ids: `Shipped: ${shipped.map((r) => r.number).join(', ')}` });

  let person: { id: number; name: string } | null = null;
  if (input.assigneeId != null) {
    const u = await repo.findUser(tx, input.assigneeId);
    if (!u) throw ruleBroken('No such person', { assigneeId: 'No such person' });
    if (u.role !== 'floor') throw ruleBroken(`${u.name} is not floor staff`, { assigneeId: `${u.name} is not floor staff` });
    if (!u.active) throw ruleBroken(`${u.name} is not active`, { assigneeId: `${u.name} is not active` });
    person = { id: u.id, name: u.name };
  }
  const station = input.stationId != null ? await usableStation(tx, input.stationId) : null;
  if (station) await checkStationWire(tx, station, input.ids);

  const set: { assigneeId?: number | null; stationId?: number | null } = {};
  if (input.assigneeId !== undefined) set.assigneeId = person?.id ?? null;
  if (input.stationId !== undefined) set.stationId = station?.id ?? null;
  const parts: string[] = [];
  if (input.assigneeId !== undefined) parts.push(person ? `assigned to ${person.name}` : 'unassigned');
  if (input.stationId !== undefined) parts.push(station ? `at station ${station.name}` : 'no station');
  const note = parts.join(' ');

  const updated = await woRepo.updateWorkOrders(tx, input.ids, set);
  await woRepo.insertEvents(
    tx,
    updated.map((w) => ({
      workOrderId: w.id,
      kind: 'assign' as const,
      userId: actor.id,
      fromStage: w.stage,
      toStage: w.stage,
      note: note.charAt(0).toUpperCase() + note.slice(1),
      stationId: w.stationId,
      assigneeId: w.assigneeId,
    })),
  );
  for (const w of updated) await notifyFloor(tx, change('assign', w));
  return updated;
}

/** The foreman's priority change; the same priority again changes nothing. */
export async function updateWorkOrder(db: Db, actor: SessionUser, id: number, input: UpdateWorkOrderRequest): Promise<WorkOrderDetail> {
  await db.transaction(async (tx) => {
    const [wo] = await woRepo.lockWorkOrders(tx, [id]);
    if (!wo) throw notFound('No such work order');
    if (wo.version !== input.version) throw await stale(tx, actor, id);
    if (wo.priority === input.priority) return;
    if (wo.stage === 'shipped') throw ruleBroken('A shipped work order keeps its priority', { priority: 'It has shipped' });
    const [w] = await woRepo.updateWorkOrders(tx, [id], { priority: input.priority });
    const label = (p: number) => PRIORITY_LABELS[p as Priority] ?? String(p);
    await woRepo.insertEvents(tx, [
      { workOrderId: id, kind: 'priority', userId: actor.id, fromStage: w.stage, toStage: w.stage, note: `Priority ${label(wo.priority)} → ${label(w.priority)}`, stationId: w.stationId },
    ]);
    await notifyFloor(tx, change('priority', w));
  });
  return getWorkOrder(db, actor, id);
}

// ── My work ────────────────────────────────────────────────────────────────────────────────

/** What is assigned to the signed-in user and not shipped: highest priority, then earliest due. */
export async function myWork(db: Db, viewer: SessionUser): Promise<MyWorkItem[]> {
  const list = await summaries(db, viewer, { assignee: viewer.id, excludeStages: ['shipped'] });
  return list
    .sort((a, b) => b.summary.priority - a.summary.priority || a.summary.dueDate.localeCompare(b.summary.dueDate) || a.summary.number.localeCompare(b.summary.number))
    .map(({ row, summary }) => ({ ...summary, buildSheet: sheetEssentials(row.sheet, row.line.tolerancePercent) }));
}

// ── Load ───────────────────────────────────────────────────────────────────────────────────

/**
 * Estimated hours per person and per station for open work due within the coming days, computed
 * from the database's groups (person, station, stage, held-from stage, day) — never by loading
 * every work order. The estimate is linear in a group's count, units and units × turns.
 */
export async function floorLoad(db: Db, _viewer: SessionUser, days: number, today = localDate()): Promise<FloorLoad> {
  const to = addDays(today, days - 1);
  const [groups, settings, floorUsers, allStations] = await Promise.all([
    repo.loadGroups(db, today, to, days),
    getFloorSettings(db),
    repo.activeFloorUsers(db),
    repo.listStations(db),
  ]);
  const dates = Array.from({ length: days }, (_, i) => addDays(today, i));
  const blank = (): FloorLoadRow => ({ workOrders: 0, windingHours: 0, otherHours: 0, hours: 0, byDay: dates.map((date) => ({ date, hours: 0 })) });
  const people = new Map<number, FloorLoadRow & { id: number; name: string }>(floorUsers.map((u) => [u.id, { id: u.id, name: u.name, ...blank() }]));
  const stationById = new Map(allStations.map((s) => [s.id, s]));
  const stationRows = new Map<number, FloorLoadRow & { id: number; name: string }>(
    allStations.filter((s) => s.active).map((s) => [s.id, { id: s.id, name: s.name, ...blank() }]),
  );
  const unassignedPeople = blank();
  const unassignedStations = blank();
  // Work assigned to someone no longer among the active floor staff still counts, under their name.
  const others = [...new Set(groups.map((g) => g.assigneeId).filter((id): id is number => id !== null && !people.has(id)))];
  for (const u of others.length ? await repo.usersByIds(db, others) : []) people.set(u.id, { id: u.id, name: u.name, ...blank() });

  const add = (row: FloorLoadRow, count: number, est: { windingHours: number; otherHours: number; hours: number }, day: number) => {
    row.workOrders += count;
    row.windingHours += est.windingHours;
    row.otherHours += est.otherHours;
    row.hours += est.hours;
    row.byDay[day].hours += est.hours;
  };
  for (const g of groups) {
    const st = g.stationId !== null ? stationById.get(g.stationId) : undefined;
    const est = estimateGroup(g, st ? { spindleRpm: st.spindleRpm, setupSeconds: st.setupSeconds } : null, settings);
    const person = g.assigneeId !== null ? people.get(g.assigneeId) : undefined;
    add(person ?? unassignedPeople, g.count, est, g.day);
    if (st) {
      if (!stationRows.has(st.id)) stationRows.set(st.id, { id: st.id, name: st.name, ...blank() });
      add(stationRows.get(st.id)!, g.count, est, g.day);
    } else add(unassignedStations, g.count, est, g.day);
  }
  const r2 = (x: number) => Math.round(x * 100) / 100;
  const tidy = <T extends FloorLoadRow>(row: T): T => ({
    ...row,
    windingHours: r2(row.windingHours),
    otherHours: r2(row.otherHours),
    hours: r2(row.hours),
    byDay: row.byDay.map((d) => ({ date: d.date, hours: r2(d.hours) })),
  });
  return {
    from: today,
    to,
    days,
    capacityHours: r2(workingDays(today, to) * settings.shiftHoursPerDay),
    people: [...people.values()].map(tidy).sort((a, b) => a.name.localeCompare(b.name)),
    stations: [...stationRows.values()].map(tidy).sort((a, b) => a.name.localeCompare(b.name)),
    unassignedPeople: tidy(unassignedPeople),
    unassignedStations: tidy(unassignedStations),
    settings,
  };
}
