import type { SessionUser } from '../../src/contracts/auth';
import { scrappedByLine } from '../test-records/repository';
import {
  ORDER_STATUS_LABELS,
  type CreateOrderRequest,
  type ListOrdersQuery,
  type OrderDetail,
  type OrderEventKind,
  type OrderEventRecord,
  type OrderLineRecord,
  type OrderLineValues,
  type OrderStatus,
  type OrderSummary,
  type UpdateOrderRequest,
} from '../../src/contracts/orders';
import type { LineBuildSheetSummary } from '../../src/contracts/build-sheet-status';
import * as attachmentRepo from '../attachments/repository';
import { lineSheetSummaries } from '../build-sheets/essentials';
import * as customerRepo from '../customers/repository';
import type { Db, Tx } from '../db/client';
import type { NotificationRecipient } from '../db/schema';
import { HttpError, badRequest, notFound, ruleBroken } from '../http/errors';
import * as repo from './repository';

/**
 * The one table of allowed status moves. Acknowledging and cancelling happen here; release to
 * the floor, shipments and closing belong to later features, which move orders through
 * `transitionOrder` so this table stays the only rule.
 */
export const ORDER_TRANSITIONS: Record<OrderStatus, readonly OrderStatus[]> = {
  entered: ['acknowledged', 'cancelled'],
  acknowledged: ['in_production', 'cancelled'],
  in_production: ['partly_shipped', 'shipped', 'cancelled'],
  partly_shipped: ['shipped'],
  shipped: ['closed'],
  closed: [],
  cancelled: [],
};

export const canTransition = (from: OrderStatus, to: OrderStatus) => ORDER_TRANSITIONS[from].includes(to);

/** Statuses in which nothing about the order may change any more. */
const FROZEN: readonly OrderStatus[] = ['cancelled', 'closed'];

/** Fields of an order whose changes the customer may see in the trail. */
const CUSTOMER_VISIBLE_FIELDS = ['status', 'purchaseOrder', 'orderDate', 'dueDate', 'lines', 'attachment'];

const isUniqueViolation = (e: unknown) =>
  (e as { code?: string }).code === '23505' || (e as { cause?: { code?: string } }).cause?.code === '23505';
const poTaken = () =>
  new HttpError(409, 'conflict', 'This customer has an order with this purchase-order number already', {
    purchaseOrder: 'Already used on another order of this customer',
  });

const label = (s: OrderStatus) => ORDER_STATUS_LABELS[s].toLowerCase();

