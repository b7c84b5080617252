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
