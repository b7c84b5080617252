/**
 * API contract of wire stock: spools of magnet wire and the mass reserved from them for work
 * orders. Imports nothing but zod (and the coil contract). Masses in kilograms, diameters in
 * metres (SI); the client converts.
 *
 * Routes (roles):
 *   GET  /api/spools                         engineer, office, foreman, admin → { spools: SpoolRecord[] }
 *   POST /api/spools                         office, engineer, admin   body ReceiveSpoolRequest → 201 { spool: SpoolRecord }
 *   GET  /api/build-sheets/:id/stock-check   engineer, admin, office, foreman → StockCheck
 *
 * Free mass = net mass − reserved mass. Releasing a build sheet reserves, per work order, the
 * insulated wire mass per unit (result.wireMass from engine 2, which counts the enamel as a
 * spool's net mass does) × quantity × (1 + scrap allowance) from spools of the same conductor,
 * size and insulation grade, oldest lot first (by received date), splitting across spools.
 */
import { z } from 'zod';
import { CoilSpecSchema, WireSizeSchema } from './coil';

const spec = CoilSpecSchema.shape;

/** How a wire size is stated: an AWG gauge number or a metric nominal bare diameter (WireSizeSchema). */
export const WIRE_STANDARDS = ['AWG', 'metric'] as const satisfies readonly z.infer<typeof WireSizeSchema>['standard'][];
/** Conductors a spool can hold (the coil contract's list). */
export const CONDUCTORS = spec.conductor.options;
export type Conductor = (typeof CONDUCTORS)[number];
export type WireSize = z.infer<typeof WireSizeSchema>;

/** Largest net mass of one spool, kg (a big drum; anything above is a typing error). */
export const SPOOL_MASS_MAX_KG = 2000;

const text = (max: number, what: string) =>
  z
    .string({ error: `${what} must be text` })
    .trim()
    .max(max, `${what}: at most ${max} characters`)
    .refine((s) => !s.includes('\u0000'), `${what}: remove the NUL character`);

/** POST /api/spools — a spool received into stock. */
export const receiveSpoolRequest = z.object({
  conductor: spec.conductor,
  wire: WireSizeSchema,
  insulationGrade: spec.insulationGrade,
  supplier: text(120, 'Supplier').min(1, 'Enter the supplier'),
  lot: text(60, 'Lot').min(1, "Enter the supplier's lot number"),
  /** Wire on the spool (spool body not counted), kg. */
  netMass: z
    .number({ error: 'Net mass must be a number of kilograms' })
    .positive('Net mass must be above 0 kg')
    .max(SPOOL_MASS_MAX_KG, `Net mass: at most ${SPOOL_MASS_MAX_KG} kg`),
  /** Shelf or rack, free text. */
  location: text(80, 'Location').default(''),
  /** When it arrived (ISO date-time or YYYY-MM-DD); defaults to now. Orders "oldest lot first". */
  receivedAt: z
    .string({ error: 'Received: a date' })
    .refine((s) => /^\d{4}-\d{2}-\d{2}([T ][\d:.]+(Z|[+-]\d{2}:?\d{2})?)?$/.test(s) && !Number.isNaN(new Date(s).getTime()), 'Received: a date such as 2025-03-14')
    .optional(),
});
export type ReceiveSpoolRequest = z.output<typeof receiveSpoolRequest>;
export type ReceiveSpoolBody = z.input<typeof receiveSpoolRequest>;

export const listSpoolsQuery = z.object({
  conductor: spec.conductor.optional(),
  /** true: only spools with free mass left. */
  available: z.enum(['true', 'false'], { error: 'true or false' }).transform((v) => v === 'true').optional(),
});
export type ListSpoolsQuery = z.infer<typeof listSpoolsQuery>;

const person = z.object({ id: z.number().int(), name: z.string() });

export const spoolRecord = z.object({
  id: z.number().int(),
  conductor: spec.conductor,
  wire: WireSizeSchema,
  insulationGrade: z.number().int(),
  supplier: z.string(),
  lot: z.string(),
  /** kg. */
  netMass: z.number(),
  reservedMass: z.number(),
  freeMass: z.number(),
  location: z.string(),
  receivedAt: z.string(),
  receivedBy: person.nullable(),
});
export type SpoolRecord = z.infer<typeof spoolRecord>;
export const spoolListResponse = z.object({ spools: z.array(spoolRecord) });

/**
 * GET /api/build-sheets/:id/stock-check (and the `stock` of a release): what the line's work
 * orders need of the sheet's wire against the free mass on matching spools, and which spools a
 * release takes from (oldest lot first).
 */
export const stockCheck = z.object({
  conductor: spec.conductor,
  wire: WireSizeSchema,
  insulationGrade: z.number().int(),
  quantity: z.number().int(),
  /** Insulated wire mass of one unit (conductor and enamel, as a spool's net mass counts it), kg. */
  massPerUnit: z.number(),
  scrapAllowancePercent: z.number(),
  /** massPerUnit × quantity × (1 + allowance), kg. */
  needed: z.number(),
  /** Free mass on matching spools, kg. */
  available: z.number(),
  /** true when available < needed. */
  short: z.boolean(),
  /** needed − available when short, else 0, kg. */
  shortfall: z.number(),
  /** Matching spools with free mass, oldest lot first, and what a release takes from each, kg. */
  spools: z.array(
    z.object({
      id: z.number().int(),
      supplier: z.string(),
      lot: z.string(),
      location: z.string(),
      receivedAt: z.string(),
      freeMass: z.number(),
      take: z.number(),
    }),
  ),
});
export type StockCheck = z.infer<typeof stockCheck>;

/** A wire in words, e.g. "copper AWG 27, grade 2" or "aluminium 0.9 mm, grade 2". */
export function wireWords(k: { conductor: 'copper' | 'aluminium'; wire: WireSize; insulationGrade: number }): string {
  const size = k.wire.standard === 'AWG' ? `AWG ${k.wire.gauge}` : `${Number((k.wire.diameter * 1000).toPrecision(3))} mm`;
  return `${k.conductor} ${size}, grade ${k.insulationGrade}`;
}
