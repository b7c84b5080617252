/**
 * API contract of customer orders, their lines, attachments and audit trail. Imports nothing
 * but zod (and the coil contract, which imports nothing but zod). Quantities in a line's
 * requirement are SI: metres, volts, amperes, newtons, tesla, ohms; temperatures in °C.
 */
import { z } from 'zod';
import { BobbinSchema, CoilSpecSchema, DriveSchema, MagneticCircuitSchema, WireSizeSchema } from './coil';
import { lineBuildSheetSummary } from './build-sheet-status';

export const ORDER_STATUSES = ['entered', 'acknowledged', 'in_production', 'partly_shipped', 'shipped', 'closed', 'cancelled'] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];

/** Plain words for each status, for tables and headings. */
export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  entered: 'Entered',
  acknowledged: 'Acknowledged',
  in_production: 'In production',
  partly_shipped: 'Partly shipped',
  shipped: 'Shipped',
  closed: 'Closed',
  cancelled: 'Cancelled',
};

/** Statuses in which an order is finished with: never late, no more changes to its lines. */
export const ORDER_DONE_STATUSES: readonly OrderStatus[] = ['shipped', 'closed', 'cancelled'];

/** Resistance tolerance of a line when none is stated, ± % (common practice, no published source). */
export const DEFAULT_TOLERANCE_PERCENT = 10;

/** Upload limit for drawings and specs, bytes (25 MB). */
export const ATTACHMENT_MAX_BYTES = 25 * 1024 * 1024;
/** What an upload may be, by content (not by name). */
export const ATTACHMENT_TYPES = {
  'application/pdf': 'PDF',
  'image/png': 'PNG',
  'image/jpeg': 'JPEG',
  'image/vnd.dxf': 'DXF',
  'model/step': 'STEP',
} as const;
export type AttachmentContentType = keyof typeof ATTACHMENT_TYPES;

/** Largest id the database holds (PostgreSQL integer). */
const ID_MAX = 2_147_483_647;
const id = (what: string) => z.int({ error: `${what}: an id` }).positive(`${what}: an id`).max(ID_MAX, `${what}: an id`);

const positive = (what: string) => z.number({ error: `${what} must be a positive number` }).positive(`${what} must be a positive number`);
const date = (what: string) =>
  z
    .string({ error: `${what}: enter a date` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${what}: a date as YYYY-MM-DD`)
    .refine((s) => {
      const d = new Date(`${s}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
    }, `${what}: no such date`)
    .refine((s) => s >= '1900-01-01' && s <= '2999-12-31', `${what}: a date between 1900 and 2999`);
const note = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);

// ── The requirement of an order line ────────────────────────────────────────────────────────

const spec = CoilSpecSchema.shape;

/** What the coil must do. A pull is stated at the magnetic circuit's air gap. */
export const RequirementTargetSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('ampereTurns'), ampereTurns: positive('ampere-turns') }),
    z.object({ kind: z.literal('pull'), force: positive('pull force') }),
    z.object({
      kind: z.literal('field'),
      fluxDensity: positive('flux density'),
      /** 'centre': air-core field at the winding's centre; 'gap': in the air gap of the magnetic circuit. */
      at: z.enum(['centre', 'gap'], { error: "where the field is wanted: 'centre' or 'gap'" }),
    }),
  ],
  { error: "the target kind must be 'ampereTurns', 'pull' or 'field'" },
);
export type RequirementTarget = z.infer<typeof RequirementTargetSchema>;

/** A conductor the customer asks for; the engineer chooses whatever is left open. */
export const ConductorPreferenceSchema = z.object({
  material: spec.conductor.optional(),
  wire: WireSizeSchema.optional(),
  insulationGrade: spec.insulationGrade.optional(),
});

/**
 * What a customer states for one line: the parts of the engine's CoilSpec a customer knows
 * (drive, duty cycle, ambient, insulation class, the bobbin or envelope, a conductor preference,
 * the iron around the coil) and a target. Built from the engine contract's own schemas.
 */
