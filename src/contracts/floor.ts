/**
 * API contract of the shop floor: stations, stage moves, assignment, priority, the board's live
 * feed, the load view and "my work". Imports nothing but zod (and other contracts). The stage
 * list is stages.ts; work-order shapes (cards, detail, events) are work-orders.ts.
 *
 * Routes (roles):
 *   GET   /api/stations                    every staff role            ?active=true → { stations: StationRecord[] }
 *   POST  /api/stations                    admin   body CreateStationRequest → 201 { station: StationRecord }
 *   PATCH /api/stations/:id                admin   body UpdateStationRequest → { station: StationRecord }
 *   POST  /api/work-orders/:id/move        floor, foreman, admin   body MoveWorkOrderRequest → WorkOrderDetail
 *   POST  /api/work-orders/assign          foreman, admin          body AssignWorkOrdersRequest → { workOrders: WorkOrderSummary[] }
 *   PATCH /api/work-orders/:id             foreman, admin          body UpdateWorkOrderRequest → WorkOrderDetail
 *   GET   /api/floor/load                  foreman, admin          ?days=7 → FloorLoad
 *   GET   /api/floor/my-work               floor, foreman          → { workOrders: MyWorkItem[] }
 *   GET   /api/floor/events                every staff role        text/event-stream of FloorChange
 *
 * Errors: a bad body is 400 `validation` with `fields`. A refused move is 422 `rule` whose body
 * also carries `rule` (a MoveRule below) and, where one field is at fault, `fields`:
 *   { error: { code: "rule", rule: "hold_needs_reason", message, fields: { note } } }
 * A stale `version` is 409 `conflict` whose body carries `current`, the work order as it is now
 * (a WorkOrderDetail for a single work order; for assignment the WorkOrderSummary[] of the batch):
 *   { error: { code: "conflict", message, current } }
 */
import { z } from 'zod';
import { buildSheetEssentials } from './build-sheet-status';
import { PRIORITIES, workOrderSummary } from './work-orders';
import { FLOW_STAGES, stageSchema, type Stage } from './stages';

/** Largest id the database holds (PostgreSQL integer). */
const ID_MAX = 2_147_483_647;
const id = (what: string) =>
  z.number({ error: `${what}: an id` }).int(`${what}: an id`).positive(`${what}: an id`).max(ID_MAX, `${what}: an id`);
const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);

// ── Stations ───────────────────────────────────────────────────────────────────────────────

/** What a station is: a winding machine, a work bench, a curing oven or a test bench. */
export const STATION_KINDS = ['winder', 'bench', 'oven', 'tester'] as const;
export type StationKind = (typeof STATION_KINDS)[number];
export const STATION_KIND_LABELS: Record<StationKind, string> = {
  winder: 'Winding machine',
  bench: 'Bench',
  oven: 'Oven',
  tester: 'Test bench',
};

/** Fastest spindle a station may state, rev/min (a typing error beyond this). */
export const SPINDLE_RPM_MAX = 30_000;
/** Longest set-up a station may state, s (one shift). */
export const SETUP_SECONDS_MAX = 8 * 3600;
/** Wire-size range limits, bare diameter in m (0.01 mm … 10 mm). */
export const WIRE_DIAMETER_MIN = 1e-5;
export const WIRE_DIAMETER_MAX = 1e-2;

/**
 * A station. SI except the spindle, which the trade states in rev/min. The wire-size range is
 * the bare conductor diameter, m (the client shows it as AWG or mm); null = no limit stated.
 * A winder states its spindle speed (the load view's winding time uses it); other kinds may not.
 */
export const stationRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  kind: z.enum(STATION_KINDS),
  wireDiameterMin: z.number().nullable(),
  wireDiameterMax: z.number().nullable(),
  /** rev/min; null for stations without a spindle. */
  spindleRpm: z.number().nullable(),
  /** Set-up time per work order, s. */
  setupSeconds: z.number().int(),
  active: z.boolean(),
  createdAt: z.string(),
});
export type StationRecord = z.infer<typeof stationRecord>;

