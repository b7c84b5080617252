import { and, asc, desc, eq, gte, inArray, lte, sql, type SQL } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import {
  buildSheets,
  customers,
  instruments,
  notifications,
  orderLines,
  orders,
  shipmentDocuments,
  shipmentItems,
  shipments,
  spoolReservations,
  spools,
  testRecords,
  users,
  workOrderEvents,
  workOrders,
} from '../db/schema';

export type ShipmentRow = typeof shipments.$inferSelect;
export type ShipmentItemRow = typeof shipmentItems.$inferSelect;
export type ShipmentDocumentRow = typeof shipmentDocuments.$inferSelect;

export async function nextShipmentSequence(tx: Tx): Promise<number> {
  const r = await tx.execute<{ n: string }>(sql`select nextval('shipment_number_seq') as n`);
  return Number(r.rows[0].n);
}

/** Work orders with their order, customer and line (what shipping reads about each). */
export function workOrdersWithOrder(db: Db | Tx, f: { ids?: number[]; stage?: 'packing'; customerId?: number }) {
  return db
    .select({
      wo: workOrders,
      order: { id: orders.id, number: orders.number, purchaseOrder: orders.purchaseOrder, dueDate: orders.dueDate, status: orders.status, customerId: orders.customerId },
      customer: { id: customers.id, name: customers.name, billingAddress: customers.billingAddress, shippingAddress: customers.shippingAddress },
      line: { id: orderLines.id, lineNo: orderLines.lineNo, title: orderLines.title, customerPartNumber: orderLines.customerPartNumber, quantity: orderLines.quantity },
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(customers, eq(customers.id, orders.customerId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .where(
      and(
        f.ids !== undefined ? inArray(workOrders.id, f.ids.length ? f.ids : [-1]) : undefined,
        f.stage !== undefined ? eq(workOrders.stage, f.stage) : undefined,
        f.customerId !== undefined ? eq(orders.customerId, f.customerId) : undefined,
      ),
    )
    .orderBy(asc(customers.name), asc(orders.dueDate), asc(orders.id), asc(orderLines.lineNo), asc(workOrders.number));
}

/** Serials shipped so far, per work order. */
export async function shippedSerials(db: Db | Tx, workOrderIds: number[]): Promise<Map<number, Set<string>>> {
  const out = new Map<number, Set<string>>();
  if (!workOrderIds.length) return out;
  const rows = await db
    .select({ workOrderId: shipmentItems.workOrderId, serials: shipmentItems.serials })
    .from(shipmentItems)
    .where(inArray(shipmentItems.workOrderId, workOrderIds));
  for (const r of rows) {
    const set = out.get(r.workOrderId) ?? new Set<string>();
    for (const s of r.serials) set.add(s);
    out.set(r.workOrderId, set);
  }
  return out;
}

/**
 * The inspection signature of each work order: its latest move out of inspection into packing
 * (making that move is the inspector's signature; the floor's packing gate requires it).
 */
export async function inspectionSignatures(db: Db | Tx, workOrderIds: number[]) {
  if (!workOrderIds.length) return new Map<number, { userId: number | null; name: string | null; at: Date }>();
  const rows = await db
    .selectDistinctOn([workOrderEvents.workOrderId], { workOrderId: workOrderEvents.workOrderId, userId: workOrderEvents.userId, name: users.name, at: workOrderEvents.at })
    .from(workOrderEvents)
    .leftJoin(users, eq(users.id, workOrderEvents.userId))
    .where(
      and(
        inArray(workOrderEvents.workOrderId, workOrderIds),
        eq(workOrderEvents.kind, 'move'),
        eq(workOrderEvents.fromStage, 'inspection'),
        eq(workOrderEvents.toStage, 'packing'),
      ),
    )
    .orderBy(workOrderEvents.workOrderId, desc(workOrderEvents.at), desc(workOrderEvents.id));
  return new Map(rows.map((r) => [r.workOrderId, { userId: r.userId, name: r.name, at: r.at }]));
}

/** Units shipped per order line (every shipment so far). */
export async function shippedByLine(db: Db | Tx, lineIds: number[]): Promise<Map<number, number>> {
  if (!lineIds.length) return new Map();
  const rows = await db
    .select({ lineId: workOrders.lineId, n: sql<number>`coalesce(sum(${shipmentItems.quantity}), 0)::int` })
    .from(shipmentItems)
    .innerJoin(workOrders, eq(workOrders.id, shipmentItems.workOrderId))
    .where(inArray(workOrders.lineId, lineIds))
    .groupBy(workOrders.lineId);
  return new Map(rows.map((r) => [r.lineId, Number(r.n)]));
}

export async function insertShipment(tx: Tx, values: typeof shipments.$inferInsert) {
  const [row] = await tx.insert(shipments).values(values).returning();
  return row;
}
export async function insertItems(tx: Tx, rows: (typeof shipmentItems.$inferInsert)[]) {
  if (rows.length) await tx.insert(shipmentItems).values(rows);
}
export async function setNotification(tx: Tx, id: number, notificationId: number) {
  await tx.update(shipments).set({ notificationId }).where(eq(shipments.id, id));
}

export type ShipmentFilter = { id?: number; ids?: number[]; customerId?: number; from?: string; to?: string; q?: string };

/** Shipments with the customer's name and the creator's name, newest first. */
export function listShipments(db: Db | Tx, f: ShipmentFilter) {
  const where: (SQL | undefined)[] = [
    f.id !== undefined ? eq(shipments.id, f.id) : undefined,
    f.ids !== undefined ? inArray(shipments.id, f.ids.length ? f.ids : [-1]) : undefined,
    f.customerId !== undefined ? eq(shipments.customerId, f.customerId) : undefined,
    f.from ? gte(shipments.shipDate, f.from) : undefined,
    f.to ? lte(shipments.shipDate, f.to) : undefined,
  ];
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(sql`(${shipments.number} ilike ${like} or ${shipments.trackingNumber} ilike ${like} or exists (
      select 1 from shipment_items i join work_orders w on w.id = i.work_order_id join orders o on o.id = w.order_id
       where i.shipment_id = ${shipments.id} and (o.number ilike ${like} or o.purchase_order ilike ${like})))`);
  }
  return db
    .select({ shipment: shipments, customerName: customers.name, createdByName: users.name })
    .from(shipments)
    .innerJoin(customers, eq(customers.id, shipments.customerId))
    .leftJoin(users, eq(users.id, shipments.createdBy))
    .where(and(...where))
    .orderBy(desc(shipments.shipDate), desc(shipments.id));
}

/** The items of shipments with their work order, order and line. */
export function itemsOf(db: Db | Tx, shipmentIds: number[]) {
  return db
    .select({
      item: shipmentItems,
      wo: { id: workOrders.id, number: workOrders.number, buildSheetId: workOrders.buildSheetId, quantity: workOrders.quantity },
      order: { id: orders.id, number: orders.number, purchaseOrder: orders.purchaseOrder, dueDate: orders.dueDate },
      line: { id: orderLines.id, lineNo: orderLines.lineNo, title: orderLines.title, customerPartNumber: orderLines.customerPartNumber, quantity: orderLines.quantity },
    })
    .from(shipmentItems)
    .innerJoin(workOrders, eq(workOrders.id, shipmentItems.workOrderId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .where(inArray(shipmentItems.shipmentId, shipmentIds.length ? shipmentIds : [-1]))
    .orderBy(asc(orders.number), asc(orderLines.lineNo), asc(workOrders.number));
}

export function documentsOf(db: Db | Tx, shipmentIds: number[]) {
  return db.select().from(shipmentDocuments).where(inArray(shipmentDocuments.shipmentId, shipmentIds.length ? shipmentIds : [-1]));
}

export async function findDocument(db: Db | Tx, shipmentId: number, kind: ShipmentDocumentRow['kind']) {
  const [row] = await db.select().from(shipmentDocuments).where(and(eq(shipmentDocuments.shipmentId, shipmentId), eq(shipmentDocuments.kind, kind)));
  return row;
}

/** Records a drawn document; drawing it again replaces the row (one per shipment and kind). */
export async function upsertDocument(tx: Tx, values: typeof shipmentDocuments.$inferInsert) {
  const [row] = await tx
    .insert(shipmentDocuments)
    .values(values)
    .onConflictDoUpdate({
      target: [shipmentDocuments.shipmentId, shipmentDocuments.kind],
      set: { storageKey: values.storageKey, sha256: values.sha256, size: values.size, pages: values.pages, createdAt: new Date() },
    })
    .returning();
  return row;
}

/** The shipment row locked: drawing its documents queues behind another drawing of them. */
export async function lockShipment(tx: Tx, id: number) {
  const [row] = await tx.select().from(shipments).where(eq(shipments.id, id)).for('update');
  return row;
}

export function notificationsByIds(db: Db | Tx, ids: number[]) {
  return db
    .select({ id: notifications.id, status: notifications.status, recipients: notifications.recipients, sentAt: notifications.sentAt })
    .from(notifications)
    .where(inArray(notifications.id, ids.length ? ids : [-1]));
}

/** Test records of work orders, oldest first (the certificate picks each serial's latest). */
export function testRecordsOf(db: Db | Tx, workOrderIds: number[]) {
  return db
    .select()
    .from(testRecords)
    .where(inArray(testRecords.workOrderId, workOrderIds.length ? workOrderIds : [-1]))
    .orderBy(asc(testRecords.id));
}

export const instrumentsByIds = (db: Db | Tx, ids: number[]) =>
  db.select().from(instruments).where(inArray(instruments.id, ids.length ? ids : [-1])).orderBy(asc(instruments.name));

/** Build sheets with who approved and released them. */
export async function sheetsWithPeople(db: Db | Tx, ids: number[]) {
  const rows = await db.select().from(buildSheets).where(inArray(buildSheets.id, ids.length ? ids : [-1]));
  const people = await namesOf(db, rows.flatMap((r) => [r.approvedBy, r.releasedBy]));
  return rows.map((s) => ({ sheet: s, approvedByName: s.approvedBy ? (people.get(s.approvedBy) ?? null) : null, releasedByName: s.releasedBy ? (people.get(s.releasedBy) ?? null) : null }));
}

export async function namesOf(db: Db | Tx, ids: (number | null)[]) {
  const wanted = [...new Set(ids.filter((x): x is number => x !== null))];
  if (!wanted.length) return new Map<number, string>();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}

/** Wire lots of work orders: spools reserved at release and the lots recorded when winding finished. */
export async function wireLotsOf(db: Db | Tx, workOrderIds: number[]) {
  const ids = workOrderIds.length ? workOrderIds : [-1];
  const reserved = await db
    .select({ workOrderId: spoolReservations.workOrderId, lot: spools.lot, supplier: spools.supplier })
    .from(spoolReservations)
    .innerJoin(spools, eq(spools.id, spoolReservations.spoolId))
    .where(inArray(spoolReservations.workOrderId, ids));
  // The lot recorded at winding, with its supplier from the spool(s) of that lot.
  const wound = await db
    .select({ workOrderId: workOrderEvents.workOrderId, lot: workOrderEvents.spoolLot, supplier: spools.supplier })
    .from(workOrderEvents)
    .leftJoin(spools, sql`lower(${spools.lot}) = lower(${workOrderEvents.spoolLot})`)
    .where(and(inArray(workOrderEvents.workOrderId, ids), sql`${workOrderEvents.spoolLot} is not null`));
  const out = new Map<number, { lot: string; supplier: string | null; wound: boolean }[]>();
  const add = (w: number, lot: string, supplier: string | null, woundFrom: boolean) => {
    const list = out.get(w) ?? [];
    const same = list.find((x) => x.lot.toLowerCase() === lot.toLowerCase());
    if (same) {
      same.wound ||= woundFrom;
      same.supplier ??= supplier;
    }
    else list.push({ lot, supplier, wound: woundFrom });
    out.set(w, list);
  };
  for (const r of wound) add(r.workOrderId, r.lot!, r.supplier, true);
  for (const r of reserved) add(r.workOrderId, r.lot, r.supplier, false);
  return out;
}

// ── The customer's view ────────────────────────────────────────────────────────────────────

export function linesOfOrders(db: Db | Tx, orderIds: number[]) {
  return db.select().from(orderLines).where(inArray(orderLines.orderId, orderIds.length ? orderIds : [-1])).orderBy(asc(orderLines.orderId), asc(orderLines.lineNo));
}

export function workOrdersOfOrders(db: Db | Tx, orderIds: number[]) {
  return db
    .select({ id: workOrders.id, orderId: workOrders.orderId, lineId: workOrders.lineId, stage: workOrders.stage, quantity: workOrders.quantity })
    .from(workOrders)
    .where(inArray(workOrders.orderId, orderIds.length ? orderIds : [-1]));
}

/** Units shipped per work order. */
export async function shippedByWorkOrder(db: Db | Tx, workOrderIds: number[]): Promise<Map<number, number>> {
  if (!workOrderIds.length) return new Map();
  const rows = await db
    .select({ id: shipmentItems.workOrderId, n: sql<number>`sum(${shipmentItems.quantity})::int` })
    .from(shipmentItems)
    .where(inArray(shipmentItems.workOrderId, workOrderIds))
    .groupBy(shipmentItems.workOrderId);
  return new Map(rows.map((r) => [r.id, Number(r.n)]));
}

/** Units scrapped at test per work order. */
export async function scrappedByWorkOrder(db: Db | Tx, workOrderIds: number[]): Promise<Map<number, number>> {
  if (!workOrderIds.length) return new Map();
  const r = await db.execute<{ id: number; n: number }>(sql`
    select n.work_order_id as id, count(*)::int as n from dispositions d join nonconformances n on n.id = d.nonconformance_id
     where d.action = 'scrap' and n.work_order_id in (${sql.join(workOrderIds.map((i) => sql`${i}`), sql`, `)}) group by n.work_order_id`);
  return new Map(r.rows.map((x) => [Number(x.id), Number(x.n)]));
}

/** Shipments carrying units of the given orders. */
export async function shipmentIdsOfOrders(db: Db | Tx, orderIds: number[]) {
  if (!orderIds.length) return new Map<number, number[]>();
  const rows = await db
    .selectDistinct({ orderId: workOrders.orderId, shipmentId: shipmentItems.shipmentId })
    .from(shipmentItems)
    .innerJoin(workOrders, eq(workOrders.id, shipmentItems.workOrderId))
    .where(inArray(workOrders.orderId, orderIds));
  const out = new Map<number, number[]>();
  for (const r of rows) out.set(r.orderId, [...(out.get(r.orderId) ?? []), r.shipmentId]);
  return out;
}
