import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { buildSheets, customers, orderLines, orders, users, workOrderEvents, workOrders } from '../db/schema';

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

export type WorkOrderFilter = { id?: number; stages?: Stage[]; orderId?: number; lineId?: number; customerId?: number };

/** Work orders with their order, customer, line, sheet and assignee; oldest due first. */
export function listWorkOrders(db: Db | Tx, f: WorkOrderFilter) {
  return db
    .select({
      wo: workOrders,
      order: { id: orders.id, number: orders.number, purchaseOrder: orders.purchaseOrder, customerId: orders.customerId },
      customerName: customers.name,
      line: { id: orderLines.id, lineNo: orderLines.lineNo, title: orderLines.title, tolerancePercent: orderLines.tolerancePercent },
      assigneeName: assignee.name,
      sheet: buildSheets,
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .leftJoin(assignee, eq(assignee.id, workOrders.assigneeId))
    .where(
      and(
        f.id !== undefined ? eq(workOrders.id, f.id) : undefined,
        f.stages?.length ? inArray(workOrders.stage, f.stages) : undefined,
        f.orderId !== undefined ? eq(workOrders.orderId, f.orderId) : undefined,
        f.lineId !== undefined ? eq(workOrders.lineId, f.lineId) : undefined,
        f.customerId !== undefined ? eq(orders.customerId, f.customerId) : undefined,
      ),
    )
    .orderBy(asc(workOrders.dueDate), sql`${workOrders.priority} desc`, asc(workOrders.number));
}

export function listEvents(db: Db | Tx, workOrderId: number) {
  return db
    .select({ event: workOrderEvents, userName: users.name })
    .from(workOrderEvents)
    .leftJoin(users, eq(users.id, workOrderEvents.userId))
    .where(eq(workOrderEvents.workOrderId, workOrderId))
    .orderBy(asc(workOrderEvents.at), asc(workOrderEvents.id));
}