export const RequirementSchema = z
  .object({
    drive: DriveSchema,
    dutyCycle: spec.dutyCycle,
    ambient: spec.ambient,
    insulationClass: spec.insulationClass,
    /** 'bobbin': wind on these bobbin dimensions; 'envelope': the finished coil must fit inside them. */
    fit: z.enum(['bobbin', 'envelope'], { error: "fit must be 'bobbin' or 'envelope'" }).default('bobbin'),
    bobbin: BobbinSchema,
    conductor: ConductorPreferenceSchema.optional(),
    magneticCircuit: MagneticCircuitSchema.optional(),
    /** A DC resistance at 20 °C the customer's electronics expect, Ω (the line's tolerance applies). */
    resistance: positive('resistance').optional(),
    target: RequirementTargetSchema,
  })
  .superRefine((r, ctx) => {
    const needsCircuit =
      r.target.kind === 'pull' ? 'a pull target' : r.target.kind === 'field' && r.target.at === 'gap' ? 'a field in the gap' : null;
    if (needsCircuit && !r.magneticCircuit) {
      ctx.addIssue({ code: 'custom', path: ['magneticCircuit'], message: `${needsCircuit} needs a magnetic circuit (the iron and its air gap)` });
    }
    if (r.target.kind === 'pull' && r.magneticCircuit && !(r.magneticCircuit.airGap > 0 && r.magneticCircuit.gapCount > 0)) {
      ctx.addIssue({ code: 'custom', path: ['magneticCircuit', 'airGap'], message: 'state the air gap the pull is needed at' });
    }
  });
export type Requirement = z.infer<typeof RequirementSchema>;
export type RequirementInput = z.input<typeof RequirementSchema>;

// ── Orders and lines: requests ──────────────────────────────────────────────────────────────

export const orderLineInput = z.object({
  /** Present when changing an existing line; absent for a new one. */
  id: id('Line').optional(),
  quantity: z.int({ error: 'Quantity must be a whole number' }).min(1, 'Quantity must be at least 1').max(100_000, 'Quantity: at most 100000'),
  title: note(200, 'Title').min(1, 'Enter a title the customer would recognise'),
  customerPartNumber: note(80, 'Customer part number').default(''),
  requirement: RequirementSchema,
  /** ± % on the resistance at 20 °C. */
  tolerancePercent: z
    .number({ error: 'Tolerance must be a number of per cent' })
    .positive('Tolerance must be above 0 %')
    .max(50, 'Tolerance: at most ±50 %')
    .default(DEFAULT_TOLERANCE_PERCENT),
  terminationNotes: note(2000, 'Termination notes').default(''),
  leadNotes: note(2000, 'Lead notes').default(''),
});
export type OrderLineInput = z.input<typeof orderLineInput>;
export type OrderLineValues = z.output<typeof orderLineInput>;

const lines = z.array(orderLineInput, { error: 'Lines must be a list' }).min(1, 'An order needs at least one line').max(200, 'At most 200 lines');

export const createOrderRequest = z
  .object({
    customerId: z.int({ error: 'Choose the customer' }).positive('Choose the customer').max(ID_MAX, 'Choose the customer'),
    purchaseOrder: note(60, 'Purchase order').min(1, "Enter the customer's purchase-order number"),
    /** Defaults to today. */
    orderDate: date('Order date').optional(),
    /** The ship date the customer asks for. */
    dueDate: date('Requested ship date'),
    /** Internal notes; never shown to the customer. */
    notes: note(4000, 'Notes').default(''),
    lines,
  })
  .superRefine((o, ctx) => {
    if (o.orderDate && o.dueDate < o.orderDate) {
      ctx.addIssue({ code: 'custom', path: ['dueDate'], message: 'The requested ship date cannot be before the order date' });
    }
  });
export type CreateOrderRequest = z.infer<typeof createOrderRequest>;

/**
 * A change to an order. `lines`, when given, is the whole new list (only while the order is
 * entered): entries with an `id` change that line, entries without one are added, lines left
 * out are removed; line numbers follow the list order.
 */
