/**
 * API contract of work orders: the batches a released build sheet becomes, each travelling the
 * shop through the stages (stages.ts). Imports nothing but zod (and other contracts).
 *
 * Routes (roles):
 *   GET /api/work-orders       every staff role; a customer only its own company's → { workOrders: WorkOrderSummary[] }
 *   GET /api/work-orders/:id   same roles; another company's work order is 404    → WorkOrderDetail
 * Work orders are created only by releasing a build sheet (build-sheets.ts). The floor issue adds
 * stage moves, assignment and stations.
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

/** GET /api/work-orders query: all optional; `stage` takes one stage or several, comma-separated. */
export const listWorkOrdersQuery = z.object({
  stage: z
    .string()
    .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
    .pipe(z.array(z.enum(STAGES, { error: `Stage: one of ${STAGES.join(', ')}` })))
    .optional(),
  orderId: id('Order').optional(),
  lineId: id('Line').optional(),
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
  /** Stations come with the floor issue; null until then. */
  station: z.null(),
  order: z.object({ id: z.number().int(), number: z.string(), purchaseOrder: z.string(), customer: z.object({ id: z.number().int(), name: z.string() }) }),
  line: z.object({ id: z.number().int(), lineNo: z.number().int(), title: z.string(), tolerancePercent: z.number() }),
  buildSheetId: z.number().int(),
  createdAt: z.string(),
});
export type WorkOrderSummary = z.infer<typeof workOrderSummary>;
export const workOrderListResponse = z.object({ workOrders: z.array(workOrderSummary) });

/** One row of a work order's history: a stage move (or the release: fromStage null). Never rewritten. */
export const workOrderEventRecord = z.object({
  id: z.number().int(),
  at: z.string(),
  /** Who; absent for customer-role readers. */
  user: person.nullable().optional(),
  fromStage: stageSchema.nullable(),
  toStage: stageSchema,
  /** Absent for customer-role readers. */
  note: z.string().optional(),
  stationId: z.number().int().nullable(),
});
export type WorkOrderEventRecord = z.infer<typeof workOrderEventRecord>;

export const workOrderDetail = workOrderSummary.extend({
  /** The released sheet's essentials; null for customer-role readers (the winding design is the shop's own). */
  buildSheet: buildSheetEssentials.nullable(),
  /** Oldest first. */
  events: z.array(workOrderEventRecord),
});
export type WorkOrderDetail = z.infer<typeof workOrderDetail>;
