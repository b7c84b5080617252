/**
 * API contract of test records: instruments, unit tests at the bench, nonconformances and their
 * dispositions, and the quality views. Imports nothing but zod. SI throughout: ohms, °C, volts,
 * seconds, amperes, henries, newtons.
 *
 * Routes (roles):
 *   GET   /api/instruments                       every staff role   → { instruments: InstrumentRecord[] }
 *   POST  /api/instruments                       admin, foreman     body CreateInstrumentRequest → 201 { instrument }
 *   PATCH /api/instruments/:id                   admin, foreman     body UpdateInstrumentRequest → { instrument }
 *   POST  /api/work-orders/:id/serials           floor, foreman, admin   body { count } → 201 { serials: string[] }
 *   POST  /api/work-orders/:id/test-records      floor, foreman, admin   body RecordTestRequest → 201 TestRecord
 *   GET   /api/work-orders/:id/test-records      every staff role   → WorkOrderTests
 *   POST  /api/nonconformances/:id/disposition   foreman, admin     body DispositionRequest → Nonconformance
 *   POST  /api/nonconformances/:id/approve       engineer           body { note? } → Nonconformance
 *   GET   /api/quality/summary                   foreman, engineer, admin, office → QualitySummary
 *   GET   /api/quality/design-feedback           engineer, admin    → DesignFeedback
 *   POST  /api/quality/design-feedback/adopt     engineer, admin    body AdoptHeatTransferRequest (settings.ts) → HeatTransferDefault
 *
 * The server decides pass or fail, reading by reading; the client never decides. Every record
 * keeps the readings as entered, the derived values and the limits used, so it stands when the
 * shop's defaults change later. Retests are new records (retest: true) pointing at the earlier
 * one; nothing is overwritten.
 *
 * SAFETY: a hi-pot test applies lethal voltages — interlocked fixture, trained staff only, per
 * local codes. A heat run leaves hot coil surfaces. A measured pull is a check of this unit
 * against its design, never a lifting rating (that needs the applicable lifting-device standard
 * and a proof test with a safety factor).
 */
import { z } from 'zod';
import type { HeatTransferDefault } from './settings';

const ID_MAX = 2_147_483_647;
const id = (what: string) => z.number({ error: `${what}: an id` }).int(`${what}: an id`).positive(`${what}: an id`).max(ID_MAX, `${what}: an id`);
const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);
const num = (what: string) => z.number({ error: `${what}: a number` }).finite(`${what}: a finite number`);
const positive = (what: string, max: number) => num(what).positive(`${what}: more than zero`).max(max, `${what}: at most ${max}`);
const nonNegative = (what: string, max: number) => num(what).min(0, `${what}: zero or more`).max(max, `${what}: at most ${max}`);

/** Winding temperatures a reading may state, °C. */
export const TEMPERATURE_MIN = -40;
export const TEMPERATURE_MAX = 250;
const temperature = (what: string) =>
  num(what).min(TEMPERATURE_MIN, `${what}: between ${TEMPERATURE_MIN} and ${TEMPERATURE_MAX} °C`).max(TEMPERATURE_MAX, `${what}: between ${TEMPERATURE_MIN} and ${TEMPERATURE_MAX} °C`);

/**
 * Shop defaults for judging a unit. Each is common practice, not a published limit; the values
 * used are stored on every record.
 */
export const TEST_DEFAULTS = {
  /**
   * Hi-pot test voltage = 1000 V + 2 × rated voltage, applied for 60 s (common practice from
   * memory of machine standards; no published source checked here).
   */
  hipotBaseVolts: 1000,
  hipotRatedMultiplier: 2,
  hipotSeconds: 60,
  /** Largest leakage current during the hi-pot, A (shop default, common practice, no published source). */
  hipotLeakageMax: 5e-3,
  /** Insulation resistance: at least 100 MΩ measured at 500 V DC or more (common practice). */
  insulationResistanceMin: 100e6,
  insulationTestVolts: 500,
  /** Inductance band around the engine's value, ± % (wider than resistance: common practice). */
  inductanceTolerancePercent: 25,
  /** Turns check: ± 1 % of the design's turns, at least ± 2 turns (common practice, no published source). */
  turnsTolerancePercent: 1,
  turnsToleranceMin: 2,
  /** Pull on the fixture: at least this share of the computed pull (common practice, no published source). */
  pullMinFraction: 0.9,
} as const;

