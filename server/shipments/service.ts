/**
 * Shipping: the ready-to-ship list, creating a shipment (the one way a work order reaches
 * `shipped`), and reading shipments. Creating one is ONE transaction: the work orders are locked
 * (in id order, like the floor's batch changes), checked, the shipment and its items written, the
 * fully shipped work orders moved to `shipped` with the floor's kind of event (versions bumped,
 * the live feed told), each order's status moved to partly_shipped or shipped with its audit row,
 * and the customer's shipment notice written to the outbox. Its documents are drawn on the queue
 * after the commit (documents.ts).
 *
 * THE SHIPPING RULE. A work order may ship when it is in packing, its unit-test gate is clear
 * (server/test-records/service.ts, unitTestStates), its inspection is signed (a move from
 * inspection into packing is in its history), and its order is not cancelled or closed. The
 * units that may leave are the serials whose latest test passed or whose failure was dispositioned
 * use-as-is with the engineer's approval, less those shipped before. A work order reaches
 * `shipped` once its shipped units reach its good quantity (quantity less scrapped units). An
 * order is `shipped` when every line's shipped units reach the line's quantity less its scrapped
 * units; otherwise, once anything has shipped, `partly_shipped`.
 */
import type { SessionUser } from '../../src/contracts/auth';
import { EMPTY_ADDRESS, type Address } from '../../src/contracts/customers';
import type { FloorChange } from '../../src/contracts/floor';
import { ORDER_STATUS_LABELS, type OrderStatus } from '../../src/contracts/orders';
import {
  SHIP_DATE_MAX_DAYS_AHEAD,
  SHIPMENT_DOCUMENT_KINDS,
  type CreateShipmentRequest,
  type ListShipmentsQuery,
  type ReadyToShip,
  type ReadyWorkOrder,
  type ShipmentRefusal,
  type ShipmentDocumentInfo,
  type ShipmentItem,
  type ShipmentRecord,
  type ShipmentSummary,
} from '../../src/contracts/shipments';
import { STAGE_LABELS } from '../../src/contracts/stages';
import * as customerRepo from '../customers/repository';
import type { Db, Tx } from '../db/client';
import { notifications } from '../db/schema';
import { addDays, localDate } from '../floor/estimate';
import { notifyFloor } from '../floor/feed';
import { HttpError, notFound, ruleBroken } from '../http/errors';
import * as orderRepo from '../orders/repository';
import { transitionOrder } from '../orders/service';
import { scrappedByLine } from '../test-records/repository';
import { unitStandings } from '../test-records/service';
import * as woRepo from '../work-orders/repository';
import type { Queues } from '../../jobs/queues';
import { queueDocuments } from './documents';
import * as repo from './repository';

/** "SH-" + the ship date's year + the shop-wide sequence. */
export const formatShipmentNumber = (shipDate: string, n: number) => `SH-${shipDate.slice(0, 4)}-${String(n).padStart(5, '0')}`;

const CLOSED_ORDER: readonly OrderStatus[] = ['cancelled', 'closed'];
const SHIPPABLE_UNIT = new Set(['passed', 'use_as_is']);

export const documentUrl = (shipmentId: number, kind: string) => `/api/shipments/${shipmentId}/documents/${kind}`;

type WoRow = Awaited<ReturnType<typeof repo.workOrdersWithOrder>>[number];
type Standing = NonNullable<ReturnType<Awaited<ReturnType<typeof unitStandings>>['get']>>;
type Signature = { userId: number | null; name: string | null; at: Date };

/** What one work order may ship now, and why not (the rule at the top of this file). */
function judge(row: WoRow, standing: Standing | undefined, shipped: Set<string>, signature: Signature | undefined) {
  const reasons: string[] = [];
  const stage = row.wo.stage;
  if (stage === 'shipped') reasons.push('It has shipped');
  else if (stage !== 'packing') reasons.push(`It is in ${STAGE_LABELS[stage].toLowerCase()}, not packing`);
  if (standing && standing.gate.state === 'open') {
    reasons.push(`${standing.gate.outstanding} unit(s) without a passed test or an approved disposition`);
  }
  if (stage !== 'shipped' && !signature) reasons.push('Inspection is not signed: nobody moved it from inspection into packing');
  if (CLOSED_ORDER.includes(row.order.status)) reasons.push(`Its order ${row.order.number} is ${ORDER_STATUS_LABELS[row.order.status].toLowerCase()}`);
  const serials = (standing?.units ?? [])
    .filter((u) => SHIPPABLE_UNIT.has(u.state) && !shipped.has(u.serial))
    .map((u) => u.serial)
    .sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));
  const goodQuantity = standing?.goodQuantity ?? row.wo.quantity;
  const remaining = Math.max(0, goodQuantity - shipped.size);
  if (!reasons.length && !serials.length) reasons.push('No unit is left to ship');
  return { ready: reasons.length === 0, reasons, serials, remaining, goodQuantity };
}

