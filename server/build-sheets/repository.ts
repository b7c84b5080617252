import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { buildSheets, customers, orderLines, orders } from '../db/schema';

export type SheetRow = typeof buildSheets.$inferSelect;
export type NewSheet = typeof buildSheets.$inferInsert;

/** A line with its order and customer. */
export async function findLine(db: Db | Tx, lineId: number) {
  const [row] = await db
    .select({ line: orderLines, order: orders, customerName: customers.name })
    .from(orderLines)
    .innerJoin(orders, eq(orders.id, orderLines.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .where(eq(orderLines.id, lineId));
  return row;
}

/** The line row locked for the rest of the transaction: drafts of one line queue for their version number. */
export async function lockLine(tx: Tx, lineId: number) {
  const [row] = await tx.select().from(orderLines).where(eq(orderLines.id, lineId)).for('update');
  return row;
}

export async function nextVersion(tx: Tx, lineId: number): Promise<number> {
  const [r] = await tx
    .select({ n: sql<number>`coalesce(max(${buildSheets.version}), 0)::int + 1` })
    .from(buildSheets)
    .where(eq(buildSheets.lineId, lineId));
  return r.n;
}

export async function insertSheet(tx: Tx, values: NewSheet) {
  const [row] = await tx.insert(buildSheets).values(values).returning();
  return row;
}

export async function findSheet(db: Db | Tx, id: number) {
  const [row] = await db.select().from(buildSheets).where(eq(buildSheets.id, id));
  return row as SheetRow | undefined;
}

/** One version of a line's sheet. */
export async function findVersion(db: Db | Tx, lineId: number, version: number) {
  const [row] = await db.select().from(buildSheets).where(and(eq(buildSheets.lineId, lineId), eq(buildSheets.version, version)));
  return row as SheetRow | undefined;
}

/** The sheet row locked for the rest of the transaction: approvals and releases of one sheet queue. */
export async function lockSheet(tx: Tx, id: number) {
  const [row] = await tx.select().from(buildSheets).where(eq(buildSheets.id, id)).for('update');
  return row as SheetRow | undefined;
}

export async function updateSheet(tx: Tx, id: number, values: Partial<NewSheet>) {
  await tx.update(buildSheets).set(values).where(eq(buildSheets.id, id));
}

/** Every version of a line, newest first. */
export function listForLine(db: Db | Tx, lineId: number) {
  return db.select().from(buildSheets).where(eq(buildSheets.lineId, lineId)).orderBy(desc(buildSheets.version));
}

/** The released sheet of a line, locked (other than `exceptId`). */
export async function lockReleased(tx: Tx, lineId: number, exceptId: number) {
  const [row] = await tx
    .select()
    .from(buildSheets)
    .where(and(eq(buildSheets.lineId, lineId), eq(buildSheets.status, 'released'), sql`${buildSheets.id} <> ${exceptId}`))
    .for('update');
  return row as SheetRow | undefined;
}

/** Has the line ever been released (a released or superseded sheet)? */
export async function everReleased(db: Db | Tx, lineId: number, exceptId: number) {
  const [r] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(buildSheets)
    .where(and(eq(buildSheets.lineId, lineId), sql`${buildSheets.status} in ('released', 'superseded')`, sql`${buildSheets.id} <> ${exceptId}`));
  return r.n > 0;
}

/** Lines with no released sheet whose order is neither cancelled nor closed, oldest due first. */
export function engineeringQueue(db: Db | Tx) {
  const latest = sql`(select b.id from ${buildSheets} b where b.line_id = "order_lines"."id" order by b.version desc limit 1)`;
  return db
    .select({
      line: { id: orderLines.id, lineNo: orderLines.lineNo, title: orderLines.title, quantity: orderLines.quantity },
      order: { id: orders.id, number: orders.number, status: orders.status, purchaseOrder: orders.purchaseOrder, dueDate: orders.dueDate },
      customer: { id: customers.id, name: customers.name },
      late: sql<boolean>`(${orders.dueDate} < current_date)`,
      latest: { id: buildSheets.id, version: buildSheets.version, status: buildSheets.status },
    })
    .from(orderLines)
    .innerJoin(orders, eq(orders.id, orderLines.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .leftJoin(buildSheets, sql`${buildSheets.id} = ${latest}`)
    .where(
      and(
        sql`${orders.status} not in ('cancelled', 'closed')`,
        sql`not exists (select 1 from ${buildSheets} r where r.line_id = "order_lines"."id" and r.status = 'released')`,
      ),
    )
    .orderBy(asc(orders.dueDate), asc(orders.id), asc(orderLines.lineNo));
}
