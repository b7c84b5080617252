/**
 * API contract of work orders: the batches a released build sheet becomes, each travelling the
 * shop through the stages (stages.ts). Imports nothing but zod (and other contracts).
 *
 * Routes (roles):
 *   GET /api/work-orders       every staff role; a customer only its own company's → { workOrders: WorkOrderSummary[] }
 *   GET /api/work-orders/:id   same roles; another company's work order is 404    → WorkOrderDetail
 * Work orders are created only by releasing a build sheet (build-sheets.ts). Stage moves,
 * assignment, priority and stations are floor.ts.
 */
import { z } from 'zod';
import { buildSheetEssentials } from './build-sheet-status';
import { STAGES, stageSchema } from './stages';

/** Largest id the database holds (PostgreSQL integer). */
const ID_MAX = 2_147_483_647;

/**
 * Priority of a work order on the floor: a small integer, higher goes first. A released work
 * order starts at PRIORITY_DEFAULT; the foreman changes it (floor issue).
 */
export const PRIORITIES = [0, 1, 2] as const;
export type Priority = (typeof PRIORITIES)[number];
export const PRIORITY_DEFAULT: Priority = 0;
export const PRIORITY_LABELS: Record<Priority, string> = { 0: 'Normal', 1: 'High', 2: 'Urgent' };

/** Work-order numbers: "WO-" + two-digit year + "-" + five-digit shop-wide sequence, e.g. WO-26-00042. */
export const WORK_ORDER_NUMBER_PATTERN = /^WO-\d{2}-\d{5,}$/;

const id = (what: string) =>
  z.coerce
    .number({ error: `${what}: an id` })
    .pipe(z.int({ error: `${what}: an id` }).positive(`${what}: an id`).max(ID_MAX, `${what}: an id`));

const isoDate = (what: string) =>
  z
    .string({ error: `${what}: a date such as 2026-03-14` })
    .refine((s) => /^\d{4}-\d{2}-\d{2}$/.test(s) && !Number.isNaN(new Date(`${s}T00:00:00Z`).getTime()), `${what}: a date such as 2026-03-14`);
const bool = (what: string) => z.enum(['true', 'false'], { error: `${what}: true or false` }).transform((s) => s === 'true');
/** An id, or `none` for "nobody / no station assigned". */
const idOrNone = (what: string) => z.union([z.literal('none'), id(what)], { error: `${what}: an id or none` });
/** Query-string field builders the board's contract shares (board.ts). */
export const queryFields = { id, isoDate, bool, idOrNone };

/**
 * GET /api/work-orders query: all optional; `stage` takes one stage or several, comma-separated.
 * The board's filters: `assignee` and `station` take an id or `none`; `customer` a customer id
 * (a customer-role reader sees only its own company whatever it asks); `late` / `atRisk` true or
 * false; `dueFrom` / `dueTo` bound the due date (YYYY-MM-DD, inclusive); `number` finds one
 * work order by its number.
 */
export const listWorkOrdersQuery = z.object({
  stage: z
    .string()
    .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
    .pipe(z.array(z.enum(STAGES, { error: `Stage: one of ${STAGES.join(', ')}` })))
    .optional(),
  orderId: id('Order').optional(),
  lineId: id('Line').optional(),
  assignee: idOrNone('Assignee').optional(),
  station: idOrNone('Station').optional(),
  customer: id('Customer').optional(),
  late: bool('Late').optional(),
  atRisk: bool('At risk').optional(),
  dueFrom: isoDate('Due from').optional(),
  dueTo: isoDate('Due to').optional(),
  /** An exact work-order number, any letter case (what a scanner types). */
  number: z.string().trim().toUpperCase().max(24, 'Number: at most 24 characters').optional(),
});
export type ListWorkOrdersQuery = z.infer<typeof listWorkOrdersQuery>;

const person = z.object({ id: z.number().int(), name: z.string() });

/** What a release answers for each new work order. */
export const workOrderCreated = z.object({
  id: z.number().int(),
  number: z.string(),
  stage: stageSchema,
  quantity: z.number().int(),
  dueDate: z.string(),
  version: z.number().int(),
});
export type WorkOrderCreated = z.infer<typeof workOrderCreated>;

