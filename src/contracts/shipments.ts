/**
 * API contract of shipping: the ready-to-ship list, shipments, their documents (packing list and
 * certificate of conformance), and the customer's read-only view of their own orders and
 * shipments. Imports nothing but zod (and the customers contract's address). SI throughout:
 * masses in kg, lengths in mm; the client converts for display.
 *
 * Routes (roles):
 *   GET  /api/shipping/ready                      shipping, foreman, admin        → ReadyToShip
 *   POST /api/shipments                           shipping, admin   body CreateShipmentRequest → 201 ShipmentRecord
 *   GET  /api/shipments                           shipping, foreman, office, admin  query ListShipmentsQuery → { shipments: ShipmentSummary[] }
 *   GET  /api/shipments/:id                       shipping, foreman, office, admin → ShipmentRecord
 *   GET  /api/shipments/:id/documents/:kind       shipping, foreman, office, admin, customer (own company) → the PDF
 *   POST /api/shipments/:id/documents             shipping, admin   → 202 { jobId } (draw both again)
 *   GET  /api/portal/orders                       customer          → { orders: PortalOrder[] }
 *   GET  /api/portal/orders/:id                   customer (own)    → PortalOrderDetail
 *   GET  /api/portal/shipments                    customer          → { shipments: PortalShipment[] }
 *   GET  /api/portal/shipments/:id                customer (own)    → PortalShipment
 *
 * A shipment is the only way a work order reaches `shipped`. Creating one, moving its work
 * orders, updating the orders' status and writing the customer's outbox notice happen in one
 * transaction. A work order may ship in parts: name the serials to ship; it moves to `shipped`
 * once every good unit has shipped.
 *
 * The customer's routes answer only their own company's records, with nothing internal: no
 * costs, internal notes, floor staff names or other companies. Another company's id answers 404.
 */
import { z } from 'zod';
import { addressSchema, type Address } from './customers';
import type { Stage } from './stages';

const ID_MAX = 2_147_483_647;
const id = (what: string) => z.int({ error: `${what}: an id` }).positive(`${what}: an id`).max(ID_MAX, `${what}: an id`);
const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);
const positive = (what: string, max: number) =>
  z.number({ error: `${what}: a number` }).finite(`${what}: a finite number`).positive(`${what}: more than zero`).max(max, `${what}: at most ${max}`);
const isoDate = (what: string) =>
  z
    .string({ error: `${what}: a date` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${what}: a date as YYYY-MM-DD`)
    .refine((s) => {
      const d = new Date(`${s}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
    }, `${what}: not a real date`);

/** The documents a shipment carries. */
export const SHIPMENT_DOCUMENT_KINDS = ['packing_list', 'certificate'] as const;
export type ShipmentDocumentKind = (typeof SHIPMENT_DOCUMENT_KINDS)[number];
export const SHIPMENT_DOCUMENT_LABELS: Record<ShipmentDocumentKind, string> = {
  packing_list: 'Packing list',
  certificate: 'Certificate of conformance',
};
export const shipmentDocumentKind = z.enum(SHIPMENT_DOCUMENT_KINDS, { error: `Document: one of ${SHIPMENT_DOCUMENT_KINDS.join(', ')}` });

/** How far ahead a ship date may be entered, days (a shipment records what left the building). */
export const SHIP_DATE_MAX_DAYS_AHEAD = 7;

/** One package: its mass and outside dimensions (SI: kg, mm). */
export const packageInput = z.object({
  weight: positive('Weight', 10_000),
  length: positive('Length', 10_000),
  width: positive('Width', 10_000),
  height: positive('Height', 10_000),
});
export type PackageInput = z.infer<typeof packageInput>;

/**
 * POST /api/shipments. `workOrderIds`: the work orders shipped, all of one customer. A work
 * order ships whole (every good unit not shipped yet) unless `partial` names the serials to ship.
 */
