import { inArray, sql } from 'drizzle-orm';
import type { BuildSheetEssentials, LineBuildSheetSummary } from '../../src/contracts/build-sheet-status';
import type { Db, Tx } from '../db/client';
import { buildSheets } from '../db/schema';

export type SheetRow = typeof buildSheets.$inferSelect;

/**
 * The essentials of a sheet (for work orders, travelers and the order page), with the line's
 * resistance window at 20 °C: R₂₀ × (1 ∓ tolerance).
 */
export function sheetEssentials(s: SheetRow, tolerancePercent: number): BuildSheetEssentials {
  const r = s.result;
  return {
    id: s.id,
    version: s.version,
    status: s.status,
    conductor: s.spec.conductor,
    wire: s.spec.wire,
    insulationGrade: s.spec.insulationGrade,
    bareDiameter: r.wire.bareDiameter,
    overallDiameter: r.wire.overallDiameter,
    pattern: s.spec.pattern,
    turns: r.turns,
    turnsPerLayer: r.turnsPerLayer,
    layers: r.layers,
    resistance20: r.resistance20,
    tolerancePercent,
    resistance20Min: r.resistance20 * (1 - tolerancePercent / 100),
    resistance20Max: r.resistance20 * (1 + tolerancePercent / 100),
    wireLength: r.wireLength,
    wireMass: r.wireMass,
    currentHot: r.currentHot,
    powerHot: r.powerHot,
    ampereTurnsHot: r.ampereTurnsHot,
    windingTemperature: r.windingTemperature,
    insulationClass: s.spec.insulationClass,
    engineVersion: s.engineVersion,
    releasedAt: s.releasedAt?.toISOString() ?? null,
  };
}

/**
 * Each line's `buildSheet` summary for the order page: the newest version and the released
 * one's essentials (null for customer-role readers: the winding design is the shop's own).
 */
export async function lineSheetSummaries(
  db: Db | Tx,
  lines: { id: number; tolerancePercent: number }[],
  opts: { internal: boolean },
): Promise<Map<number, LineBuildSheetSummary>> {
  const out = new Map<number, LineBuildSheetSummary>();
  if (!lines.length) return out;
  const rows = await db
    .select()
    .from(buildSheets)
    .where(inArray(buildSheets.lineId, lines.map((l) => l.id)))
    .orderBy(sql`${buildSheets.lineId}, ${buildSheets.version} desc`);
  const tolerance = new Map(lines.map((l) => [l.id, l.tolerancePercent]));
  for (const r of rows) {
    if (!out.has(r.lineId)) out.set(r.lineId, { id: r.id, version: r.version, status: r.status, released: null });
    if (r.status === 'released' && opts.internal) out.get(r.lineId)!.released = sheetEssentials(r, tolerance.get(r.lineId)!);
  }
  return out;
}