export const updateOrderRequest = z
  .object({
    purchaseOrder: note(60, 'Purchase order').min(1, "Enter the customer's purchase-order number"),
    orderDate: date('Order date'),
    dueDate: date('Requested ship date'),
    notes: note(4000, 'Notes'),
    lines,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateOrderRequest = z.infer<typeof updateOrderRequest>;

export const cancelOrderRequest = z.object({
  reason: note(500, 'Reason').min(1, 'Say why the order is cancelled'),
});
export type CancelOrderRequest = z.infer<typeof cancelOrderRequest>;

const flag = z.enum(['true', 'false'], { error: "true or false" }).transform((v) => v === 'true');

export const listOrdersQuery = z
  .object({
    /** One status or several, comma-separated. */
    status: z
      .string()
      .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
      .pipe(z.array(z.enum(ORDER_STATUSES, { error: `Status: one of ${ORDER_STATUSES.join(', ')}` })))
      .optional(),
    customerId: z.coerce.number({ error: 'Customer: an id' }).pipe(id('Customer')).optional(),
    dueFrom: date('Due from').optional(),
    dueTo: date('Due to').optional(),
    late: flag.optional(),
    /** Matches the order number, the purchase order or the customer's name (any case). */
    q: note(100, 'Search').optional(),
  })
  .superRefine((q, ctx) => {
    if (q.dueFrom && q.dueTo && q.dueTo < q.dueFrom) {
      ctx.addIssue({ code: 'custom', path: ['dueTo'], message: 'Due to cannot be before due from' });
    }
  });
export type ListOrdersQuery = z.infer<typeof listOrdersQuery>;

// ── Responses ───────────────────────────────────────────────────────────────────────────────

const person = z.object({ id: z.number().int(), name: z.string() });

export const orderSummary = z.object({
  id: z.number().int(),
  number: z.string(),
  customer: z.object({ id: z.number().int(), name: z.string() }),
  purchaseOrder: z.string(),
  status: z.enum(ORDER_STATUSES),
  orderDate: z.string(),
  /** Requested ship date. */
  dueDate: z.string(),
  lineCount: z.number().int(),
  /** Total quantity over the lines. */
  unitCount: z.number().int(),
  /** Due date past and not shipped, closed or cancelled. */
  late: z.boolean(),
  acknowledgedAt: z.string().nullable(),
  updatedAt: z.string(),
});
export type OrderSummary = z.infer<typeof orderSummary>;
export const orderListResponse = z.object({ orders: z.array(orderSummary) });

export const orderLineRecord = z.object({
  id: z.number().int(),
  lineNo: z.number().int(),
  quantity: z.number().int(),
  title: z.string(),
  customerPartNumber: z.string(),
  requirement: RequirementSchema,
  tolerancePercent: z.number(),
  terminationNotes: z.string(),
  leadNotes: z.string(),
  /**
   * null until engineering has drafted one; else the newest version's {id, version, status} and
   * the released sheet's essentials (see lineBuildSheetSummary in build-sheets.ts).
   */
  buildSheet: lineBuildSheetSummary.nullable(),
  /**
   * Staff only (GET /api/orders/:id): units of this line scrapped at test (test records); the
   * shortfall against `quantity` the shop must make up.
   */
  scrapped: z.number().int().optional(),
});
export type OrderLineRecord = z.infer<typeof orderLineRecord>;

export const attachmentRecord = z.object({
  id: z.number().int(),
  lineId: z.number().int().nullable(),
  filename: z.string(),
  contentType: z.string(),
  size: z.number().int(),
  sha256: z.string(),
  createdAt: z.string(),
  /** Absent for customer-role readers. */
  uploadedBy: person.nullable().optional(),
});
export type AttachmentRecord = z.infer<typeof attachmentRecord>;

/** What an upload answers. */
export const attachmentCreated = z.object({ id: z.number().int(), filename: z.string(), contentType: z.string(), size: z.number().int() });
export type AttachmentCreated = z.infer<typeof attachmentCreated>;

export const ORDER_EVENT_KINDS = [
  'created',
  'updated',
  'acknowledged',
  'cancelled',
  'status_changed',
  'attachment_added',
  'attachment_removed',
] as const;
export type OrderEventKind = (typeof ORDER_EVENT_KINDS)[number];

export const orderEventRecord = z.object({
  id: z.number().int(),
  at: z.string(),
  kind: z.enum(ORDER_EVENT_KINDS),
  /** Who did it; absent for customer-role readers. */
  actor: person.nullable().optional(),
  /** field → [old, new] */
  changes: z.record(z.string(), z.tuple([z.unknown(), z.unknown()])),
  note: z.string().optional(),
});
export type OrderEventRecord = z.infer<typeof orderEventRecord>;

export const orderDetail = orderSummary.extend({
  /** Internal; absent for customer-role readers. */
  notes: z.string().optional(),
  acknowledgedBy: person.nullable().optional(),
  cancelledAt: z.string().nullable(),
  cancelReason: z.string().nullable().optional(),
  createdAt: z.string(),
  createdBy: person.nullable().optional(),
  lines: z.array(orderLineRecord),
  attachments: z.array(attachmentRecord),
  events: z.array(orderEventRecord),
  /** What may be done with the order in its present status (the server checks again). */
  can: z.object({ edit: z.boolean(), editLines: z.boolean(), acknowledge: z.boolean(), cancel: z.boolean(), attach: z.boolean() }),
});
export type OrderDetail = z.infer<typeof orderDetail>;

/** The text fields of an upload (multipart, beside the `file` field). */
export const attachmentUploadFields = z.object({
  /** The line the file belongs to; empty or absent for the whole order. */
  lineId: z
    .string()
    .trim()
    .regex(/^\d{0,9}$/, 'Line: an id')
    .transform((s) => (s === '' ? null : Number(s)))
    .optional(),
});