export const workOrderSummary = z.object({
  id: z.number().int(),
  number: z.string(),
  stage: stageSchema,
  /** Optimistic locking: send it back with a change; a stale one is 409 (floor issue). */
  version: z.number().int(),
  quantity: z.number().int(),
  /** From the order's requested ship date. */
  dueDate: z.string(),
  priority: z.number().int(),
  /** Absent for customer-role readers. */
  assignee: person.nullable().optional(),
  /** The station it is assigned to (floor.ts); null when none. */
  station: person.nullable(),
  order: z.object({ id: z.number().int(), number: z.string(), purchaseOrder: z.string(), customer: z.object({ id: z.number().int(), name: z.string() }) }),
  line: z.object({ id: z.number().int(), lineNo: z.number().int(), title: z.string(), tolerancePercent: z.number() }),
  buildSheetId: z.number().int(),
  createdAt: z.string(),
  /** When it entered its current stage (the age in stage is now − this). */
  enteredStageAt: z.string(),
  /**
   * Late: its due date is before today and it has not shipped.
   * At risk: not late, not shipped, and estimatedHours exceed the working hours left before the
   * end of its due date (working days Mon–Fri from today through the due date × the shop's shift
   * hours per day; common practice, no published source).
   */
  late: z.boolean(),
  atRisk: z.boolean(),
  /** Estimated hours still to do (see FloorLoad in floor.ts for the rule); 0 when shipped. */
  estimatedHours: z.number(),
  /** While on_hold: the reason given with the hold. Absent for customer-role readers. */
  holdReason: z.string().nullable().optional(),
  /**
   * The stages the signed-in user may move it to now (the move table; notes and winding records
   * may still be asked for). Absent for customer-role readers.
   */
  allowedMoves: z.array(stageSchema).optional(),
});
export type WorkOrderSummary = z.infer<typeof workOrderSummary>;
export const workOrderListResponse = z.object({ workOrders: z.array(workOrderSummary) });

/**
 * What an event records: the release (fromStage null), a stage move, an assignment (fromStage =
 * toStage; note "assigned to X at station Y"), a priority change (fromStage = toStage), or part
 * of its units leaving in a shipment while the rest stay in packing (fromStage = toStage; note
 * names the units and the shipment). A shipment that takes every unit writes a move to shipped.
 */
export const WORK_ORDER_EVENT_KINDS = ['release', 'move', 'assign', 'priority', 'shipment'] as const;
export type WorkOrderEventKind = (typeof WORK_ORDER_EVENT_KINDS)[number];

/** One row of a work order's history: a stage move (or the release: fromStage null). Never rewritten. */
export const workOrderEventRecord = z.object({
  id: z.number().int(),
  kind: z.enum(WORK_ORDER_EVENT_KINDS),
  at: z.string(),
  /** Who; absent for customer-role readers. */
  user: person.nullable().optional(),
  fromStage: stageSchema.nullable(),
  toStage: stageSchema,
  /** Absent for customer-role readers. */
  note: z.string().optional(),
  stationId: z.number().int().nullable(),
  /** The station with its name; absent for customer-role readers. */
  station: person.nullable().optional(),
  /** Assignment events: who it was assigned to (null = unassigned); absent for customer-role readers and other kinds. */
  assignee: person.nullable().optional(),
  /** Leaving winding: the turns counter reading and the spool lot actually used; null otherwise; absent for customer-role readers. */
  turnsCounter: z.number().int().nullable().optional(),
  spoolLot: z.string().nullable().optional(),
});
export type WorkOrderEventRecord = z.infer<typeof workOrderEventRecord>;

export const workOrderDetail = workOrderSummary.extend({
  /** The released sheet's essentials; null for customer-role readers (the winding design is the shop's own). */
  buildSheet: buildSheetEssentials.nullable(),
  /** Oldest first. */
  events: z.array(workOrderEventRecord),
});
export type WorkOrderDetail = z.infer<typeof workOrderDetail>;