/** Today's date as YYYY-MM-DD in the server's time zone. */
export function today(now = new Date()) {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${p(now.getMonth() + 1)}-${p(now.getDate())}`;
}

/** "SO-" + the order year + the shop-wide sequence. */
export const formatOrderNumber = (orderDate: string, n: number) => `SO-${orderDate.slice(0, 4)}-${String(n).padStart(5, '0')}`;

// ── Reading ─────────────────────────────────────────────────────────────────────────────────

type SummaryRow = Awaited<ReturnType<typeof repo.listOrders>>[number];

function toSummary(r: SummaryRow): OrderSummary {
  const o = r.order;
  return {
    id: o.id,
    number: o.number,
    customer: { id: o.customerId, name: r.customerName },
    purchaseOrder: o.purchaseOrder,
    status: o.status,
    orderDate: o.orderDate,
    dueDate: o.dueDate,
    lineCount: r.lineCount,
    unitCount: r.unitCount,
    late: r.late,
    acknowledgedAt: o.acknowledgedAt?.toISOString() ?? null,
    updatedAt: o.updatedAt.toISOString(),
  };
}

/** Customer-role users read only their own company's orders; the rest of the shop reads all. */
function scopeFor(viewer: SessionUser): number | undefined {
  if (viewer.role !== 'customer') return undefined;
  return viewer.customerId ?? -1;
}

export async function listOrders(db: Db | Tx, viewer: SessionUser, query: Partial<ListOrdersQuery>): Promise<OrderSummary[]> {
  const scope = scopeFor(viewer);
  if (scope !== undefined && query.customerId !== undefined && query.customerId !== scope) return [];
  const rows = await repo.listOrders(db, {
    statuses: query.status,
    customerId: scope ?? query.customerId,
    dueFrom: query.dueFrom,
    dueTo: query.dueTo,
    late: query.late,
    q: query.q || undefined,
  });
  return rows.map(toSummary);
}

/** A line's own fields as the API shows them (orders and the engineer's line page share this). */
export function lineFields(l: repo.LineRow): Omit<OrderLineRecord, 'buildSheet'> {
  return {
    id: l.id,
    lineNo: l.lineNo,
    quantity: l.quantity,
    title: l.title,
    customerPartNumber: l.customerPartNumber,
    requirement: l.requirement,
    tolerancePercent: l.tolerancePercent,
    terminationNotes: l.terminationNotes,
    leadNotes: l.leadNotes,
  };
}

function toLine(l: repo.LineRow, buildSheet: LineBuildSheetSummary | null = null): OrderLineRecord {
  return { ...lineFields(l), buildSheet };
}

/** What a customer may see of an event: no staff names, no internal fields or notes. */
function eventForCustomer(e: OrderEventRecord): OrderEventRecord | null {
  const changes = Object.fromEntries(
    Object.entries(e.changes).filter(([field]) => CUSTOMER_VISIBLE_FIELDS.includes(field.split('.')[0])),
  );
  if (e.kind === 'updated' && Object.keys(changes).length === 0) return null;
  return { id: e.id, at: e.at, kind: e.kind, changes };
}

/**
 * The order row the viewer may read, or 404: a customer-role user reading another company's
 * order is told it does not exist.
 */
export async function orderForViewer(db: Db | Tx, viewer: SessionUser, id: number) {
  const [row] = await repo.listOrders(db, { id });
  const scope = scopeFor(viewer);
  if (!row || (scope !== undefined && row.order.customerId !== scope)) throw notFound('No such order');
  return row;
}

export async function getOrder(db: Db | Tx, viewer: SessionUser, id: number): Promise<OrderDetail> {
  const row = await orderForViewer(db, viewer, id);
  const o = row.order;
  // One after another: `db` may be a transaction, whose single connection takes one query at a time.
  const lines = await repo.listLines(db, id);
  const files = await attachmentRepo.listForOrder(db, id);
  const events = await repo.listEvents(db, id);
  const names = await repo.userNames(db, [o.acknowledgedBy, o.createdBy]);
  const internal = viewer.role !== 'customer';
  const sheets = await lineSheetSummaries(db, lines, { internal });
  const scrapped = internal ? await scrappedByLine(db, id) : null;
  const who = (uid: number | null) => (uid !== null && names.has(uid) ? { id: uid, name: names.get(uid)! } : null);
  const allEvents: OrderEventRecord[] = events.map(({ event: e, actorName }) => ({
    id: e.id,
    at: e.at.toISOString(),
    kind: e.kind,
    actor: e.actorId !== null && actorName ? { id: e.actorId, name: actorName } : null,
    changes: e.changes,
    ...(e.note !== null && { note: e.note }),
  }));
  const status = o.status;
  return {
    ...toSummary(row),
    ...(internal && {
      notes: o.notes,
      acknowledgedBy: who(o.acknowledgedBy),
      cancelReason: o.cancelReason,
      createdBy: who(o.createdBy),
    }),
    cancelledAt: o.cancelledAt?.toISOString() ?? null,
    createdAt: o.createdAt.toISOString(),
    lines: lines.map((l) => ({ ...toLine(l, sheets.get(l.id) ?? null), ...(scrapped && { scrapped: scrapped.get(l.id) ?? 0 }) })),
    attachments: files.map(({ attachment: a, uploaderName }) => ({
      id: a.id,
      lineId: a.lineId,
      filename: a.filename,
      contentType: a.contentType,
      size: a.size,
      sha256: a.sha256,
      createdAt: a.createdAt.toISOString(),
      ...(internal && { uploadedBy: a.uploadedBy !== null && uploaderName ? { id: a.uploadedBy, name: uploaderName } : null }),
    })),
    events: internal ? allEvents : allEvents.map(eventForCustomer).filter((e): e is OrderEventRecord => e !== null),
    can: {
      edit: !FROZEN.includes(status),
      editLines: status === 'entered',
      acknowledge: canTransition(status, 'acknowledged'),
      cancel: canTransition(status, 'cancelled'),
      attach: !FROZEN.includes(status),
    },
  };
}

// ── Writing ─────────────────────────────────────────────────────────────────────────────────

function lineValues(l: OrderLineValues) {
  return {
    quantity: l.quantity,
    title: l.title,
    customerPartNumber: l.customerPartNumber,
    requirement: l.requirement,
    tolerancePercent: l.tolerancePercent,
    terminationNotes: l.terminationNotes,
    leadNotes: l.leadNotes,
  };
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

async function assertCustomer(db: Db | Tx, customerId: number) {
  if (!(await customerRepo.findCustomer(db, customerId))) throw badRequest('No such customer', { customerId: 'No such customer' });
}

/** Enters a whole order with its lines, in one transaction with its first audit row. */
export async function createOrder(db: Db, input: CreateOrderRequest, actor: SessionUser): Promise<OrderDetail> {
  const orderDate = input.orderDate ?? today();
  if (input.dueDate < orderDate) {
    throw badRequest('The requested ship date cannot be before the order date', {
      dueDate: 'The requested ship date cannot be before the order date',
    });
  }
  await assertCustomer(db, input.customerId);
  if (await repo.findByPurchaseOrder(db, input.customerId, input.purchaseOrder)) throw poTaken();
  let id: number;
  try {
    id = await db.transaction(async (tx) => {
      const n = await repo.nextOrderSequence(tx);
      const order = await repo.insertOrder(tx, {
        number: formatOrderNumber(orderDate, n),
        customerId: input.customerId,
        purchaseOrder: input.purchaseOrder,
        orderDate,
        dueDate: input.dueDate,
        notes: input.notes,
        createdBy: actor.id,
      });
      await repo.insertLines(
        tx,
        input.lines.map((l, i) => ({ ...lineValues(l), orderId: order.id, lineNo: i + 1 })),
      );
      await repo.insertEvent(tx, {
        orderId: order.id,
        actorId: actor.id,
        kind: 'created',
        changes: { status: [null, 'entered'], lines: [0, input.lines.length] },
      });
      return order.id;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw poTaken(); // the same PO entered twice at once: the index decides
    throw e;
  }
  return getOrder(db, actor, id);
}

/**
 * Writes the whole new line list of an entered order: listed ids change, new entries are added,
 * the rest are removed (their drawings stay on the order). Returns the changes for the trail.
 */
async function replaceLines(tx: Tx, orderId: number, lines: OrderLineValues[]) {
  const current = await repo.listLines(tx, orderId);
  const byId = new Map(current.map((l) => [l.id, l]));
  const fields: Record<string, string> = {};
  const seen = new Set<number>();
  lines.forEach((l, i) => {
    if (l.id === undefined) return;
    if (!byId.has(l.id)) fields[`lines.${i}.id`] = 'No such line on this order';
    else if (seen.has(l.id)) fields[`lines.${i}.id`] = 'This line is listed twice';
    seen.add(l.id);
  });
  if (Object.keys(fields).length) throw badRequest('Some lines do not belong to this order', fields);

  const changes: Record<string, [unknown, unknown]> = {};
  const keep = lines.flatMap((l) => (l.id !== undefined ? [l.id] : []));
  for (const old of current) {
    if (!keep.includes(old.id)) changes[`lines.${old.lineNo}`] = [{ title: old.title, quantity: old.quantity }, null];
  }
  await repo.deleteLinesExcept(tx, orderId, keep);
  await repo.parkLineNumbers(tx, orderId);
  const fresh: Parameters<typeof repo.insertLines>[1] = [];
  for (const [i, l] of lines.entries()) {
    const lineNo = i + 1;
    const values = lineValues(l);
    if (l.id === undefined) {
      fresh.push({ ...values, orderId, lineNo });
      changes[`lines.${lineNo}`] = [null, { title: l.title, quantity: l.quantity }];
      continue;
    }
    const old = byId.get(l.id)!;
    if (old.lineNo !== lineNo) changes[`lines.${old.lineNo}.lineNo`] = [old.lineNo, lineNo];
    for (const [k, v] of Object.entries(values)) {
      const before = old[k as keyof typeof values];
      if (!same(before, v)) changes[`lines.${lineNo}.${k}`] = [before, v];
    }
    await repo.updateLine(tx, orderId, l.id, { ...values, lineNo });
  }
  await repo.insertLines(tx, fresh);
  return changes;
}

/** Changes an order (and its lines while entered), with an audit row of what changed. */
export async function updateOrder(db: Db, id: number, input: UpdateOrderRequest, actor: SessionUser): Promise<OrderDetail> {
  try {
    await db.transaction(async (tx) => {
      const order = await repo.lockOrder(tx, id);
      if (!order) throw notFound('No such order');
      if (FROZEN.includes(order.status)) {
        throw ruleBroken(`A ${label(order.status)} order cannot be changed`, { status: `The order is ${label(order.status)}` });
      }
      if (input.lines && order.status !== 'entered') {
        throw ruleBroken('Lines can be changed only while the order is entered', {
          lines: `The order is ${label(order.status)}; its lines are fixed`,
        });
      }
      const orderDate = input.orderDate ?? order.orderDate;
      const dueDate = input.dueDate ?? order.dueDate;
      if (dueDate < orderDate) {
        const field = input.dueDate !== undefined ? 'dueDate' : 'orderDate';
        throw badRequest('The requested ship date cannot be before the order date', {
          [field]: 'The requested ship date cannot be before the order date',
        });
      }
      if (
        input.purchaseOrder !== undefined &&
        input.purchaseOrder.toLowerCase() !== order.purchaseOrder.toLowerCase() &&
        (await repo.findByPurchaseOrder(tx, order.customerId, input.purchaseOrder, id))
      ) {
        throw poTaken();
      }
      const changes: Record<string, [unknown, unknown]> = {};
      const set: Partial<repo.OrderRow> = {};
      for (const k of ['purchaseOrder', 'orderDate', 'dueDate', 'notes'] as const) {
        const v = input[k];
        if (v !== undefined && v !== order[k]) {
          changes[k] = [order[k], v];
          set[k] = v;
        }
      }
      if (input.lines) Object.assign(changes, await replaceLines(tx, id, input.lines));
      if (Object.keys(changes).length === 0) return;
      await repo.updateOrder(tx, id, set);
      await repo.insertEvent(tx, { orderId: id, actorId: actor.id, kind: 'updated', changes });
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw poTaken();
    throw e;
  }
  return getOrder(db, actor, id);
}

/**
 * Moves a locked order to another status if the table allows it, with its audit row. Later
 * features (release to the floor, shipments, closing) call this inside their own transactions.
 */
export async function transitionOrder(
  tx: Tx,
  order: repo.OrderRow,
  to: OrderStatus,
  actorId: number | null,
  opts: { kind?: OrderEventKind; note?: string; set?: Partial<repo.OrderRow> } = {},
) {
  if (!canTransition(order.status, to)) {
    const allowed = ORDER_TRANSITIONS[order.status];
    throw ruleBroken(`An order that is ${label(order.status)} cannot become ${label(to)}`, {
      status: allowed.length
        ? `From ${label(order.status)} the order can become: ${allowed.map(label).join(', ')}`
        : `A ${label(order.status)} order is final`,
    });
  }
  await repo.updateOrder(tx, order.id, { ...opts.set, status: to });
  await repo.insertEvent(tx, {
    orderId: order.id,
    actorId,
    kind: opts.kind ?? 'status_changed',
    changes: { status: [order.status, to] },
    note: opts.note ?? null,
  });
}

/** For later features and the demo seed: lock an order and move it (see transitionOrder). */
export async function moveOrder(db: Db, id: number, to: OrderStatus, actorId: number | null, note?: string) {
  await db.transaction(async (tx) => {
    const order = await repo.lockOrder(tx, id);
    if (!order) throw notFound('No such order');
    await transitionOrder(tx, order, to, actorId, { note });
  });
}

export type NotificationSummary = { id: number; status: string; recipients: NotificationRecipient[]; reason: string | null };

/** Who hears of an order: contacts asking for order notices, else the first contact with an address. */
export async function orderRecipients(tx: Tx, customerId: number): Promise<NotificationRecipient[]> {
  const contacts = (await customerRepo.listContacts(tx, customerId)).filter((c) => c.email);
  const chosen = contacts.filter((c) => c.notifyOrders);
  return (chosen.length ? chosen : contacts.slice(0, 1)).map((c) => ({ name: c.name, email: c.email }));
}

/**
 * Acknowledges an entered order: records who and when, and asks for the acknowledgement e-mail
 * by writing a notifications row in the same transaction. With nobody to write to, the order is
 * still acknowledged and the row is 'skipped' with the reason.
 */
export async function acknowledgeOrder(db: Db, id: number, actor: SessionUser): Promise<{ order: OrderDetail; notification: NotificationSummary }> {
  const notification = await db.transaction(async (tx) => {
    const order = await repo.lockOrder(tx, id);
    if (!order) throw notFound('No such order');
    if (order.status !== 'entered') {
      throw ruleBroken(`Only an entered order can be acknowledged; this one is ${label(order.status)}`, {
        status: `The order is ${label(order.status)}`,
      });
    }
    const at = new Date();
    await transitionOrder(tx, order, 'acknowledged', actor.id, { kind: 'acknowledged', set: { acknowledgedAt: at, acknowledgedBy: actor.id } });
    const customer = await customerRepo.findCustomer(tx, order.customerId);
    const lines = await repo.listLines(tx, id);
    const recipients = await orderRecipients(tx, order.customerId);
    const row = await repo.insertNotification(tx, {
      kind: 'order_acknowledged',
      orderId: id,
      recipients,
      payload: {
        orderId: id,
        orderNumber: order.number,
        customerId: order.customerId,
        customerName: customer?.name ?? '',
        purchaseOrder: order.purchaseOrder,
        orderDate: order.orderDate,
        dueDate: order.dueDate,
        acknowledgedAt: at.toISOString(),
        lines: lines.map((l) => ({ lineNo: l.lineNo, quantity: l.quantity, title: l.title, customerPartNumber: l.customerPartNumber })),
      },
      status: recipients.length ? 'pending' : 'skipped',
      reason: recipients.length ? null : 'The customer has no contact with an e-mail address',
      dueAt: at,
    });
    return { id: row.id, status: row.status, recipients: row.recipients, reason: row.reason };
  });
  return { order: await getOrder(db, actor, id), notification };
}

/** Cancels an order that is not yet shipping, with the reason. */
export async function cancelOrder(db: Db, id: number, reason: string, actor: SessionUser): Promise<OrderDetail> {
  await db.transaction(async (tx) => {
    const order = await repo.lockOrder(tx, id);
    if (!order) throw notFound('No such order');
    await transitionOrder(tx, order, 'cancelled', actor.id, {
      kind: 'cancelled',
      note: reason,
      set: { cancelledAt: new Date(), cancelledBy: actor.id, cancelReason: reason },
    });
  });
  return getOrder(db, actor, id);
}
