/**
 * The customer's read-only view: their own company's orders (each line's progress in plain
 * words) and shipments (tracking, documents). Built from whitelisted fields only: no costs, no
 * internal notes, no staff names, no other company's records (another company's id is 404).
 *
 * PROGRESS WORDS. A line's units are counted per work order: shipped units are "shipped"; the
 * rest of a work order's good units (quantity less units scrapped at test, which the shop
 * remakes) are "tested" while it is in packing, "awaiting engineering" while it is in
 * engineering, and otherwise "in production". Units of the line not yet released to the floor are
 * "awaiting engineering". Stages in production are shown simply (PORTAL_STAGE_WORDS in the
 * contract). A hold or rework is not named: those units show as "in production" without a stage
 * word — the internal reason is the shop's, and the requested ship date is what the customer
 * follows.
 */
import type { SessionUser } from '../../src/contracts/auth';
import { EMPTY_ADDRESS } from '../../src/contracts/customers';
import { ORDER_STATUS_LABELS } from '../../src/contracts/orders';
import {
  PORTAL_PROGRESS,
  PORTAL_STAGE_WORDS,
  SHIPMENT_DOCUMENT_LABELS,
  type PortalLine,
  type PortalOrder,
  type PortalOrderDetail,
  type PortalProgress,
  type PortalSchedule,
  type PortalShipment,
} from '../../src/contracts/shipments';
import type { Db } from '../db/client';
import { notFound } from '../http/errors';
import { localDate } from '../floor/estimate';
import * as orderRepo from '../orders/repository';
import { summaries } from '../work-orders/service';
import * as repo from './repository';
import { documentInfos, documentUrl, itemsByShipment } from './service';

const scope = (viewer: SessionUser) => viewer.customerId ?? -1;
const DONE_STATUSES = new Set(['shipped', 'closed', 'cancelled']);

/**
 * An open order is behind when its requested ship date has passed or any of its open work orders
 * is late or at risk by the floor's estimate; else on schedule.
 */
function scheduleOf(status: string, dueDate: string, today: string, openFlags: { late: boolean; atRisk: boolean }[]): PortalSchedule {
  if (DONE_STATUSES.has(status)) return 'done';
  if (dueDate < today || openFlags.some((f) => f.late || f.atRisk)) return 'behind';
  return 'on_schedule';
}

const PROGRESS_WORDS: Record<PortalProgress, string> = {
  shipped: 'shipped',
  tested: 'tested, awaiting shipment',
  in_production: 'in production',
  awaiting_engineering: 'awaiting engineering',
};