async function facts(db: Db | Tx, ids: number[]) {
  const standings = await unitStandings(db, ids);
  const shipped = await repo.shippedSerials(db, ids);
  const signatures = await repo.inspectionSignatures(db, ids);
  return { standings, shipped, signatures };
}

const shipToOf = (c: WoRow['customer']): Address | null => {
  const has = (a: Address | null | undefined) => !!a && Object.values(a).some((v) => v !== '');
  if (has(c.shippingAddress)) return { ...EMPTY_ADDRESS, ...c.shippingAddress! };
  if (has(c.billingAddress)) return { ...EMPTY_ADDRESS, ...c.billingAddress };
  return null;
};

/** Work orders in packing, grouped by customer and order, each with whether it may ship now. */
export async function readyToShip(db: Db, today = localDate()): Promise<ReadyToShip> {
  const rows = await repo.workOrdersWithOrder(db, { stage: 'packing' });
  const f = await facts(db, rows.map((r) => r.wo.id));
  const out: ReadyToShip = { customers: [] };
  for (const r of rows) {
    const j = judge(r, f.standings.get(r.wo.id), f.shipped.get(r.wo.id) ?? new Set(), f.signatures.get(r.wo.id));
    const sig = f.signatures.get(r.wo.id);
    const item: ReadyWorkOrder = {
      id: r.wo.id,
      number: r.wo.number,
      lineId: r.line.id,
      lineNo: r.line.lineNo,
      lineTitle: r.line.title,
      customerPartNumber: r.line.customerPartNumber,
      quantity: j.remaining,
      serials: j.serials,
      ready: j.ready,
      reasons: j.reasons,
      inspectedBy: sig?.userId != null && sig.name ? { id: sig.userId, name: sig.name } : null,
      inspectedAt: sig ? sig.at.toISOString() : null,
    };
    let c = out.customers.find((x) => x.id === r.customer.id);
    if (!c) out.customers.push((c = { id: r.customer.id, name: r.customer.name, shipTo: shipToOf(r.customer), orders: [] }));
    let o = c.orders.find((x) => x.id === r.order.id);
    if (!o) c.orders.push((o = { id: r.order.id, number: r.order.number, purchaseOrder: r.order.purchaseOrder, dueDate: r.order.dueDate, late: r.order.dueDate < today, workOrders: [] }));
    o.workOrders.push(item);
  }
  return out;
}


/** The 422 of a refused shipment: which work orders and why, in words and machine-readable. */
function refused(message: string, problems: ShipmentRefusal[]): HttpError {
  return new HttpError(422, 'rule', message, { workOrderIds: problems.map((p) => `${p.number}: ${p.reasons.join('; ')}`).join(' · ') }, { current: { workOrders: problems } });
}

/**
 * Creates a shipment in the caller's transaction (the route's, or the demo seed's); returns its
 * id. See the rule at the top of this file.
 */
