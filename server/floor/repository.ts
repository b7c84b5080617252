import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { spoolsOfWire, type WireKey } from '../stock/repository';
import { run } from './board-repository';
import { buildSheets, spools, stations, users, workOrders } from '../db/schema';

export type StationRow = typeof stations.$inferSelect;

export function listStations(db: Db | Tx, f: { active?: boolean } = {}) {
  return db
    .select()
    .from(stations)
    .where(f.active !== undefined ? eq(stations.active, f.active) : undefined)
    .orderBy(asc(stations.name));
}

export async function findStation(db: Db | Tx, id: number) {
  const [row] = await db.select().from(stations).where(eq(stations.id, id));
  return row;
}

export async function lockStation(tx: Tx, id: number) {
  const [row] = await tx.select().from(stations).where(eq(stations.id, id)).for('update');
  return row;
}

export async function insertStation(db: Db | Tx, values: typeof stations.$inferInsert) {
  const [row] = await db.insert(stations).values(values).returning();
  return row;
}

export async function updateStation(db: Db | Tx, id: number, set: Partial<typeof stations.$inferInsert>) {
  const [row] = await db
    .update(stations)
    .set({ ...set, updatedAt: new Date() })
    .where(eq(stations.id, id))
    .returning();
  return row;
}

export async function findUser(db: Db | Tx, id: number) {
  const [row] = await db.select({ id: users.id, name: users.name, role: users.role, active: users.active }).from(users).where(eq(users.id, id));
  return row;
}

export function usersByIds(db: Db | Tx, ids: number[]) {
  return db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids.length ? ids : [-1]));
}

export function activeFloorUsers(db: Db | Tx) {
  return db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(and(eq(users.role, 'floor'), eq(users.active, true)))
    .orderBy(asc(users.name));
}

/** Is there a spool with this lot (any case) in stock? */
export async function spoolLotExists(db: Db | Tx, lot: string) {
  const [row] = await db.select({ id: spools.id }).from(spools).where(sql`lower(${spools.lot}) = ${lot.toLowerCase()}`).limit(1);
  return !!row;
}

/** Each work order's wire: the bare diameter (m) its released build sheet winds with. */
export function wireOfWorkOrders(db: Db | Tx, ids: number[]) {
  return db
    .select({
      id: workOrders.id,
      number: workOrders.number,
      bareDiameter: sql<number | null>`(${buildSheets.result} -> 'wire' ->> 'bareDiameter')::float8`,
    })
    .from(workOrders)
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .where(inArray(workOrders.id, ids.length ? ids : [-1]));
}

/** The wire a work order's build sheet winds: conductor, size and insulation grade (a stock key). */
export async function wireKeyOfWorkOrder(db: Db | Tx, id: number): Promise<WireKey | null> {
  const [row] = await db
    .select({ spec: buildSheets.spec })
    .from(workOrders)
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .where(eq(workOrders.id, id));
  return row ? { conductor: row.spec.conductor, wire: row.spec.wire, insulationGrade: row.spec.insulationGrade } : null;
}

/** The oldest lot in stock of the wire a work order winds (a fallback when nothing was reserved for it). */
export async function oldestLotOfWorkOrderWire(db: Db | Tx, id: number): Promise<string | null> {
  const key = await wireKeyOfWorkOrder(db, id);
  if (!key) return null;
  const [first] = await spoolsOfWire(db, key);
  return first?.spool.lot ?? null;
}

export type LoadGroup = {
  assigneeId: number | null;
  stationId: number | null;
  stage: Stage;
  heldFrom: Stage | null;
  /** Index of the window's day it counts on (by due date; overdue work on day 0). */
  day: number;
  count: number;
  quantity: number;
  quantityTurns: number;
};

/**
 * Open work (not shipped, not in engineering) due on or before `to`, grouped by person, station,
 * stage, held-from stage and day of the window, with count, units and units × turns. The held-from
 * stage comes from the last release or move event of the on-hold work orders only; each build
 * sheet's turns are read once per group.
 */
export function loadGroupsQuery(today: string, to: string, days: number) {
  return sql`with held as (
      select distinct on (e.work_order_id) e.work_order_id, e.from_stage
      from work_order_events e join work_orders hw on hw.id = e.work_order_id and hw.stage = 'on_hold'
      where e.kind in ('release', 'move')
      order by e.work_order_id, e.at desc, e.id desc
    ),
    g as (
      select w.assignee_id, w.station_id, w.stage, h.from_stage as held_from,
             greatest(0, least(${days - 1}::int, w.due_date - ${today}::date)) as day,
             w.build_sheet_id, count(*)::int as n, sum(w.quantity)::int as q
      from work_orders w left join held h on h.work_order_id = w.id
      where w.stage not in ('shipped', 'engineering') and w.due_date <= ${to}::date
      group by 1, 2, 3, 4, 5, 6
    )
    select g.assignee_id as "assigneeId", g.station_id as "stationId", g.stage, g.held_from as "heldFrom", g.day::int as day,
           sum(g.n)::int as count, sum(g.q)::int as quantity, sum(g.q * (bs.result ->> 'turns')::float8)::float8 as "quantityTurns"
    from g join build_sheets bs on bs.id = g.build_sheet_id
    group by 1, 2, 3, 4, 5`;
}

export async function loadGroups(db: Db | Tx, today: string, to: string, days: number): Promise<LoadGroup[]> {
  return run<LoadGroup>(db, loadGroupsQuery(today, to, days));
}