const diameter = (what: string) =>
  z
    .number({ error: `${what}: a diameter in metres` })
    .min(WIRE_DIAMETER_MIN, `${what}: at least ${WIRE_DIAMETER_MIN} m`)
    .max(WIRE_DIAMETER_MAX, `${what}: at most ${WIRE_DIAMETER_MAX} m`);

const stationFields = {
  name: text(80, 'Name').min(1, 'Enter a name'),
  kind: z.enum(STATION_KINDS, { error: `Kind: one of ${STATION_KINDS.join(', ')}` }),
  wireDiameterMin: diameter('Smallest wire').nullable(),
  wireDiameterMax: diameter('Largest wire').nullable(),
  spindleRpm: z
    .number({ error: 'Spindle speed: rev/min' })
    .positive('Spindle speed: above 0 rev/min')
    .max(SPINDLE_RPM_MAX, `Spindle speed: at most ${SPINDLE_RPM_MAX} rev/min`)
    .nullable(),
  setupSeconds: z
    .number({ error: 'Set-up time: whole seconds' })
    .int('Set-up time: whole seconds')
    .min(0, 'Set-up time: 0 s or more')
    .max(SETUP_SECONDS_MAX, `Set-up time: at most ${SETUP_SECONDS_MAX} s`),
  active: z.boolean({ error: 'Active: true or false' }),
};

/**
 * POST /api/stations. Cross-field rules (checked by the service on the stored result as well,
 * so a PATCH cannot break them): wireDiameterMin ≤ wireDiameterMax; a winder states spindleRpm.
 * Both give 422 with fields. A name already used (any case) is 409.
 */
export const createStationRequest = z.object({
  name: stationFields.name,
  kind: stationFields.kind,
  wireDiameterMin: stationFields.wireDiameterMin.default(null),
  wireDiameterMax: stationFields.wireDiameterMax.default(null),
  spindleRpm: stationFields.spindleRpm.default(null),
  setupSeconds: stationFields.setupSeconds.default(0),
  active: stationFields.active.default(true),
});
export type CreateStationRequest = z.output<typeof createStationRequest>;
export type CreateStationBody = z.input<typeof createStationRequest>;

/** PATCH /api/stations/:id: any of the fields (a station is retired with active: false, never deleted). */
export const updateStationRequest = z
  .object(stationFields)
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateStationRequest = z.output<typeof updateStationRequest>;

export const listStationsQuery = z.object({
  active: z.enum(['true', 'false'], { error: 'Active: true or false' }).transform((s) => s === 'true').optional(),
});

// ── Moves ──────────────────────────────────────────────────────────────────────────────────

/**
 * The floor stages: where floor staff move work, one flow stage at a time.
 * (`engineering` is before the floor, `shipped` is set only by a shipment.)
 */
export const FLOOR_STAGES = FLOW_STAGES.slice(FLOW_STAGES.indexOf('ready'), FLOW_STAGES.indexOf('packing') + 1) as Stage[];

/**
 * Machine-readable names of the move rules; a refused move answers 422 with one of these as
 * `rule`. The rules themselves (the move table) live in the server's floor service.
 *
 *   same_stage            the work order is already in that stage
 *   shipped_by_shipment   only a shipment sets `shipped` (refused for every role)
 *   shipped_is_final      nothing moves a shipped work order
 *   hold_needs_reason     `on_hold` needs a reason in `note` (fields.note)
 *   note_required         rework and every backward move need a note (fields.note)
 *   side_returns_to_flow  leaving on_hold / rework goes to a flow stage the foreman chooses
 *   packing_gate          `packing` needs inspection signed: the move into packing comes from
 *                         inspection (the move is the signature), or returns from a hold taken in
 *                         packing. Every unit's test passed or dispositioned is also part of this
 *                         gate: that check arrives with test records (a later issue); until then
 *                         the server does NOT claim tests passed — it has nothing to check yet.
 *   floor_not_yours       floor staff move only work assigned to them or unassigned
 *   floor_stages_only     floor staff move only within FLOOR_STAGES (no holds, rework, shipping)
 *   floor_one_step        floor staff move one flow stage forward (or back one, on their own work, with a note)
 *   floor_back_own_only   floor staff step back only on work assigned to them
 *   winding_record        leaving winding forward records turnsCounter, spoolLot and a station (fields)
 *   winding_data_misplaced turnsCounter / spoolLot are given only when leaving winding forward (fields)
 *   station_unusable      the station is unknown or inactive (fields.stationId)
 *   station_wire_range    a winder's wire-size range does not take the work order's wire (also
 *                         refused when assigning work to that winder; fields.stationId)
 */
