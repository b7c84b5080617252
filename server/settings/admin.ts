import type { ShopSettingsRecord, UpdateShopSettingsRequest } from '../../src/contracts/settings';
import type { Db } from '../db/client';
import { getFloorSettings, getHeatTransferDefault, getReleaseSettings, getShopSettings, setShopSetting, type ShopSettings } from './service';

/** The shop's constants, typed, as the release and floor code read them (fallbacks applied). */
export async function readShopSettings(db: Db): Promise<ShopSettingsRecord> {
  const [s, release, floor] = await Promise.all([getShopSettings(db), getReleaseSettings(db), getFloorSettings(db)]);
  return {
    name: s.name,
    paper: s.paper === 'LETTER' ? 'LETTER' : 'A4',
    replyTo: s.replyTo,
    unitsPerWorkOrder: release.unitsPerWorkOrder,
    scrapAllowancePercent: release.scrapAllowancePercent,
    shiftHoursPerDay: floor.shiftHoursPerDay,
    defaultSpindleRpm: floor.defaultSpindleRpm,
    defaultSetupSeconds: floor.defaultSetupSeconds,
    stageStandardTimes: floor.stageStandardTimes,
    defaultHeatTransferCoefficient: await getHeatTransferDefault(db),
  };
}

/** Stores the changed settings together (one transaction), then answers all of them. */
export async function updateShopSettings(db: Db, input: UpdateShopSettingsRequest): Promise<ShopSettingsRecord> {
  await db.transaction(async (tx) => {
    if (input.stageStandardTimes) {
      const current = (await readShopSettings(tx as unknown as Db)).stageStandardTimes;
      await setShopSetting(tx, 'stageStandardTimes', JSON.stringify({ ...current, ...input.stageStandardTimes }));
    }
    // An admin's change of the heat-transfer default is not the engineer's adoption: forget who adopted the old one.
    if (input.defaultHeatTransferCoefficient !== undefined && input.defaultHeatTransferCoefficient !== (await getHeatTransferDefault(tx))) {
      await setShopSetting(tx, 'defaultHeatTransferCoefficientAdoptedBy', '');
      await setShopSetting(tx, 'defaultHeatTransferCoefficientAdoptedAt', '');
    }
    for (const [k, v] of Object.entries(input) as [keyof ShopSettings, unknown][]) {
      if (k === 'stageStandardTimes' || v === undefined) continue;
      await setShopSetting(tx, k, v === null ? '' : String(v));
    }
  });
  return readShopSettings(db);
}
