import { inArray } from 'drizzle-orm';
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
