import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { buildSheets, dispositions, instruments, nonconformances, orderLines, testRecords, users, workOrders } from '../db/schema';

export type InstrumentRow = typeof instruments.$inferSelect;
export type TestRecordRow = typeof testRecords.$inferSelect;
export type NonconformanceRow = typeof nonconformances.$inferSelect;
export type DispositionRow = typeof dispositions.$inferSelect;

export const listInstruments = (db: Db | Tx) => db.select().from(instruments).orderBy(asc(instruments.name), asc(instruments.id));
export const instrumentsByIds = (db: Db | Tx, ids: number[]) => db.select().from(instruments).where(inArray(instruments.id, ids.length ? ids : [-1]));

export async function insertInstrument(db: Db | Tx, values: typeof instruments.$inferInsert) {
  const [row] = await db.insert(instruments).values(values).returning();
  return row;
}
export async function updateInstrument(db: Db | Tx, id: number, set: Partial<typeof instruments.$inferInsert>) {
  const [row] = await db
    .update(instruments)
    .set({ ...set, updatedAt: new Date() })
    .where(eq(instruments.id, id))
    .returning();
  return row;
}

/** A work order (locked) with its sheet and line tolerance. */
export async function lockWorkOrderWithSheet(tx: Tx, id: number) {
  const [wo] = await tx.select().from(workOrders).where(eq(workOrders.id, id)).for('update');
  if (!wo) return undefined;
  const [sheet] = await tx.select().from(buildSheets).where(eq(buildSheets.id, wo.buildSheetId));
  const [line] = await tx.select({ tolerancePercent: orderLines.tolerancePercent, title: orderLines.title }).from(orderLines).where(eq(orderLines.id, wo.lineId));
  return { wo, sheet, line };
}

export async function findWorkOrder(db: Db | Tx, id: number) {
  const [wo] = await db.select().from(workOrders).where(eq(workOrders.id, id));
  return wo;
}

/** The latest record of a serial in a work order. */
export async function latestForSerial(db: Db | Tx, workOrderId: number, serial: string) {
  const [row] = await db
    .select()
    .from(testRecords)
    .where(and(eq(testRecords.workOrderId, workOrderId), eq(testRecords.serial, serial)))
    .orderBy(sql`${testRecords.id} desc`)
    .limit(1);
  return row;
}

export async function insertTestRecord(tx: Tx, values: typeof testRecords.$inferInsert) {
  const [row] = await tx.insert(testRecords).values(values).returning();
  return row;
}
export async function insertNonconformance(tx: Tx, values: typeof nonconformances.$inferInsert) {
  const [row] = await tx.insert(nonconformances).values(values).returning();
  return row;
}

export const recordsOf = (db: Db | Tx, workOrderIds: number[]) =>
  db
    .select({ r: testRecords, testerName: users.name })
    .from(testRecords)
    .leftJoin(users, eq(users.id, testRecords.testedBy))
    .where(inArray(testRecords.workOrderId, workOrderIds.length ? workOrderIds : [-1]))
    .orderBy(asc(testRecords.id));

export const nonconformancesOf = (db: Db | Tx, workOrderIds: number[]) =>
  db
    .select({ nc: nonconformances, d: dispositions })
    .from(nonconformances)
    .leftJoin(dispositions, eq(dispositions.nonconformanceId, nonconformances.id))
    .where(inArray(nonconformances.workOrderId, workOrderIds.length ? workOrderIds : [-1]))
    .orderBy(asc(nonconformances.id));

export async function lockNonconformance(tx: Tx, id: number) {
  const [nc] = await tx.select().from(nonconformances).where(eq(nonconformances.id, id)).for('update');
  if (!nc) return undefined;
  const [d] = await tx.select().from(dispositions).where(eq(dispositions.nonconformanceId, id));
  return { nc, d };
}

export async function insertDisposition(tx: Tx, values: typeof dispositions.$inferInsert) {
  const [row] = await tx.insert(dispositions).values(values).returning();
  return row;
}
export async function approveDisposition(tx: Tx, id: number, by: number, note: string | null) {
  await tx.update(dispositions).set({ approvedBy: by, approvedAt: new Date(), approvalNote: note }).where(eq(dispositions.id, id));
}
export async function setNonconformanceState(tx: Tx, id: number, state: NonconformanceRow['state']) {
  await tx.update(nonconformances).set({ state }).where(eq(nonconformances.id, id));
}

export const userNames = (db: Db | Tx, ids: number[]) => db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids.length ? ids : [-1]));

export const activeForemen = (db: Db | Tx) =>
  db
    .select({ name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.role, 'foreman'), eq(users.active, true)))
    .orderBy(asc(users.id));

/** Serials already used in a work order (first tests). */
export async function serialsOf(db: Db | Tx, workOrderId: number) {
  const rows = await db.selectDistinct({ serial: testRecords.serial }).from(testRecords).where(eq(testRecords.workOrderId, workOrderId));
  return rows.map((r) => r.serial);
}

/** Units scrapped at test, per order line of an order. */
export async function scrappedByLine(db: Db | Tx, orderId: number): Promise<Map<number, number>> {
  const rows = await db
    .select({ lineId: workOrders.lineId, n: sql<number>`count(*)::int` })
    .from(dispositions)
    .innerJoin(nonconformances, eq(nonconformances.id, dispositions.nonconformanceId))
    .innerJoin(workOrders, eq(workOrders.id, nonconformances.workOrderId))
    .where(and(eq(workOrders.orderId, orderId), eq(dispositions.action, 'scrap')))
    .groupBy(workOrders.lineId);
  return new Map(rows.map((r) => [r.lineId, Number(r.n)]));
}
