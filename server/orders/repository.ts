import { and, asc, desc, eq, gte, inArray, lte, notInArray, sql, type SQL } from 'drizzle-orm';
import type { OrderStatus } from '../../src/contracts/orders';
import type { Db, Tx } from '../db/client';
import { customers, notifications, orderEvents, orderLines, orders, users } from '../db/schema';

export type OrderRow = typeof orders.$inferSelect;
export type LineRow = typeof orderLines.$inferSelect;
type NewLine = typeof orderLines.$inferInsert;
export type NewEvent = typeof orderEvents.$inferInsert;

/** Due date past and not finished with. Shared by the list, the filter and the detail. */
// Qualified by hand: inside a subquery drizzle's bare column name would bind to the inner table.
const ORDER_ID = sql.raw('"orders"."id"');

export const lateSql = sql<boolean>`(${orders.dueDate} < current_date and ${orders.status} not in ('shipped', 'closed', 'cancelled'))`;

export async function nextOrderSequence(tx: Tx): Promise<number> {
  const r = await tx.execute<{ n: string }>(sql`select nextval('order_number_seq') as n`);
  return Number(r.rows[0].n);
}

export async function insertOrder(tx: Tx, values: typeof orders.$inferInsert) {
  const [row] = await tx.insert(orders).values(values).returning();
  return row;
}

export async function updateOrder(tx: Tx, id: number, values: Partial<typeof orders.$inferInsert>) {
  await tx.update(orders).set({ ...values, updatedAt: new Date() }).where(eq(orders.id, id));
}

/** The order row locked for the rest of the transaction: changes to one order queue. */
export async function lockOrder(tx: Tx, id: number) {
  const [row] = await tx.select().from(orders).where(eq(orders.id, id)).for('update');
  return row as OrderRow | undefined;
}

/** Another order of the same customer with this purchase-order number (any case). */
export function findByPurchaseOrder(db: Db | Tx, customerId: number, purchaseOrder: string, exceptId?: number) {
  return db.query.orders.findFirst({
    where: and(
      eq(orders.customerId, customerId),
      sql`lower(${orders.purchaseOrder}) = ${purchaseOrder.toLowerCase()}`,
      exceptId ? sql`${orders.id} <> ${exceptId}` : undefined,
    ),
    columns: { id: true, number: true },
  });
}

export type OrderFilter = {
  statuses?: OrderStatus[];
  customerId?: number;
  dueFrom?: string;
  dueTo?: string;
  late?: boolean;
  q?: string;
  id?: number;
};

/** Order summaries with customer, line count, unit count and the late flag. */
export function listOrders(db: Db | Tx, f: OrderFilter) {
  const where: (SQL | undefined)[] = [
    f.id !== undefined ? eq(orders.id, f.id) : undefined,
    f.statuses?.length ? inArray(orders.status, f.statuses) : undefined,
    f.customerId !== undefined ? eq(orders.customerId, f.customerId) : undefined,
    f.dueFrom ? gte(orders.dueDate, f.dueFrom) : undefined,
    f.dueTo ? lte(orders.dueDate, f.dueTo) : undefined,
    f.late === true ? lateSql : f.late === false ? sql`not ${lateSql}` : undefined,
  ];
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(sql`(${orders.number} ilike ${like} or ${orders.purchaseOrder} ilike ${like} or ${customers.name} ilike ${like})`);
  }
  return db
    .select({
      order: orders,
      customerName: customers.name,
      lineCount: sql<number>`(select count(*)::int from ${orderLines} l where l.order_id = ${ORDER_ID})`,
      unitCount: sql<number>`(select coalesce(sum(l.quantity), 0)::int from ${orderLines} l where l.order_id = ${ORDER_ID})`,
      late: lateSql,
    })
    .from(orders)
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .where(and(...where))
    .orderBy(asc(orders.dueDate), asc(orders.id));
}

export function listLines(db: Db | Tx, orderId: number) {
  return db.select().from(orderLines).where(eq(orderLines.orderId, orderId)).orderBy(asc(orderLines.lineNo));
}

export async function insertLines(tx: Tx, rows: NewLine[]) {
  if (rows.length) await tx.insert(orderLines).values(rows);
}

export async function updateLine(tx: Tx, orderId: number, id: number, values: Partial<NewLine>) {
  await tx
    .update(orderLines)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(orderLines.id, id), eq(orderLines.orderId, orderId)));
}

export async function deleteLinesExcept(tx: Tx, orderId: number, keep: number[]) {
  await tx.delete(orderLines).where(and(eq(orderLines.orderId, orderId), keep.length ? notInArray(orderLines.id, keep) : undefined));
}

/** Moves the kept lines' numbers out of the way (negative) before they are numbered afresh. */
export async function parkLineNumbers(tx: Tx, orderId: number) {
  await tx.update(orderLines).set({ lineNo: sql`-${orderLines.lineNo}` }).where(eq(orderLines.orderId, orderId));
}

export async function insertEvent(tx: Tx, event: NewEvent) {
  await tx.insert(orderEvents).values(event);
}

export function listEvents(db: Db | Tx, orderId: number) {
  return db
    .select({ event: orderEvents, actorName: users.name })
    .from(orderEvents)
    .leftJoin(users, eq(users.id, orderEvents.actorId))
    .where(eq(orderEvents.orderId, orderId))
    .orderBy(desc(orderEvents.at), desc(orderEvents.id));
}

/** Names of users, by id (for "who" columns). */
export async function userNames(db: Db | Tx, ids: (number | null)[]) {
  const wanted = [...new Set(ids.filter((x): x is number => x !== null))];
  if (!wanted.length) return new Map<number, string>();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}

export async function insertNotification(tx: Tx, values: typeof notifications.$inferInsert) {
  const [row] = await tx.insert(notifications).values(values).returning();
  return row;
}
