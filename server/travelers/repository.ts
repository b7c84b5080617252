import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Db, Tx } from '../db/client';
import { buildSheets, customers, orderLines, orders, spoolReservations, spools, travelers, users, workOrders } from '../db/schema';

const approver = alias(users, 'approver');

/** Everything a traveler prints about one work order, in one read. */
export async function loadTravelerSource(db: Db | Tx, workOrderId: number) {
  const [row] = await db
    .select({
      workOrder: workOrders,
      order: { id: orders.id, number: orders.number, purchaseOrder: orders.purchaseOrder },
      customerName: customers.name,
      line: orderLines,
      sheet: buildSheets,
      approvedByName: approver.name,
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .leftJoin(approver, eq(approver.id, buildSheets.approvedBy))
    .where(eq(workOrders.id, workOrderId));
  if (!row) return null;
  const lots = await db
    .select({ lot: spools.lot, supplier: spools.supplier, mass: spoolReservations.mass })
    .from(spoolReservations)
    .innerJoin(spools, eq(spools.id, spoolReservations.spoolId))
    .where(eq(spoolReservations.workOrderId, workOrderId))
    .orderBy(asc(spools.receivedAt));
  return { ...row, lots };
}

export function findTraveler(db: Db | Tx, workOrderId: number, buildSheetId: number) {
  return db.query.travelers.findFirst({ where: and(eq(travelers.workOrderId, workOrderId), eq(travelers.buildSheetId, buildSheetId)) });
}

export function latestTraveler(db: Db | Tx, workOrderId: number) {
  return db.query.travelers.findFirst({ where: eq(travelers.workOrderId, workOrderId), orderBy: desc(travelers.createdAt) });
}

/** Records a stored traveler; a second one for the same work order and sheet is not added. */
export async function insertTraveler(db: Db | Tx, values: typeof travelers.$inferInsert) {
  const [row] = await db.insert(travelers).values(values).onConflictDoNothing().returning();
  return row ?? (await findTraveler(db, values.workOrderId, values.buildSheetId))!;
}

export function workOrdersByIds(db: Db | Tx, ids: number[]) {
  return db
    .select({ id: workOrders.id, number: workOrders.number, buildSheetId: workOrders.buildSheetId, orderId: workOrders.orderId })
    .from(workOrders)
    .where(inArray(workOrders.id, ids));
}

export function workOrdersOfOrder(db: Db | Tx, orderId: number) {
  return db.select({ id: workOrders.id }).from(workOrders).where(eq(workOrders.orderId, orderId)).orderBy(asc(workOrders.number));
}

export function userById(db: Db | Tx, id: number) {
  return db.query.users.findFirst({ where: eq(users.id, id) });
}