export async function applyCreateShipment(tx: Tx, actor: SessionUser, input: CreateShipmentRequest, opts: { today?: string; at?: Date } = {}): Promise<number> {
  const today = opts.today ?? localDate();
  if (input.shipDate > addDays(today, SHIP_DATE_MAX_DAYS_AHEAD)) {
    throw ruleBroken(`A shipment records what left the building: the ship date may be at most ${SHIP_DATE_MAX_DAYS_AHEAD} days ahead`, {
      shipDate: `At most ${SHIP_DATE_MAX_DAYS_AHEAD} days from today`,
    });
  }
  const ids = input.workOrderIds;
  // Locked in id order (two shipments of the same work orders queue here; no deadlock).
  const locked = await woRepo.lockWorkOrders(tx, ids);
  const lockedById = new Map(locked.map((w) => [w.id, w]));
  const unknown = ids.filter((i) => !lockedById.has(i));
  if (unknown.length) {
    throw refused(`No work order with id ${unknown.join(', ')}; nothing was shipped`, unknown.map((i) => ({ workOrderId: i, number: `#${i}`, reasons: ['No such work order'] })));
  }
  const rows = await repo.workOrdersWithOrder(tx, { ids });
  const byId = new Map(rows.map((r) => [r.wo.id, r]));
  const customerIds = [...new Set(rows.map((r) => r.customer.id))];
  if (customerIds.length > 1) {
    const first = rows.find((r) => r.wo.id === ids[0])!.customer;
    const others = ids.map((i) => byId.get(i)!).filter((r) => r.customer.id !== first.id);
    throw refused(
      `A shipment goes to one customer: ${others.map((r) => r.wo.number).join(', ')} belong to ${[...new Set(others.map((r) => r.customer.name))].join(', ')}, not ${first.name}`,
      others.map((r) => ({ workOrderId: r.wo.id, number: r.wo.number, reasons: [`Customer ${r.customer.name}, not ${first.name}`] })),
    );
  }
  const customer = rows[0].customer;
  const f = await facts(tx, ids);
  const partial = new Map((input.partial ?? []).map((p) => [p.workOrderId, p.serials]));
  const problems: ShipmentRefusal[] = [];
  const plan: { row: WoRow; serials: string[]; fully: boolean }[] = [];
  for (const id of ids) {
    const row = byId.get(id)!;
    const shipped = f.shipped.get(id) ?? new Set<string>();
    const j = judge(row, f.standings.get(id), shipped, f.signatures.get(id));
    const reasons = [...j.reasons];
    let serials = j.serials;
    const named = partial.get(id);
    if (named && j.ready) {
      const may = new Set(j.serials);
      for (const s of named) {
        if (shipped.has(s)) reasons.push(`Serial ${s} shipped already`);
        else if (!may.has(s)) reasons.push(`Serial ${s} is not a unit of ${row.wo.number} that passed its test (or was approved for use as is)`);
      }
      serials = [...named].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));
    }
    if (reasons.length) problems.push({ workOrderId: id, number: row.wo.number, reasons });
    else plan.push({ row, serials, fully: shipped.size + serials.length >= j.goodQuantity });
  }
  if (problems.length) {
    throw refused(`${problems.length === 1 ? `${problems[0].number} may not ship` : `${problems.length} work orders may not ship`}; nothing was shipped`, problems);
  }

  const at = opts.at ?? new Date();
  const number = formatShipmentNumber(input.shipDate, await repo.nextShipmentSequence(tx));
  const shipment = await repo.insertShipment(tx, {
    number,
    customerId: customer.id,
    shipTo: input.shipTo,
    attention: input.attention,
    carrier: input.carrier,
    service: input.service,
    trackingNumber: input.trackingNumber,
    shipDate: input.shipDate,
    packages: input.packages,
    packingNote: input.packingNote,
    createdBy: actor.id,
    createdAt: at,
  });
  await repo.insertItems(
    tx,
    plan.map((p) => ({ shipmentId: shipment.id, workOrderId: p.row.wo.id, quantity: p.serials.length, serials: p.serials })),
  );

  // Work orders: the fully shipped ones move to shipped (the floor's kind of event); every one
  // changed bumps its version, so a board holding an older copy gets 409 and the feed refetches.
  const fullIds = plan.filter((p) => p.fully).map((p) => p.row.wo.id);
  const partIds = plan.filter((p) => !p.fully).map((p) => p.row.wo.id);
  const moved = await woRepo.updateWorkOrders(tx, fullIds, { stage: 'shipped' });
  const touched = await woRepo.updateWorkOrders(tx, partIds, {});
  const unitsOf = (id: number) => plan.find((p) => p.row.wo.id === id)!.serials.length;
  await woRepo.insertEvents(tx, [
    ...moved.map((w) => ({ workOrderId: w.id, kind: 'move' as const, userId: actor.id, fromStage: 'packing' as const, toStage: 'shipped' as const, note: number, stationId: w.stationId, at })),
    // Part of a work order leaving: its history says so, though its stage stays packing.
    ...touched.map((w) => ({
      workOrderId: w.id,
      kind: 'shipment' as const,
      userId: actor.id,
      fromStage: w.stage,
      toStage: w.stage,
      note: `${unitsOf(w.id)} unit(s) shipped in ${number}; the rest stay in packing`,
      stationId: w.stationId,
      at,
    })),
  ]);
  for (const w of [...moved, ...touched]) {
    const change: FloorChange = { kind: 'move', id: w.id, number: w.number, stage: w.stage, version: w.version, at: w.updatedAt.toISOString() };
    await notifyFloor(tx, change);
  }

  // Orders: partly shipped or shipped, with the audit row (locked in id order after the work orders).
  const orderIds = [...new Set(plan.map((p) => p.row.order.id))].sort((a, b) => a - b);
  const orderFacts = [];
  for (const orderId of orderIds) {
    const order = (await orderRepo.lockOrder(tx, orderId))!;
    const lines = await orderRepo.listLines(tx, orderId);
    const scrapped = await scrappedByLine(tx, orderId);
    const shippedLine = await repo.shippedByLine(tx, lines.map((l) => l.id));
    const done = lines.every((l) => (shippedLine.get(l.id) ?? 0) >= l.quantity - (scrapped.get(l.id) ?? 0));
    const to: OrderStatus = done ? 'shipped' : 'partly_shipped';
    const note = `Shipment ${number}`;
    if (order.status !== to) await transitionOrder(tx, order, to, actor.id, { note });
    else await orderRepo.insertEvent(tx, { orderId, actorId: actor.id, kind: 'updated', changes: { shipment: [null, number] }, note });
    orderFacts.push({
      orderId,
      orderNumber: order.number,
      purchaseOrder: order.purchaseOrder,
      dueDate: order.dueDate,
      status: to,
      lines: lines.map((l) => {
        const now = plan.filter((p) => p.row.line.id === l.id);
        const shippedTotal = shippedLine.get(l.id) ?? 0;
        return {
          lineNo: l.lineNo,
          title: l.title,
          customerPartNumber: l.customerPartNumber,
          quantity: l.quantity,
          shippedNow: now.reduce((s, p) => s + p.serials.length, 0),
          serialCount: now.reduce((s, p) => s + p.serials.length, 0),
          shippedTotal,
          remaining: Math.max(0, l.quantity - shippedTotal),
        };
      }),
    });
  }

  // The customer's shipment notice (outbox), for contacts asking for shipping notices.
  const contacts = (await customerRepo.listContacts(tx, customer.id)).filter((c) => c.notifyShipping && c.email);
  const recipients = contacts.map((c) => ({ name: c.name, email: c.email }));
  const [notice] = await tx
    .insert(notifications)
    .values({
      kind: 'shipment_sent',
      orderId: orderIds[0],
      recipients,
      payload: {
        shipmentId: shipment.id,
        shipmentNumber: number,
        customerId: customer.id,
        customerName: customer.name,
        carrier: input.carrier,
        service: input.service,
        trackingNumber: input.trackingNumber,
        shipDate: input.shipDate,
        packages: input.packages.length,
        units: plan.reduce((s, p) => s + p.serials.length, 0),
        orders: orderFacts,
      },
      status: recipients.length ? 'pending' : 'skipped',
      reason: recipients.length ? null : 'The customer has no contact asking for shipping notices',
      createdAt: at,
      dueAt: at,
    })
    .returning();
  await repo.setNotification(tx, shipment.id, notice.id);
  return shipment.id;
}