export const MOVE_RULES = [
  'same_stage',
  'shipped_by_shipment',
  'shipped_is_final',
  'hold_needs_reason',
  'note_required',
  'side_returns_to_flow',
  'packing_gate',
  'floor_not_yours',
  'floor_stages_only',
  'floor_one_step',
  'floor_back_own_only',
  'winding_record',
  'winding_data_misplaced',
  'station_unusable',
  'station_wire_range',
] as const;
export type MoveRule = (typeof MOVE_RULES)[number];

/** Largest turns-counter reading accepted (a typing error beyond this). */
export const TURNS_COUNTER_MAX = 10_000_000;

/**
 * POST /api/work-orders/:id/move. `version` is the work order's version the user saw.
 * `stationId` is where it happened (defaults to the work order's station). When leaving winding
 * forward (winding → terminating) the winder records the turns counter reading (turns per unit as
 * the counter shows them), the spool lot actually used (a lot in stock) and the station.
 */
export const moveWorkOrderRequest = z.object({
  to: stageSchema,
  version: z.number({ error: 'Version: a whole number' }).int('Version: a whole number').positive('Version: a whole number'),
  note: text(1000, 'Note').optional(),
  stationId: id('Station').nullable().optional(),
  turnsCounter: z
    .number({ error: 'Turns counter: a whole number' })
    .int('Turns counter: a whole number')
    .min(0, 'Turns counter: 0 or more')
    .max(TURNS_COUNTER_MAX, `Turns counter: at most ${TURNS_COUNTER_MAX}`)
    .optional(),
  spoolLot: text(60, 'Spool lot').min(1, 'Enter the spool lot').optional(),
});
export type MoveWorkOrderRequest = z.output<typeof moveWorkOrderRequest>;
export type MoveWorkOrderBody = z.input<typeof moveWorkOrderRequest>;

/** Most work orders in one assignment. */
export const ASSIGN_BATCH_MAX = 200;

/**
 * POST /api/work-orders/assign (foreman, admin). Give `assigneeId` and/or `stationId`; null
 * clears it, absent leaves it. The assignee is an active floor user; the station an active one.
 * `versions`, when given, lines up with `ids` (versions[i] is the version of ids[i] the user saw);
 * any stale one → 409 with `current` (the batch as it is now) and nothing changes. An unknown id,
 * assignee or station → 422 naming which (fields `ids`, `assigneeId`, `stationId`). All or nothing.
 */
export const assignWorkOrdersRequest = z
  .object({
    ids: z
      .array(id('Work order'), { error: 'Work orders: a list of ids' })
      .min(1, 'Pick at least one work order')
      .max(ASSIGN_BATCH_MAX, `At most ${ASSIGN_BATCH_MAX} work orders at once`)
      .refine((a) => new Set(a).size === a.length, 'A work order is listed twice'),
    assigneeId: id('Assignee').nullable().optional(),
    stationId: id('Station').nullable().optional(),
    versions: z.array(z.number({ error: 'Version: a whole number' }).int('Version: a whole number').positive('Version: a whole number')).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.assigneeId === undefined && v.stationId === undefined) {
      ctx.addIssue({ code: 'custom', path: ['assigneeId'], message: 'Pick a person and/or a station' });
    }
    if (v.versions && v.versions.length !== v.ids.length) {
      ctx.addIssue({ code: 'custom', path: ['versions'], message: 'One version per work order, in the order of ids' });
    }
  });
export type AssignWorkOrdersRequest = z.output<typeof assignWorkOrdersRequest>;

/** PATCH /api/work-orders/:id (foreman, admin): the floor priority. Stale version → 409 with current. */
export const updateWorkOrderRequest = z.object({
  priority: z.union(PRIORITIES.map((p) => z.literal(p)) as [z.ZodLiteral<0>, z.ZodLiteral<1>, z.ZodLiteral<2>], {
    error: `Priority: one of ${PRIORITIES.join(', ')}`,
  }),
  version: z.number({ error: 'Version: a whole number' }).int('Version: a whole number').positive('Version: a whole number'),
});
export type UpdateWorkOrderRequest = z.output<typeof updateWorkOrderRequest>;

