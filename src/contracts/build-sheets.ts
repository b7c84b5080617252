/**
 * API contract of build sheets: the engineer's versions of how to wind one order line, their
 * approval and their release to the floor as work orders. Imports nothing but zod (and other
 * contracts). SI throughout: metres, kilograms, ohms, amperes, watts, tesla, newtons; °C.
 *
 * Routes (roles):
 *   GET  /api/engineering/queue              engineer, admin, office, foreman → EngineeringQueueResponse
 *   GET  /api/order-lines/:id                engineer, admin, office, foreman → OrderLineDetail
 *   POST /api/order-lines/:id/build-sheet    engineer, admin   body DraftBuildSheetRequest → 201 BuildSheetRecord (a new draft)
 *   GET  /api/build-sheets/:id               engineer, admin, office, foreman → BuildSheetRecord
 *   POST /api/build-sheets/:id/approve       engineer, admin   body ApproveBuildSheetRequest → BuildSheetRecord
 *   GET  /api/build-sheets/:id/stock-check   engineer, admin, office, foreman → StockCheck (stock.ts)
 *   POST /api/build-sheets/:id/release       engineer, admin   body ReleaseBuildSheetRequest → ReleaseResponse
 *
 * Errors: 400 `validation` with `fields` for a malformed body (paths start with `spec.` for the
 * spec, whichever body form was sent); 404 for an unknown line or sheet; 422 `rule` with
 * `fields` when a rule refuses (approving a sheet that is not a draft, a missing override reason
 * → fields.overrideReason, a coil that does not fit → fields.result, releasing a sheet that is
 * not approved → fields.status, short stock → fields.stock); 409 `conflict` when someone else
 * released the same line's sheet first.
 */
import { z } from 'zod';
import { CoilSpecSchema, CoilTargetSchema, WireSizeSchema } from './coil';
import { ORDER_STATUSES, orderLineRecord } from './orders';
import { BUILD_SHEET_STATUSES } from './build-sheet-status';
import { workOrderCreated } from './work-orders';
import { stockCheck } from './stock';

export * from './build-sheet-status';

// ── Rules the client shows before the server enforces them ─────────────────────────────────

/** Engine warnings that need a written override reason before approval. */
export const WARNINGS_NEEDING_OVERRIDE = ['over-temperature', 'thermal-runaway', 'saturation'] as const;
/** Engine warnings that make a sheet impossible to approve (a new version must fix them). */
export const WARNINGS_BLOCKING_APPROVAL = ['does-not-fit'] as const;
/** Shortest override reason, characters. */
export const OVERRIDE_REASON_MIN = 10;
/** Shortest note that lets an engineer release despite short stock, characters. */
export const SHORT_STOCK_NOTE_MIN = 10;

const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);

/** An optional text: empty or blank counts as not given. */
const optionalText = (max: number, what: string) =>
  text(max, what)
    .optional()
    .transform((s) => (s ? s : undefined));

// ── Requests ────────────────────────────────────────────────────────────────────────────────

/**
 * POST /api/order-lines/:id/build-sheet. Two body forms are accepted:
 *   - the CoilSpec itself (SI), exactly what /api/coil/calculate takes; or
 *   - `{ spec: CoilSpec, target?: CoilTarget | null, notes?: string }` — the preferred form:
 *     `target` is the solve target the engineer worked to (kept with the sheet for the record),
 *     `notes` free text for the floor and the next engineer.
 * A body without a `spec` key is read as the first form. Field paths in a 400 always start with
 * `spec.` (e.g. `spec.wire.gauge`), whichever form was sent.
 */
export const draftBuildSheetRequest = z.preprocess(
  (body) => (body !== null && typeof body === 'object' && !Array.isArray(body) && 'spec' in body ? body : { spec: body }),
  z.object({
    spec: CoilSpecSchema,
    target: CoilTargetSchema.nullable().optional().transform((t) => t ?? null),
    notes: text(4000, 'Notes').default(''),
  }),
);
export type DraftBuildSheetRequest = z.output<typeof draftBuildSheetRequest>;
export type DraftBuildSheetBody = { spec: z.input<typeof CoilSpecSchema>; target?: z.input<typeof CoilTargetSchema> | null; notes?: string };

/**
 * POST /api/build-sheets/:id/approve. `overrideReason` (at least OVERRIDE_REASON_MIN characters)
 * is required when the result carries one of WARNINGS_NEEDING_OVERRIDE; it is kept on the sheet
 * whenever given.
 */
export const approveBuildSheetRequest = z.object({
  overrideReason: optionalText(2000, 'Override reason'),
});
export type ApproveBuildSheetRequest = z.output<typeof approveBuildSheetRequest>;

