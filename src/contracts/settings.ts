import { z } from 'zod';

export const PAPER_SIZES = ['A4', 'LETTER'] as const;

/** The stages with a standard time on the floor (winding is computed from turns and spindle speed). */
export const STANDARD_TIMED_STAGES = ['ready', 'terminating', 'impregnating', 'curing', 'testing', 'inspection', 'packing'] as const;

const standardTime = z.object({
  minutesPerUnit: z.number({ error: 'Minutes per unit: a number' }).min(0, 'Minutes per unit: zero or more').max(10_000, 'Minutes per unit: at most 10,000'),
  minutesPerBatch: z.number({ error: 'Minutes per batch: a number' }).min(0, 'Minutes per batch: zero or more').max(10_000, 'Minutes per batch: at most 10,000'),
});

/** Sensible bounds of a coil surface's combined heat-transfer coefficient, W/(m²·K) (common practice, no published source: still air ≈ 5–15, forced air or oil far more). */
export const HEAT_TRANSFER_MIN = 1;
export const HEAT_TRANSFER_MAX = 500;
const heatTransferCoefficient = z
  .number({ error: 'A number in W/(m²·K)' })
  .min(HEAT_TRANSFER_MIN, `At least ${HEAT_TRANSFER_MIN} W/(m²·K)`)
  .max(HEAT_TRANSFER_MAX, `At most ${HEAT_TRANSFER_MAX} W/(m²·K)`);

/** The shop's constants, as the admin sets them (GET /api/settings answers them, typed). */
export const shopSettings = z.object({
  name: z.string().trim().min(1, 'Enter the shop’s name').max(120, 'At most 120 characters'),
  paper: z.enum(PAPER_SIZES, { error: 'A4 or LETTER' }),
  replyTo: z.union([z.literal(''), z.string().trim().email('Not an e-mail address')]),
  unitsPerWorkOrder: z.int({ error: 'A whole number' }).min(1, 'At least 1').max(10_000, 'At most 10,000'),
  scrapAllowancePercent: z.number({ error: 'A number' }).min(0, 'Zero or more').max(100, 'At most 100 %'),
  shiftHoursPerDay: z.number({ error: 'A number' }).positive('More than zero').max(24, 'At most 24 h'),
  defaultSpindleRpm: z.number({ error: 'A number' }).positive('More than zero').max(30_000, 'At most 30,000 rev/min'),
  defaultSetupSeconds: z.number({ error: 'A number' }).positive('More than zero').max(8 * 3600, 'At most 8 h'),
  stageStandardTimes: z.record(z.enum(STANDARD_TIMED_STAGES), standardTime),
  /**
   * The heat-transfer coefficient new build sheets use when their spec names none, W/(m²·K);
   * null = the engine's own default. The engineer adopts the shop's measured value from the design
   * feedback (POST /api/quality/design-feedback/adopt); the admin may also set or clear it here.
   */
  defaultHeatTransferCoefficient: heatTransferCoefficient.nullable(),
});
export type ShopSettingsRecord = z.infer<typeof shopSettings>;

/** PATCH /api/settings (admin): any of the settings. */
export const updateShopSettingsRequest = shopSettings
  .extend({ stageStandardTimes: z.partialRecord(z.enum(STANDARD_TIMED_STAGES), standardTime) })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateShopSettingsRequest = z.infer<typeof updateShopSettingsRequest>;

/**
 * POST /api/quality/design-feedback/adopt (engineer, admin): the shop's effective heat-transfer
 * coefficient from heat runs becomes the default for new build sheets. Refused (422) when no heat
 * run gives a value, or when `value` is more than ADOPT_TOLERANCE_PERCENT from the measured mean.
 */
export const adoptHeatTransferRequest = z.object({ value: heatTransferCoefficient });
export type AdoptHeatTransferRequest = z.infer<typeof adoptHeatTransferRequest>;
export const ADOPT_TOLERANCE_PERCENT = 10;

/** The shop's heat-transfer default and who adopted it. */
export const heatTransferDefault = z.object({
  /** null = the engine's default (engineDefault). */
  value: z.number().nullable(),
  engineDefault: z.number(),
  adoptedBy: z.object({ id: z.number(), name: z.string() }).nullable(),
  adoptedAt: z.string().nullable(),
});
export type HeatTransferDefault = z.infer<typeof heatTransferDefault>;