/**
 * POST /api/shipments: the shipment in one transaction, then its documents on the queue. A queue
 * that is away does not undo the shipment: the documents are drawn on first download, by a
 * redraw, or by the mail processor (which needs the certificate).
 */
export async function createShipment(db: Db, queues: Queues, actor: SessionUser, input: CreateShipmentRequest): Promise<ShipmentRecord> {
  const id = await db.transaction((tx) => applyCreateShipment(tx, actor, input));
  await queueDocuments(db, queues, id).catch(() => null);
  return getShipment(db, id);
}

// ── Reading ─────────────────────────────────────────────────────────────────────────────────

type ListRow = Awaited<ReturnType<typeof repo.listShipments>>[number];
type ItemRow = Awaited<ReturnType<typeof repo.itemsOf>>[number];

export function toItem(i: ItemRow): ShipmentItem {
  return {
    workOrderId: i.wo.id,
    workOrderNumber: i.wo.number,
    orderId: i.order.id,
    orderNumber: i.order.number,
    purchaseOrder: i.order.purchaseOrder,
    lineId: i.line.id,
    lineNo: i.line.lineNo,
    lineTitle: i.line.title,
    customerPartNumber: i.line.customerPartNumber,
    quantity: i.item.quantity,
    serials: i.item.serials,
  };
}