async function portalOrders(db: Db, viewer: SessionUser, id?: number): Promise<PortalOrder[]> {
  const rows = await orderRepo.listOrders(db, { customerId: scope(viewer), id });
  const ids = rows.map((r) => r.order.id);
  const lines = await repo.linesOfOrders(db, ids);
  const wos = await repo.workOrdersOfOrders(db, ids);
  const shipped = await repo.shippedByWorkOrder(db, wos.map((w) => w.id));
  const scrapped = await repo.scrappedByWorkOrder(db, wos.map((w) => w.id));
  const shipments = await repo.shipmentIdsOfOrders(db, ids);
  // The floor's late / at-risk flags of the open work orders (the same estimate the board shows).
  const flags = new Map<number, { late: boolean; atRisk: boolean }[]>();
  if (ids.length) {
    for (const { summary: w } of await summaries(db, viewer, { orderIds: ids, excludeStages: ['shipped'] })) {
      flags.set(w.order.id, [...(flags.get(w.order.id) ?? []), { late: w.late, atRisk: w.atRisk }]);
    }
  }
  const today = localDate();
  const toLine = (l: (typeof lines)[number]): PortalLine => {
    const progress = Object.fromEntries(PORTAL_PROGRESS.map((p) => [p, 0])) as Record<PortalProgress, number>;
    const stages = new Set<string>();
    let released = 0;
    for (const w of wos.filter((x) => x.lineId === l.id)) {
      released += w.quantity;
      const out = shipped.get(w.id) ?? 0;
      const rest = Math.max(0, w.quantity - (scrapped.get(w.id) ?? 0) - out);
      progress.shipped += out;
      if (w.stage === 'shipped' || rest === 0) continue;
      if (w.stage === 'packing') progress.tested += rest;
      else if (w.stage === 'engineering') progress.awaiting_engineering += rest;
      else {
        progress.in_production += rest;
        const word = PORTAL_STAGE_WORDS[w.stage];
        if (word) stages.add(word);
      }
    }
    progress.awaiting_engineering += Math.max(0, l.quantity - released);
    const productionStages = ['winding', 'finishing', 'testing'].filter((s) => stages.has(s));
    const parts = (['shipped', 'tested', 'in_production', 'awaiting_engineering'] as const)
      .filter((p) => progress[p] > 0)
      .map((p) => `${progress[p]} ${PROGRESS_WORDS[p]}${p === 'in_production' && productionStages.length ? ` (${productionStages.join(', ')})` : ''}`);
    return {
      id: l.id,
      lineNo: l.lineNo,
      title: l.title,
      customerPartNumber: l.customerPartNumber,
      quantity: l.quantity,
      progress,
      summary: parts.join(', ') || 'nothing open',
      productionStages,
    };
  };
  return rows.map(({ order: o }) => ({
    id: o.id,
    number: o.number,
    purchaseOrder: o.purchaseOrder,
    orderDate: o.orderDate,
    dueDate: o.dueDate,
    status: ORDER_STATUS_LABELS[o.status],
    statusCode: o.status,
    lines: lines.filter((l) => l.orderId === o.id).map(toLine),
    shipmentCount: shipments.get(o.id)?.length ?? 0,
    schedule: scheduleOf(o.status, o.dueDate, today, flags.get(o.id) ?? []),
  }));
}

export async function listPortalOrders(db: Db, viewer: SessionUser): Promise<PortalOrder[]> {
  return (await portalOrders(db, viewer)).sort((a, b) => b.orderDate.localeCompare(a.orderDate) || b.id - a.id);
}

export async function getPortalOrder(db: Db, viewer: SessionUser, id: number): Promise<PortalOrderDetail> {
  const [order] = await portalOrders(db, viewer, id);
  if (!order) throw notFound('No such order');
  const ids = (await repo.shipmentIdsOfOrders(db, [id])).get(id) ?? [];
  return { ...order, shipments: ids.length ? await portalShipments(db, viewer, { ids }) : [] };
}

async function portalShipments(db: Db, viewer: SessionUser, f: { id?: number; ids?: number[] }): Promise<PortalShipment[]> {
  const rows = await repo.listShipments(db, { ...f, customerId: scope(viewer) });
  const ids = rows.map((r) => r.shipment.id);
  const items = await itemsByShipment(db, ids);
  const docs = await repo.documentsOf(db, ids);
  return rows.map(({ shipment: s }) => ({
    id: s.id,
    number: s.number,
    shipDate: s.shipDate,
    carrier: s.carrier,
    service: s.service,
    trackingNumber: s.trackingNumber,
    packages: s.packages.length,
    shipTo: { ...EMPTY_ADDRESS, ...s.shipTo },
    items: (items.get(s.id) ?? []).map((i) => ({
      orderId: i.order.id,
      orderNumber: i.order.number,
      purchaseOrder: i.order.purchaseOrder,
      lineNo: i.line.lineNo,
      lineTitle: i.line.title,
      customerPartNumber: i.line.customerPartNumber,
      quantity: i.item.quantity,
      serials: i.item.serials,
    })),
    documents: documentInfos(
      s.id,
      docs.filter((d) => d.shipmentId === s.id),
    // Always a link: the download draws a document that is not drawn yet.
    ).map((d) => ({ kind: d.kind, label: SHIPMENT_DOCUMENT_LABELS[d.kind], downloadUrl: documentUrl(s.id, d.kind) })),
  }));
}

export const listPortalShipments = (db: Db, viewer: SessionUser) => portalShipments(db, viewer, {});

export async function getPortalShipment(db: Db, viewer: SessionUser, id: number): Promise<PortalShipment> {
  const [s] = await portalShipments(db, viewer, { id });
  if (!s) throw notFound('No such shipment');
  return s;
}