export const createShipmentRequest = z
  .object({
    workOrderIds: z.array(id('Work order')).min(1, 'Choose at least one work order').max(200, 'At most 200 work orders in one shipment'),
    partial: z
      .array(
        z.object({
          workOrderId: id('Work order'),
          serials: z.array(text(60, 'Serial').pipe(z.string().min(1, 'Serial: empty'))).min(1, 'Name at least one serial').max(500, 'At most 500 serials'),
        }),
      )
      .max(200)
      .optional(),
    /** Where it goes; defaults on the client to the customer's shipping (else billing) address. */
    shipTo: addressSchema.refine((a) => Object.values(a).some((v) => v !== ''), { message: 'Enter the ship-to address' }),
    /** Who receives it at the customer, printed on the packing list. */
    attention: text(120, 'Attention').default(''),
    carrier: text(60, 'Carrier').pipe(z.string().min(1, 'Enter the carrier')),
    service: text(60, 'Service').default(''),
    /** Empty for deliveries without tracking (own van, customer pick-up). */
    trackingNumber: text(80, 'Tracking number').default(''),
    packages: z.array(packageInput).min(1, 'At least one package').max(200, 'At most 200 packages'),
    shipDate: isoDate('Ship date'),
    /** Printed on the packing list; the customer sees it. */
    packingNote: text(1000, 'Packing note').default(''),
  })
  .superRefine((v, ctx) => {
    const ids = new Set<number>();
    v.workOrderIds.forEach((w, i) => {
      if (ids.has(w)) ctx.addIssue({ code: 'custom', path: ['workOrderIds', i], message: 'The same work order twice' });
      ids.add(w);
    });
    const seen = new Set<number>();
    (v.partial ?? []).forEach((p, i) => {
      if (!ids.has(p.workOrderId)) ctx.addIssue({ code: 'custom', path: ['partial', i, 'workOrderId'], message: 'Not one of the shipment’s work orders' });
      if (seen.has(p.workOrderId)) ctx.addIssue({ code: 'custom', path: ['partial', i, 'workOrderId'], message: 'The same work order twice' });
      seen.add(p.workOrderId);
      if (new Set(p.serials).size !== p.serials.length) ctx.addIssue({ code: 'custom', path: ['partial', i, 'serials'], message: 'A serial named twice' });
    });
  });
export type CreateShipmentRequest = z.infer<typeof createShipmentRequest>;
export type CreateShipmentInput = z.input<typeof createShipmentRequest>;

export const listShipmentsQuery = z.object({
  customerId: z.coerce.number().int().positive().optional(),
  /** Ship date on or after / on or before. */
  from: isoDate('From').optional(),
  to: isoDate('To').optional(),
  /** Matches the shipment number, tracking number, order number or PO (any case). */
  q: text(80, 'Search').optional(),
});
export type ListShipmentsQuery = z.infer<typeof listShipmentsQuery>;

/**
 * A refused POST /api/shipments (422) says which work orders and why: `error.fields.workOrderIds`
 * in words ("WO-26-00012: It is in testing, not packing; …"), and `error.current.workOrders` one entry
 * per refused work order (also for another customer's work order, an unknown id, a serial that
 * shipped already or is not a passed unit). A ship date too far ahead names `fields.shipDate`.
 */
export type ShipmentRefusal = { workOrderId: number; number: string; reasons: string[] };

/** One work order waiting in packing, and whether it may ship now (the server decides). */
/** The order line a work order builds, as shipping documents and lists name it. */
export type LineFacts = { lineId: number; lineNo: number; lineTitle: string; customerPartNumber: string };

export type ReadyWorkOrder = LineFacts & {
  id: number;
  number: string;
  /** Units still to ship: good units minus those shipped already. */
  quantity: number;
  /** Serials of the units that may ship (passed or dispositioned use-as-is, not shipped yet). */
  serials: string[];
  ready: boolean;
  /** Why not, in plain words (empty when ready). */
  reasons: string[];
  inspectedBy: { id: number; name: string } | null;
  inspectedAt: string | null;
};
export type ReadyToShip = {
  customers: {
    id: number;
    name: string;
    /** The customer's shipping address, else the billing address (null when neither is known). */
    shipTo: Address | null;
    orders: { id: number; number: string; purchaseOrder: string; dueDate: string; late: boolean; workOrders: ReadyWorkOrder[] }[];
  }[];
};