// ── My work ────────────────────────────────────────────────────────────────────────────────

/** A work order assigned to the signed-in user, with what the floor needs in big type. */
export const myWorkItem = workOrderSummary.extend({ buildSheet: buildSheetEssentials });
export type MyWorkItem = z.infer<typeof myWorkItem>;
/** GET /api/floor/my-work: not shipped, highest priority first, then earliest due, then number. */
export const myWorkResponse = z.object({ workOrders: z.array(myWorkItem) });

// ── Load ───────────────────────────────────────────────────────────────────────────────────

export const LOAD_DAYS_MAX = 28;
export const floorLoadQuery = z.object({
  days: z.coerce
    .number({ error: 'Days: a whole number' })
    .pipe(z.int({ error: 'Days: a whole number' }).min(1, 'Days: 1 or more').max(LOAD_DAYS_MAX, `Days: at most ${LOAD_DAYS_MAX}`))
    .default(7),
});

/**
 * Estimated hours still to do on open work orders (not shipped, not in engineering) due on or
 * before the window's last day (overdue ones included, counted on the first day).
 * Estimate of one work order = the stages still ahead of it, its current stage counted whole:
 *   winding  = quantity × turns ÷ spindle speed (rev/min) ÷ 60 + station set-up (s) ÷ 3600
 *              (the work order's station when it has a spindle; else the shop's default winder)
 *   others   = the shop's standard time per stage: minutes per unit × quantity + minutes per batch
 * on_hold counts from the stage it was held in; rework counts from winding.
 */
const loadRow = z.object({
  /** Work orders counted. */
  workOrders: z.number().int(),
  windingHours: z.number(),
  otherHours: z.number(),
  hours: z.number(),
  /** By due date, one entry per day of the window (YYYY-MM-DD). */
  byDay: z.array(z.object({ date: z.string(), hours: z.number() })),
});
export const floorLoad = z.object({
  from: z.string(),
  to: z.string(),
  days: z.number().int(),
  /** Working hours in the window for one person or station: working days × shift hours (shop settings). */
  capacityHours: z.number(),
  people: z.array(loadRow.extend({ id: z.number().int(), name: z.string() })),
  stations: z.array(loadRow.extend({ id: z.number().int(), name: z.string() })),
  /** Work with nobody / no station assigned. */
  unassignedPeople: loadRow,
  unassignedStations: loadRow,
  /** The shop settings the estimate used. */
  settings: z.object({
    shiftHoursPerDay: z.number(),
    defaultSpindleRpm: z.number(),
    defaultSetupSeconds: z.number(),
    stageStandardTimes: z.record(z.string(), z.object({ minutesPerUnit: z.number(), minutesPerBatch: z.number() })),
  }),
});
export type FloorLoad = z.infer<typeof floorLoad>;
export type FloorLoadRow = z.infer<typeof loadRow>;

// ── Live feed ──────────────────────────────────────────────────────────────────────────────

/** What changed: a stage move, an assignment (person / station) or the priority. */
export const FLOOR_CHANGE_KINDS = ['move', 'assign', 'priority', 'release'] as const;

/**
 * GET /api/floor/events (text/event-stream). On connect: `event: ready` (data `{}`); then one
 * `event: work-order` per changed work order with this JSON as data, plus `card`: the work order's
 * board card as the signed-in user sees it now, null when it left the board (BoardDelta in
 * board.ts); a `: heartbeat` comment every 25 s. A message without `card` (the server could not
 * read it) means: fetch what you show again. After `ready` (also on reconnecting) fetch again what
 * may have changed meanwhile (answers carry ETags, so this is cheap).
 */
export const floorChange = z.object({
  kind: z.enum(FLOOR_CHANGE_KINDS),
  id: z.number().int(),
  number: z.string(),
  stage: stageSchema,
  version: z.number().int(),
  at: z.string(),
});
export type FloorChange = z.infer<typeof floorChange>;
export const FLOOR_EVENT_NAME = 'work-order';