/**
 * POST /api/build-sheets/:id/release. `shortStockNote` (at least SHORT_STOCK_NOTE_MIN
 * characters) lets an engineer or admin release although the spools of the sheet's wire hold
 * less free mass than the work orders need; it is recorded on the sheet and on each work
 * order's first event. Without short stock it is ignored.
 */
export const releaseBuildSheetRequest = z.object({
  shortStockNote: optionalText(2000, 'Short-stock note'),
});
export type ReleaseBuildSheetRequest = z.output<typeof releaseBuildSheetRequest>;

// ── Responses ───────────────────────────────────────────────────────────────────────────────

const person = z.object({ id: z.number().int(), name: z.string() });

const corner = z.looseObject({
  supply: z.number(),
  ambient: z.number(),
  windingTemperature: z.number(),
  resistance: z.number(),
  current: z.number(),
  power: z.number(),
  ampereTurns: z.number(),
  gapFluxDensity: z.number().optional(),
  pullForce: z.number().optional(),
  runaway: z.boolean(),
});

/**
 * What engine 2 adds to a result (server/coil/types.ts). Optional: sheets computed by engine 1
 * are records and keep the numbers they were approved with, without these.
 */
export const engineResultV2 = {
  conductorMass: z.number().optional(),
  packingFactor: z.number().optional(),
  hotSpotAllowance: z.number().optional(),
  corners: z.object({ low: corner, nominal: corner, high: corner }).optional(),
  duty: z
    .looseObject({
      supply: z.number(),
      ambient: z.number(),
      basis: z.enum(['continuous', 'average', 'periodic']),
      cycleTime: z.number().nullable(),
      onTime: z.number().nullable(),
      peakTemperature: z.number(),
      limitTemperature: z.number(),
      maxOnTimeFromCold: z.number().nullable(),
    })
    .optional(),
  switchOff: z
    .looseObject({
      kind: z.enum(['none', 'diode', 'diode-zener', 'tvs']),
      assumed: z.boolean(),
      current: z.number(),
      storedEnergy: z.number(),
      clampVoltage: z.number().nullable(),
      peakVoltage: z.number().nullable(),
      timeConstant: z.number(),
      decayTime: z.number().nullable(),
    })
    .optional(),
  resistanceBand: z.looseObject({ min: z.number(), max: z.number(), basis: z.string() }).optional(),
  ironOperatingPoint: z
    .looseObject({ model: z.enum(['curve', 'linear']), fieldStrength: z.number(), fluxDensity: z.number(), saturated: z.boolean() })
    .optional(),
  cautions: z.array(z.object({ code: z.string(), message: z.string() })).optional(),
};

/**
 * The engine's BuildSheet (server/coil/types.ts) exactly as computed when the sheet was drafted,
 * never recomputed. Only the fields the screens rely on are listed; every other field of the
 * engine's result is passed through unchanged.
 */
