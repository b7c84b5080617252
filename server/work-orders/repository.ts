import { and, asc, eq, gte, inArray, isNull, lt, lte, ne, notInArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { stageEntries } from '../floor/board-repository';
import { buildSheets, customers, orderLines, orders, stations, users, workOrderEvents, workOrders } from '../db/schema';

export type WorkOrderRow = typeof workOrders.$inferSelect;

export async function nextWorkOrderSequence(tx: Tx): Promise<number> {
  const r = await tx.execute<{ n: string }>(sql`select nextval('work_order_number_seq') as n`);
  return Number(r.rows[0].n);
}

export async function insertWorkOrder(tx: Tx, values: typeof workOrders.$inferInsert) {
  const [row] = await tx.insert(workOrders).values(values).returning();
  return row;
}

export async function insertEvents(tx: Tx, rows: (typeof workOrderEvents.$inferInsert)[]) {
  if (rows.length) await tx.insert(workOrderEvents).values(rows);
}

/** Work orders of a sheet still in one stage, locked. */
export function lockBySheetAndStage(tx: Tx, buildSheetId: number, stage: Stage) {
  return tx
    .select()
    .from(workOrders)
    .where(and(eq(workOrders.buildSheetId, buildSheetId), eq(workOrders.stage, stage)))
    .orderBy(asc(workOrders.id))
    .for('update');
}

/** Moves work orders to a stage, bumping their version (optimistic locking). */
export async function setStage(tx: Tx, ids: number[], stage: Stage) {
  if (!ids.length) return;
  await tx
    .update(workOrders)
    .set({ stage, version: sql`${workOrders.version} + 1`, updatedAt: new Date() })
    .where(inArray(workOrders.id, ids));
}

const assignee = alias(users, 'assignee');

export type WorkOrderFilter = {
  id?: number;
  ids?: number[];
  stages?: Stage[];
  excludeStages?: Stage[];
  orderId?: number;
  /** Work orders of any of these orders. */
  orderIds?: number[];
  lineId?: number;
  /** The customer-role scope. */
  customerId?: number;
  /** The board's customer filter (applies on top of the scope). */
  customer?: number;
  assignee?: number | 'none';
  station?: number | 'none';
  dueFrom?: string;
  dueTo?: string;
  /** Exact work-order number (upper case). */
  number?: string;
  /** Due before this date (YYYY-MM-DD) and not shipped = late; false = the others. */
  late?: { today: string; value: boolean };
};

/**
 * Work orders with their order, customer, line, sheet and assignee; oldest due first. Each with
 * when it entered its stage and, while on hold, the stage and reason of the hold (its last release
 * or move event), read for all the rows in one batched look-up, not a subquery per row.
 */
export async function listWorkOrders(db: Db | Tx, f: WorkOrderFilter) {
  const rows = await workOrderRows(db, f);
  const entries = await stageEntries(db, rows.map((r) => r.wo.id));
  return rows.map((r) => {
    const e = entries.get(r.wo.id);
    return { ...r, enteredStageAt: e?.at ?? null, lastFrom: e?.fromStage ?? null, lastNote: e?.note ?? null };
  });
}

function workOrderRows(db: Db | Tx, f: WorkOrderFilter) {
  return db
    .select({
      wo: workOrders,
      order: { id: orders.id, number: orders.number, purchaseOrder: orders.purchaseOrder, customerId: orders.customerId },
      customerName: customers.name,
      line: { id: orderLines.id, lineNo: orderLines.lineNo, title: orderLines.title, tolerancePercent: orderLines.tolerancePercent },
      assigneeName: assignee.name,
      station: { id: stations.id, name: stations.name, spindleRpm: stations.spindleRpm, setupSeconds: stations.setupSeconds },
      sheet: buildSheets,
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .leftJoin(assignee, eq(assignee.id, workOrders.assigneeId))
    .leftJoin(stations, eq(stations.id, workOrders.stationId))
    .where(
      and(
        f.id !== undefined ? eq(workOrders.id, f.id) : undefined,
        f.ids !== undefined ? inArray(workOrders.id, f.ids.length ? f.ids : [-1]) : undefined,
        f.stages?.length ? inArray(workOrders.stage, f.stages) : undefined,
        f.excludeStages?.length ? notInArray(workOrders.stage, f.excludeStages) : undefined,
        f.customer !== undefined ? eq(orders.customerId, f.customer) : undefined,
        f.assignee === 'none' ? isNull(workOrders.assigneeId) : f.assignee !== undefined ? eq(workOrders.assigneeId, f.assignee) : undefined,
        f.station === 'none' ? isNull(workOrders.stationId) : f.station !== undefined ? eq(workOrders.stationId, f.station) : undefined,
        f.dueFrom !== undefined ? gte(workOrders.dueDate, f.dueFrom) : undefined,
        f.dueTo !== undefined ? lte(workOrders.dueDate, f.dueTo) : undefined,
        f.number !== undefined ? eq(workOrders.number, f.number) : undefined,
        f.late?.value === true ? and(lt(workOrders.dueDate, f.late.today), ne(workOrders.stage, 'shipped')) : undefined,
        f.late?.value === false ? sql`not (${workOrders.dueDate} < ${f.late.today} and ${workOrders.stage} <> 'shipped')` : undefined,
        f.orderId !== undefined ? eq(workOrders.orderId, f.orderId) : undefined,
        f.orderIds !== undefined ? inArray(workOrders.orderId, f.orderIds.length ? f.orderIds : [-1]) : undefined,
        f.lineId !== undefined ? eq(workOrders.lineId, f.lineId) : undefined,
        f.customerId !== undefined ? eq(orders.customerId, f.customerId) : undefined,
      ),
    )
    .orderBy(asc(workOrders.dueDate), sql`${workOrders.priority} desc`, asc(workOrders.number));
}

const eventAssignee = alias(users, 'event_assignee');

export function listEvents(db: Db | Tx, workOrderId: number) {
  return db
    .select({ event: workOrderEvents, userName: users.name, stationName: stations.name, assigneeName: eventAssignee.name })
    .from(workOrderEvents)
    .leftJoin(users, eq(users.id, workOrderEvents.userId))
    .leftJoin(stations, eq(stations.id, workOrderEvents.stationId))
    .leftJoin(eventAssignee, eq(eventAssignee.id, workOrderEvents.assigneeId))
    .where(eq(workOrderEvents.workOrderId, workOrderId))
    .orderBy(asc(workOrderEvents.at), asc(workOrderEvents.id));
}

/** Locks work orders for a change (in id order, so two batches never deadlock). */
export function lockWorkOrders(tx: Tx, ids: number[]) {
  return tx.select().from(workOrders).where(inArray(workOrders.id, ids)).orderBy(asc(workOrders.id)).for('update');
}

/** Changes work orders and bumps their version (optimistic locking). */
export async function updateWorkOrders(tx: Tx, ids: number[], set: Partial<Pick<WorkOrderRow, 'stage' | 'assigneeId' | 'stationId' | 'priority'>>) {
  if (!ids.length) return [];
  return tx
    .update(workOrders)
    .set({ ...set, version: sql`${workOrders.version} + 1`, updatedAt: new Date() })
    .where(inArray(workOrders.id, ids))
    .returning();
}

/** While on hold: the stage the hold was taken in (the last move event's from-stage). */
export async function heldFrom(tx: Db | Tx, workOrderId: number): Promise<Stage | null> {
  const [row] = await tx
    .select({ fromStage: workOrderEvents.fromStage })
    .from(workOrderEvents)
    .where(and(eq(workOrderEvents.workOrderId, workOrderId), inArray(workOrderEvents.kind, ['release', 'move'])))
    .orderBy(sql`${workOrderEvents.at} desc, ${workOrderEvents.id} desc`)
    .limit(1);
  return row?.fromStage ?? null;
}