export const INSTRUMENT_KINDS = ['ohmmeter', 'hipot_tester', 'insulation_tester', 'lcr_meter', 'thermometer', 'force_gauge', 'turns_tester', 'other'] as const;
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number];

const isoDate = z.string({ error: 'A date' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD').refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, 'Not a real date');

export const createInstrumentRequest = z.object({
  name: text(120, 'Name').pipe(z.string().min(1, 'Enter a name')),
  kind: z.enum(INSTRUMENT_KINDS, { error: `Kind: one of ${INSTRUMENT_KINDS.join(', ')}` }),
  serial: text(80, 'Serial').pipe(z.string().min(1, 'Enter the serial number')),
  calibrationDue: isoDate,
  active: z.boolean().optional(),
});
export type CreateInstrumentRequest = z.infer<typeof createInstrumentRequest>;
export const updateInstrumentRequest = createInstrumentRequest.partial().refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateInstrumentRequest = z.infer<typeof updateInstrumentRequest>;

export type InstrumentRecord = {
  id: number;
  name: string;
  kind: InstrumentKind;
  serial: string;
  calibrationDue: string;
  active: boolean;
  /** Calibration due before today: readings with it are refused. */
  overdue: boolean;
  createdAt: string;
};

export const serialsRequest = z.object({ count: z.number({ error: 'Count: a whole number' }).int('Count: a whole number').min(1, 'Count: at least 1').max(500, 'Count: at most 500') });

export const recordTestRequest = z.object({
  serial: text(60, 'Serial').pipe(z.string().min(1, 'Enter the unit’s serial number')),
  /** A retest of this serial: a new record pointing at the latest earlier one. */
  retest: z.boolean().optional(),
  /** DC resistance as measured, Ω. */
  resistance: positive('Resistance', 1e9),
  /** Winding temperature at which the resistance was read, °C. */
  temperature: temperature('Temperature'),
  hipot: z
    .object({
      voltage: positive('Hi-pot voltage', 100_000),
      seconds: positive('Hi-pot duration', 3600),
      leakage: nonNegative('Leakage current', 10),
      breakdown: z.boolean({ error: 'Breakdown: yes or no' }),
    })
    .optional(),
  insulationResistance: z.object({ voltage: positive('Test voltage', 100_000), resistance: positive('Insulation resistance', 1e15) }).optional(),
  inductance: positive('Inductance', 1e4).optional(),
  turns: z.number({ error: 'Turns: a whole number' }).int('Turns: a whole number').min(1, 'Turns: at least 1').max(10_000_000, 'Turns: too many').optional(),
  pull: nonNegative('Pull', 1e6).optional(),
  heatRun: z
    .object({
      coldResistance: positive('Cold resistance', 1e9),
      coldTemperature: temperature('Cold temperature'),
      hotResistance: positive('Hot resistance', 1e9),
      ambient: temperature('Ambient'),
    })
    .refine((h) => h.hotResistance >= h.coldResistance, { message: 'Hot resistance: not below the cold resistance (a heat run warms the winding)', path: ['hotResistance'] })
    .optional(),
  instrumentIds: z.array(id('Instrument')).max(20, 'At most 20 instruments').optional(),
  note: text(1000, 'Note').optional(),
});
export type RecordTestRequest = z.infer<typeof recordTestRequest>;

export const READING_NAMES = ['resistance', 'hipot', 'insulation_resistance', 'inductance', 'turns', 'pull', 'heat_run'] as const;
export type ReadingName = (typeof READING_NAMES)[number];

/** One reading's verdict: the value judged, the limit it was judged against, and why. */
export type Reading = {
  name: ReadingName;
  /** The value judged (R₂₀ in Ω, leakage in A, IR in Ω, L in H, turns, N, winding °C). */
  value: number;
  /** The limit in words and numbers, as used. */
  limit: { min?: number; max?: number; text: string };
  passed: boolean;
  /** Why it failed, or '' when it passed. */
  reason: string;
  /** Derived values (deviation, rise, h_eff …). */
  derived?: Record<string, number>;
};

export type TestRecord = {
  id: number;
  workOrderId: number;
  serial: string;
  retestOfId: number | null;
  firstTest: boolean;
  resistance: number;
  temperature: number;
  resistance20: number;
  nominalResistance20: number;
  tolerancePercent: number;
  deviationPercent: number;
  deviationOhms: number;
  passed: boolean;
  reasons: string[];
  readings: Reading[];
  /** The request as entered. */
  entered: RecordTestRequest;
  instruments: { id: number; name: string; serial: string; calibrationDue: string }[];
  nonconformanceId: number | null;
  testedBy: { id: number; name: string } | null;
  testedAt: string;
};

export const DISPOSITION_ACTIONS = ['rework', 'scrap', 'use_as_is'] as const;
export type DispositionAction = (typeof DISPOSITION_ACTIONS)[number];

export const dispositionRequest = z.object({
  action: z.enum(DISPOSITION_ACTIONS, { error: `Action: one of ${DISPOSITION_ACTIONS.join(', ')}` }),
  reason: text(2000, 'Reason').pipe(z.string().min(1, 'Say why')),
  /** Rework: the flow stage the work order goes back to after rework (by a normal move later). */
  returnTo: z.enum(['ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection'], { error: 'Return to: a flow stage before packing' }).optional(),
});
export type DispositionRequest = z.infer<typeof dispositionRequest>;
export const approveRequest = z.object({ note: text(2000, 'Note').optional() });

/**
 * open: no disposition yet. awaiting_approval: use as is, waiting for the engineer.
 * dispositioned: scrap, rework, or use as is approved.
 */
export const NONCONFORMANCE_STATES = ['open', 'awaiting_approval', 'dispositioned'] as const;
export type NonconformanceState = (typeof NONCONFORMANCE_STATES)[number];

export type Nonconformance = {
  id: number;
  workOrderId: number;
  testRecordId: number;
  serial: string;
  summary: string;
  failed: { name: ReadingName; value: number; limit: string; reason: string }[];
  state: NonconformanceState;
  disposition: null | {
    action: DispositionAction;
    reason: string;
    returnTo: string | null;
    by: { id: number; name: string } | null;
    at: string;
    approvedBy: { id: number; name: string } | null;
    approvedAt: string | null;
    approvalNote: string | null;
  };
  createdAt: string;
};

export type WorkOrderTests = {
  workOrderId: number;
  number: string;
  quantity: number;
  scrapped: number;
  /** quantity − scrapped. */
  goodQuantity: number;
  /** Every record, oldest first, retests included. */
  records: TestRecord[];
  /** Each serial's latest record and where it stands. */
  units: { serial: string; latestRecordId: number; passed: boolean; state: 'passed' | 'failed_open' | 'rework' | 'awaiting_approval' | 'use_as_is' | 'scrapped' }[];
  nonconformances: Nonconformance[];
  openNonconformances: number;
  /** First tests passed over first tests taken (null when none). */
  firstPassYield: number | null;
  gate: { state: 'clear' } | { state: 'open'; outstanding: number };
};

export type YieldRow = { key: string; firstTests: number; firstPassed: number; firstPassYield: number | null };
export type QualitySummary = {
  byWeek: YieldRow[];
  byCoilKind: YieldRow[];
  byStation: YieldRow[];
  failureReasons: { name: ReadingName; count: number }[];
};

export type DesignFeedbackRow = {
  buildSheetId: number;
  version: number;
  lineTitle: string;
  orderNumber: string;
  computedResistance20: number;
  /** Mean R₂₀ of the units as they stand (each serial's latest record), leaving out units whose resistance failed (defects, not the design). */
  meanMeasuredResistance20: number | null;
  meanDeviationPercent: number | null;
  units: number;
  designTurns: number;
  meanMeasuredTurns: number | null;
  heatRuns: number;
  predictedRise: number;
  meanMeasuredRise: number | null;
  heatTransferUsed: number;
  /** h_eff = h_used × ΔT_predicted / ΔT_measured (mean, sample standard deviation). */
  heatTransferEffective: { mean: number; spread: number | null } | null;
};
export type DesignFeedback = {
  designs: DesignFeedbackRow[];
  shop: { heatRuns: number; heatTransferEffective: { mean: number; spread: number | null } | null };
  relation: string;
  /** The shop's default for new build sheets now (settings), and who adopted it. */
  shopDefault: HeatTransferDefault;
};
