import { inArray } from 'drizzle-orm';
import { HEAT_TRANSFER_MAX, HEAT_TRANSFER_MIN } from '../../src/contracts/settings';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { appMeta } from '../db/schema';

/** Shop-wide settings with their defaults, kept in app_meta under `shop.<name>`. */
export const SHOP_DEFAULTS = {
  name: 'Spoolwright shop',
  /** Paper for travelers and documents. */
  paper: 'A4' as 'A4' | 'LETTER',
  /** Reply address shown in customer e-mail. */
  replyTo: '',
  /** Most units in one work order when a build sheet is released (a whole number ≥ 1). */
  unitsPerWorkOrder: '25',
  /**
   * Extra wire reserved for scrap and set-up when a build sheet is released, % of the designed
   * wire mass (common practice, no published source).
   */
  scrapAllowancePercent: '5',
  /**
   * The floor's estimates (board, at-risk flag, load view). Working hours per working day
   * (Mon–Fri) for one person or station.
   */
  shiftHoursPerDay: '7.5',
  /** Winding time when a work order has no station with a spindle: rev/min and set-up, s. */
  defaultSpindleRpm: '1200',
  defaultSetupSeconds: '900',
  /**
   * Standard times of the stages other than winding (winding = turns ÷ spindle speed + set-up),
   * JSON { stage: { minutesPerUnit, minutesPerBatch } }. Invented but plausible defaults for a
   * small coil shop (common practice, no published source); the shop sets its own.
   */
  stageStandardTimes: JSON.stringify({
    ready: { minutesPerUnit: 0, minutesPerBatch: 0 },
    terminating: { minutesPerUnit: 4, minutesPerBatch: 10 },
    impregnating: { minutesPerUnit: 1.5, minutesPerBatch: 30 },
    curing: { minutesPerUnit: 0, minutesPerBatch: 120 },
    testing: { minutesPerUnit: 3, minutesPerBatch: 10 },
    inspection: { minutesPerUnit: 1, minutesPerBatch: 10 },
    packing: { minutesPerUnit: 1, minutesPerBatch: 15 },
  }),
  /**
   * Heat-transfer coefficient for new build sheets whose spec names none, W/(m²·K); '' = the
   * engine's default. Who adopted it (user id) and when (ISO time), '' when nobody did.
   */
  defaultHeatTransferCoefficient: '',
  defaultHeatTransferCoefficientAdoptedBy: '',
  defaultHeatTransferCoefficientAdoptedAt: '',
};
export type ShopSettings = typeof SHOP_DEFAULTS;

const key = (k: keyof ShopSettings) => `shop.${k}`;

export async function getShopSettings(db: Db | Tx): Promise<ShopSettings> {
  const keys = Object.keys(SHOP_DEFAULTS) as (keyof ShopSettings)[];
  const rows = await db.select().from(appMeta).where(inArray(appMeta.key, keys.map(key)));
  const out = { ...SHOP_DEFAULTS };
  for (const r of rows) {
    const k = r.key.slice('shop.'.length) as keyof ShopSettings;
    (out as Record<string, string>)[k] = r.value;
  }
  return out;
}

export async function setShopSetting(db: Db | Tx, k: keyof ShopSettings, value: string) {
  await db
    .insert(appMeta)
    .values({ key: key(k), value })
    .onConflictDoUpdate({ target: appMeta.key, set: { value, updatedAt: new Date() } });
}

/** A setting stored as text, read as a number; anything unusable falls back to the default. */
function numberSetting(settings: ShopSettings, k: 'unitsPerWorkOrder' | 'scrapAllowancePercent', ok: (n: number) => boolean): number {
  const n = Number(settings[k]);
  return Number.isFinite(n) && ok(n) ? n : Number(SHOP_DEFAULTS[k]);
}

/** The numbers a release works with: batch size and scrap allowance. */
export async function getReleaseSettings(db: Db | Tx) {
  const s = await getShopSettings(db);
  return {
    unitsPerWorkOrder: Math.floor(numberSetting(s, 'unitsPerWorkOrder', (n) => n >= 1)),
    scrapAllowancePercent: numberSetting(s, 'scrapAllowancePercent', (n) => n >= 0 && n <= 100),
  };
}

/** A stage's standard time: minutes per unit × quantity + minutes per batch. */
export type StageStandardTime = { minutesPerUnit: number; minutesPerBatch: number };
/** The stages with a standard time (every floor stage but winding, which is computed). */
export type StandardTimedStage = Exclude<Stage, 'engineering' | 'winding' | 'shipped' | 'on_hold' | 'rework'>;

export type FloorSettings = {
  shiftHoursPerDay: number;
  defaultSpindleRpm: number;
  defaultSetupSeconds: number;
  stageStandardTimes: Record<StandardTimedStage, StageStandardTime>;
};

const inRange = (v: string, fallback: string, max: number, zeroOk = false) => {
  const n = Number(v);
  return Number.isFinite(n) && (zeroOk ? n >= 0 : n > 0) && n <= max ? n : Number(fallback);
};

/** The floor's estimate settings; anything unusable (per value) falls back to the default. */
export async function getFloorSettings(db: Db | Tx): Promise<FloorSettings> {
  const s = await getShopSettings(db);
  const defaults = JSON.parse(SHOP_DEFAULTS.stageStandardTimes) as Record<StandardTimedStage, StageStandardTime>;
  let stored: Record<string, Partial<StageStandardTime>> = {};
  try {
    const v: unknown = JSON.parse(s.stageStandardTimes);
    if (v && typeof v === 'object') stored = v as typeof stored;
  } catch {
    // unusable: the defaults stand
  }
  const ok = (n: unknown): n is number => typeof n === 'number' && Number.isFinite(n) && n >= 0 && n <= 10_000;
  const times = {} as Record<StandardTimedStage, StageStandardTime>;
  for (const [stage, d] of Object.entries(defaults) as [StandardTimedStage, StageStandardTime][]) {
    const v = stored[stage] ?? {};
    times[stage] = { minutesPerUnit: ok(v.minutesPerUnit) ? v.minutesPerUnit : d.minutesPerUnit, minutesPerBatch: ok(v.minutesPerBatch) ? v.minutesPerBatch : d.minutesPerBatch };
  }
  return {
    shiftHoursPerDay: inRange(s.shiftHoursPerDay, SHOP_DEFAULTS.shiftHoursPerDay, 24),
    defaultSpindleRpm: inRange(s.defaultSpindleRpm, SHOP_DEFAULTS.defaultSpindleRpm, 30_000),
    defaultSetupSeconds: inRange(s.defaultSetupSeconds, SHOP_DEFAULTS.defaultSetupSeconds, 8 * 3600, true),
    stageStandardTimes: times,
  };
}

/** The shop's heat-transfer default, W/(m²·K), or null (the engine's default applies). */
export async function getHeatTransferDefault(db: Db | Tx): Promise<number | null> {
  const v = (await getShopSettings(db)).defaultHeatTransferCoefficient;
  const n = Number(v);
  return v !== '' && Number.isFinite(n) && n >= HEAT_TRANSFER_MIN && n <= HEAT_TRANSFER_MAX ? n : null;
}

/**
 * A spec with the shop's heat-transfer default filled in where it names none. The engine stays
 * pure: the default reaches it through the spec, as if the engineer had typed it.
 */
export async function withShopHeatTransfer<S extends { heatTransferCoefficient?: number }>(db: Db | Tx, spec: S): Promise<S> {
  if (spec.heatTransferCoefficient !== undefined) return spec;
  const h = await getHeatTransferDefault(db);
  return h === null ? spec : { ...spec, heatTransferCoefficient: h };
}