export type ShipmentDocumentInfo = {
  kind: ShipmentDocumentKind;
  state: 'pending' | 'ready';
  downloadUrl: string | null;
  sha256: string | null;
  size: number | null;
  pages: number | null;
  createdAt: string | null;
};

export type ShipmentItem = LineFacts & {
  workOrderId: number;
  workOrderNumber: string;
  orderId: number;
  orderNumber: string;
  purchaseOrder: string;
  quantity: number;
  serials: string[];
};

export type ShipmentSummary = {
  id: number;
  /** "SH-<year>-<sequence>". */
  number: string;
  customer: { id: number; name: string };
  orders: { id: number; number: string; purchaseOrder: string }[];
  carrier: string;
  service: string;
  trackingNumber: string;
  shipDate: string;
  units: number;
  packages: number;
};

export type ShipmentRecord = ShipmentSummary & {
  shipTo: Address;
  attention: string;
  packingNote: string;
  packageList: PackageInput[];
  /** Total mass, kg. */
  totalWeight: number;
  items: ShipmentItem[];
  documents: ShipmentDocumentInfo[];
  /** The customer's shipment notice (staff only). */
  notification: { status: string; recipients: number; sentAt: string | null } | null;
  createdBy: { id: number; name: string } | null;
  createdAt: string;
};

/** The customer's words for where a line stands. */
export const PORTAL_PROGRESS = ['awaiting_engineering', 'in_production', 'tested', 'shipped'] as const;
export type PortalProgress = (typeof PORTAL_PROGRESS)[number];
export const PORTAL_PROGRESS_LABELS: Record<PortalProgress, string> = {
  awaiting_engineering: 'Awaiting engineering',
  in_production: 'In production',
  tested: 'Tested, awaiting shipment',
  shipped: 'Shipped',
};

/**
 * The simple stage words a customer sees for units in production: ready and winding → winding;
 * terminating, impregnating, curing → finishing; testing and inspection → testing. Holds and
 * rework are not named (those units count as in production without a word); packing counts as
 * tested, engineering as awaiting engineering.
 */
export const PORTAL_STAGE_WORDS: Record<Stage, string | null> = {
  engineering: null,
  ready: 'winding',
  winding: 'winding',
  terminating: 'finishing',
  impregnating: 'finishing',
  curing: 'finishing',
  testing: 'testing',
  inspection: 'testing',
  packing: null,
  shipped: null,
  on_hold: null,
  rework: null,
};

export type PortalLine = {
  id: number;
  lineNo: number;
  title: string;
  customerPartNumber: string;
  quantity: number;
  /** Units in each state; they add up to the ordered quantity less any the shop scrapped and is remaking. */
  progress: Record<PortalProgress, number>;
  /** The line in plain words, e.g. "4 shipped, 6 in production (winding)". */
  summary: string;
  /** The simple stage words of units in production (e.g. "winding", "finishing", "testing"). */
  productionStages: string[];
};

/**
 * Where an open order stands against its requested ship date, from the shop's own floor estimate
 * (server/floor/estimate.ts: a work order is at risk when the hours left exceed the working hours
 * before its due date): on_schedule, behind (past the date, or at risk), or done.
 */
export const PORTAL_SCHEDULES = ['on_schedule', 'behind', 'done'] as const;
export type PortalSchedule = (typeof PORTAL_SCHEDULES)[number];

export type PortalOrder = {
  id: number;
  number: string;
  purchaseOrder: string;
  orderDate: string;
  /** The requested ship date. */
  dueDate: string;
  /** The status in plain words (ORDER_STATUS_LABELS). */
  status: string;
  statusCode: string;
  lines: PortalLine[];
  shipmentCount: number;
  schedule: PortalSchedule;
};

export type PortalShipment = {
  id: number;
  number: string;
  shipDate: string;
  carrier: string;
  service: string;
  trackingNumber: string;
  packages: number;
  shipTo: Address;
  items: { orderId: number; orderNumber: string; purchaseOrder: string; lineNo: number; lineTitle: string; customerPartNumber: string; quantity: number; serials: string[] }[];
  documents: { kind: ShipmentDocumentKind; label: string; downloadUrl: string | null }[];
};

export type PortalOrderDetail = PortalOrder & { shipments: PortalShipment[] };