function toSummary(r: ListRow, items: ItemRow[]): ShipmentSummary {
  const s = r.shipment;
  const orders = new Map<number, { id: number; number: string; purchaseOrder: string }>();
  for (const i of items) orders.set(i.order.id, { id: i.order.id, number: i.order.number, purchaseOrder: i.order.purchaseOrder });
  return {
    id: s.id,
    number: s.number,
    customer: { id: s.customerId, name: r.customerName },
    orders: [...orders.values()],
    carrier: s.carrier,
    service: s.service,
    trackingNumber: s.trackingNumber,
    shipDate: s.shipDate,
    units: items.reduce((n, i) => n + i.item.quantity, 0),
    packages: s.packages.length,
  };
}

export function documentInfos(shipmentId: number, docs: repo.ShipmentDocumentRow[]): ShipmentDocumentInfo[] {
  return SHIPMENT_DOCUMENT_KINDS.map((kind) => {
    const d = docs.find((x) => x.kind === kind);
    return d
      ? { kind, state: 'ready' as const, downloadUrl: documentUrl(shipmentId, kind), sha256: d.sha256, size: d.size, pages: d.pages, createdAt: d.createdAt.toISOString() }
      : { kind, state: 'pending' as const, downloadUrl: null, sha256: null, size: null, pages: null, createdAt: null };
  });
}

/** Items grouped by shipment (one query for a whole list). */
export async function itemsByShipment(db: Db | Tx, ids: number[]) {
  const items = await repo.itemsOf(db, ids);
  const by = new Map<number, ItemRow[]>();
  for (const i of items) by.set(i.item.shipmentId, [...(by.get(i.item.shipmentId) ?? []), i]);
  return by;
}

export async function listShipments(db: Db, q: Partial<ListShipmentsQuery>): Promise<ShipmentSummary[]> {
  const rows = await repo.listShipments(db, { customerId: q.customerId, from: q.from, to: q.to, q: q.q || undefined });
  const items = await itemsByShipment(db, rows.map((r) => r.shipment.id));
  return rows.map((r) => toSummary(r, items.get(r.shipment.id) ?? []));
}

/**
 * A shipment for the staff's page. Documents not drawn yet — a shipment recorded while the queue
 * was down, or the demo's history — are asked of the worker now (idempotent job id); a queue that
 * is down does not stop the read, and the download draws a missing document anyway.
 */
export async function openShipment(db: Db, queues: Queues, id: number): Promise<ShipmentRecord> {
  const record = await getShipment(db, id);
  if (record.documents.some((d) => d.state === 'pending')) await queueDocuments(db, queues, id).catch(() => undefined);
  return record;
}

export async function getShipment(db: Db | Tx, id: number): Promise<ShipmentRecord> {
  const [row] = await repo.listShipments(db, { id });
  if (!row) throw notFound('No such shipment');
  const s = row.shipment;
  const items = (await itemsByShipment(db, [id])).get(id) ?? [];
  const docs = await repo.documentsOf(db, [id]);
  const [notice] = s.notificationId ? await repo.notificationsByIds(db, [s.notificationId]) : [];
  return {
    ...toSummary(row, items),
    shipTo: { ...EMPTY_ADDRESS, ...s.shipTo },
    attention: s.attention,
    packingNote: s.packingNote,
    packageList: s.packages,
    totalWeight: Math.round(s.packages.reduce((n, p) => n + p.weight, 0) * 1000) / 1000,
    items: items.map(toItem),
    documents: documentInfos(id, docs),
    notification: notice ? { status: notice.status, recipients: notice.recipients.length, sentAt: notice.sentAt?.toISOString() ?? null } : null,
    createdBy: s.createdBy !== null && row.createdByName ? { id: s.createdBy, name: row.createdByName } : null,
    createdAt: s.createdAt.toISOString(),
  };
}

/** The shipment's company, for the customer-role check of a download. */
export async function shipmentCustomer(db: Db | Tx, id: number): Promise<number | null> {
  const [row] = await repo.listShipments(db, { id });
  return row ? row.shipment.customerId : null;
}