export const coilResult = z.looseObject({
  ...engineResultV2,
  wire: z.looseObject({
    size: WireSizeSchema,
    conductor: z.enum(['copper', 'aluminium']),
    grade: z.number().int(),
    bareDiameter: z.number(),
    overallDiameter: z.number(),
  }),
  turns: z.number(),
  turnsPerLayer: z.number(),
  layers: z.number(),
  outerDiameter: z.number(),
  wireLength: z.number(),
  wireMass: z.number(),
  resistance20: z.number(),
  resistanceHot: z.number(),
  windingTemperature: z.number(),
  temperatureRise: z.number(),
  currentHot: z.number(),
  powerHot: z.number(),
  ampereTurnsHot: z.number(),
  centreField: z.number(),
  gapFluxDensity: z.number().optional(),
  pullForce: z.number().optional(),
  inductance: z.number(),
  thermalRunaway: z.boolean(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});
export type CoilResult = z.infer<typeof coilResult>;

/**
 * How a version differs from the version before it: the engine that computed each and the key
 * figures that changed (SI; `unit` names it). Null for version 1.
 */
export const sheetChanges = z.object({
  fromVersion: z.number().int(),
  fromEngine: z.string(),
  toEngine: z.string(),
  /** True when the previous version was computed by another engine version. */
  engineChanged: z.boolean(),
  figures: z.array(z.object({ key: z.string(), label: z.string(), unit: z.string(), before: z.number().nullable(), after: z.number().nullable() })),
  /** Spec fields that differ (dotted paths). */
  specChanged: z.array(z.string()),
  warningsAdded: z.array(z.string()),
  warningsRemoved: z.array(z.string()),
});
export type SheetChanges = z.infer<typeof sheetChanges>;

/** One version of a line's build sheet. */
export const buildSheetRecord = z.object({
  id: z.number().int(),
  lineId: z.number().int(),
  orderId: z.number().int(),
  /** 1, 2, 3 … per line. */
  version: z.number().int(),
  status: z.enum(BUILD_SHEET_STATUSES),
  spec: CoilSpecSchema,
  /** The solve target the engineer worked to, if any. */
  target: CoilTargetSchema.nullable(),
  result: coilResult,
  engineVersion: z.string(),
  notes: z.string(),
  overrideReason: z.string().nullable(),
  shortStockNote: z.string().nullable(),
  draftedBy: person.nullable(),
  draftedAt: z.string(),
  approvedBy: person.nullable(),
  approvedAt: z.string().nullable(),
  releasedBy: person.nullable(),
  releasedAt: z.string().nullable(),
  supersededAt: z.string().nullable(),
  /** Engine warnings on this sheet that need an override reason to approve (empty: none). */
  overrideNeededFor: z.array(z.string()),
  /** Engine warnings that forbid approval (empty: none). */
  blockedBy: z.array(z.string()),
  /** What may be done now (the server checks again). */
  can: z.object({ approve: z.boolean(), release: z.boolean() }),
  /** What changed against the previous version (null for the first). */
  changes: sheetChanges.nullable(),
});
export type BuildSheetRecord = z.infer<typeof buildSheetRecord>;

/** POST /api/build-sheets/:id/release → the new work orders (ids for the traveler queue). */
export const releaseResponse = z.object({
  workOrders: z.array(workOrderCreated),
  buildSheet: buildSheetRecord,
  /** The wire reserved for the work orders, and what was short (0 when enough). */
  stock: stockCheck,
  /**
   * The outbox row written for the customer ('skipped' with a reason when nobody to tell); null
   * when a revised version replaces an earlier release of the line (the customer was told then).
   */
  notification: z.object({ id: z.number().int(), status: z.string(), reason: z.string().nullable() }).nullable(),
  /** The print job of the new work orders' travelers (poll GET /api/jobs/:jobId); null when the queue was unreachable. */
  travelerJob: z.object({ jobId: z.string(), count: z.number().int().optional() }).nullable().optional(),
});
export type ReleaseResponse = z.infer<typeof releaseResponse>;

/**
 * Where *find wire* starts: a CoilSpec and solve target made from the line's requirement
 * (server: requirementToSpec). `spec` is ready for /api/coil/calculate; `{ spec, target }` for
 * /api/coil/solve. `target` is null when the requirement cannot be expressed as a solve target
 * (see `notes`). `notes` explain every choice made for the engineer (placeholder wire, default
 * pattern, approximations).
 */
export const startingSpec = z.object({
  spec: CoilSpecSchema,
  target: CoilTargetSchema.nullable(),
  notes: z.array(z.string()),
});
export type StartingSpec = z.infer<typeof startingSpec>;

/** GET /api/order-lines/:id — the line with its order, customer, requirement and every sheet. */
export const orderLineDetail = orderLineRecord.omit({ buildSheet: true }).extend({
  order: z.object({
    id: z.number().int(),
    number: z.string(),
    status: z.enum(ORDER_STATUSES),
    purchaseOrder: z.string(),
    orderDate: z.string(),
    dueDate: z.string(),
  }),
  customer: z.object({ id: z.number().int(), name: z.string() }),
  /** Every version, newest first. */
  sheets: z.array(buildSheetRecord),
  /** The released sheet's id, or null. */
  releasedSheetId: z.number().int().nullable(),
  starting: startingSpec,
  /** Drafting needs the order to be neither cancelled nor closed (the server checks again). */
  can: z.object({ draft: z.boolean() }),
});
export type OrderLineDetail = z.infer<typeof orderLineDetail>;

/** GET /api/engineering/queue — lines with no released sheet, order not cancelled or closed, oldest due first. */
export const engineeringQueueItem = z.object({
  lineId: z.number().int(),
  lineNo: z.number().int(),
  title: z.string(),
  quantity: z.number().int(),
  dueDate: z.string(),
  /** Due date past. */
  late: z.boolean(),
  order: z.object({ id: z.number().int(), number: z.string(), status: z.enum(ORDER_STATUSES), purchaseOrder: z.string() }),
  customer: z.object({ id: z.number().int(), name: z.string() }),
  /** The newest sheet version (draft or approved), or null when nobody has started. */
  latestSheet: z.object({ id: z.number().int(), version: z.number().int(), status: z.enum(BUILD_SHEET_STATUSES) }).nullable(),
});
export type EngineeringQueueItem = z.infer<typeof engineeringQueueItem>;
export const engineeringQueueResponse = z.object({ lines: z.array(engineeringQueueItem) });
export type EngineeringQueueResponse = z.infer<typeof engineeringQueueResponse>;
