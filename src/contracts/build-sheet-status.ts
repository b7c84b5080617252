/**
 * The small part of the build-sheet contract that other contracts embed (an order line's
 * `buildSheet`, a work order's `buildSheet`). It lives apart from build-sheets.ts only so that
 * orders.ts can import it without an import cycle; import it through build-sheets.ts, which
 * re-exports everything here. Imports nothing but zod (and the coil contract).
 */
import { z } from 'zod';
import { WireSizeSchema } from './coil';

/**
 * draft → approved → released; a released sheet becomes `superseded` when a newer version of
 * the same line is released. Approved and released sheets never change.
 */
export const BUILD_SHEET_STATUSES = ['draft', 'approved', 'released', 'superseded'] as const;
export type BuildSheetStatus = (typeof BUILD_SHEET_STATUSES)[number];

export const BUILD_SHEET_STATUS_LABELS: Record<BuildSheetStatus, string> = {
  draft: 'Draft',
  approved: 'Approved',
  released: 'Released',
  superseded: 'Superseded',
};

/**
 * What the floor, the traveler and the order page need of a sheet: the wire, the winding, the
 * resistance window at 20 °C and the hot operating point. SI: m, kg, Ω, A, W, °C.
 */
export const buildSheetEssentials = z.object({
  id: z.number().int(),
  version: z.number().int(),
  status: z.enum(BUILD_SHEET_STATUSES),
  conductor: z.enum(['copper', 'aluminium']),
  wire: WireSizeSchema,
  insulationGrade: z.number().int(),
  /** Bare and overall (insulated) diameter, m. */
  bareDiameter: z.number(),
  overallDiameter: z.number(),
  pattern: z.enum(['layer', 'orthocyclic', 'random']),
  turns: z.number().int(),
  turnsPerLayer: z.number().int(),
  layers: z.number().int(),
  /** Expected DC resistance at 20 °C, Ω, with the line's ± tolerance and the window it gives. */
  resistance20: z.number(),
  tolerancePercent: z.number(),
  resistance20Min: z.number(),
  resistance20Max: z.number(),
  /** Wire per unit, m and kg (conductor only). */
  wireLength: z.number(),
  wireMass: z.number(),
  currentHot: z.number(),
  powerHot: z.number(),
  ampereTurnsHot: z.number(),
  /** Hot-spot winding temperature at steady state, °C, against the insulation class, °C. */
  windingTemperature: z.number(),
  insulationClass: z.number().int(),
  engineVersion: z.string(),
  releasedAt: z.string().nullable(),
});
export type BuildSheetEssentials = z.infer<typeof buildSheetEssentials>;

/**
 * An order line's `buildSheet` on GET /api/orders/:id: null until engineering has drafted one;
 * else the newest version's id, version and status, and the released sheet's essentials (null
 * while nothing is released; always null for customer-role readers — the winding design is the
 * shop's own).
 */
export const lineBuildSheetSummary = z.object({
  id: z.number().int(),
  version: z.number().int(),
  status: z.enum(BUILD_SHEET_STATUSES),
  released: buildSheetEssentials.nullable(),
});
export type LineBuildSheetSummary = z.infer<typeof lineBuildSheetSummary>;
