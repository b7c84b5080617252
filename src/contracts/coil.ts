/**
 * API contract of the coil engine: the zod schema of a coil requirement (CoilSpec) and of a
 * solve target, with their inferred types. Imports nothing but zod. All quantities are SI
 * (metres, volts, amperes, W/(m²·K), tesla, newtons); temperatures in °C.
 *
 * The rules are the same as the engine's own checks in server/coil/validate.ts;
 * tests/coil/contract.test.ts keeps the two in step.
 */
import { z } from 'zod';

/** Stocked AWG sizes. */
export const AWG_GAUGE_MIN = 4;
export const AWG_GAUGE_MAX = 44;

/** IEC 60317-0-1 nominal conductor diameters, mm (from memory). */
export const METRIC_NOMINAL_DIAMETERS_MM = [
  0.018, 0.02, 0.022, 0.025, 0.028, 0.032, 0.036, 0.04, 0.045, 0.05, 0.056, 0.063, 0.071, 0.08, 0.09, 0.1,
  0.112, 0.125, 0.14, 0.16, 0.18, 0.2, 0.224, 0.25, 0.28, 0.315, 0.355, 0.4, 0.45, 0.5, 0.56, 0.63, 0.71,
  0.8, 0.9, 1.0, 1.12, 1.25, 1.4, 1.6, 1.8, 2.0, 2.24, 2.5, 2.8, 3.15, 3.55, 4.0, 4.5, 5.0,
] as const;

/** IEC 60085 thermal classes, °C. */
export const THERMAL_CLASS_VALUES = [105, 120, 130, 155, 180, 200, 220] as const;

/** Largest bare fill of round wires (hexagonal close packing, π/(2√3)). */
export const MAX_FILL = Math.PI / (2 * Math.sqrt(3));

export const AMBIENT_MIN_C = -100;
export const AMBIENT_MAX_C = 250;

function isMetricNominal(diameter: number): boolean {
  return METRIC_NOMINAL_DIAMETERS_MM.some((mm) => Math.abs(diameter - mm * 1e-3) <= mm * 1e-9);
}

/** AWG bare diameter, m (ASTM B258): 0.127 mm × 92^((36 − n)/39). */
function awgBare(gauge: number): number {
  return 0.127e-3 * Math.pow(92, (36 - gauge) / 39);
}

const positive = (what: string) => z.number({ error: `${what} must be a positive number` }).positive(`${what} must be a positive number`);
const nonNegative = (what: string) =>
  z.number({ error: `${what} must be zero or a positive number` }).nonnegative(`${what} must be zero or a positive number`);

export const WireSizeSchema = z.discriminatedUnion('standard', [
  z.object({
    standard: z.literal('AWG'),
    gauge: z
      .int({ error: 'unknown gauge' })
      .min(AWG_GAUGE_MIN, `unknown gauge (stocked sizes are AWG ${AWG_GAUGE_MIN}–${AWG_GAUGE_MAX})`)
      .max(AWG_GAUGE_MAX, `unknown gauge (stocked sizes are AWG ${AWG_GAUGE_MIN}–${AWG_GAUGE_MAX})`),
  }),
  z.object({
    standard: z.literal('metric'),
    diameter: positive('metric diameter').refine(isMetricNominal, 'unknown gauge: not an IEC 60317-0-1 nominal diameter'),
  }),
]);

export const BobbinSchema = z
  .object({
    innerDiameter: nonNegative('inner diameter'),
    outerDiameter: positive('outer diameter'),
    length: positive('traverse length'),
  })
  .refine((b) => b.innerDiameter < b.outerDiameter, {
    message: 'inner diameter must be smaller than the outer diameter',
    path: ['innerDiameter'],
  });

export const DriveSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('voltage'), volts: positive('drive voltage') }),
  z.object({ kind: z.literal('current'), amps: positive('drive current') }),
]);

export const MagneticCircuitSchema = z
  .object({
    relativePermeability: z.number().min(1, 'relative permeability must be at least 1'),
    saturationFluxDensity: positive('saturation flux density'),
    ironPathLength: nonNegative('iron path length'),
    airGap: nonNegative('air gap'),
    gapCount: z.int().min(0, 'gap count must be a whole number, zero or more'),
    area: positive('flux path area'),
  })
  .refine((m) => m.ironPathLength > 0 || (m.airGap > 0 && m.gapCount > 0), {
    message: 'the flux path needs an iron length or an air gap',
    path: ['ironPathLength'],
  });

export const CoilSpecSchema = z
  .object({
    conductor: z.enum(['copper', 'aluminium']),
    wire: WireSizeSchema,
    insulationGrade: z.literal([1, 2, 3]),
    overallDiameter: positive('overall diameter').optional(),
    bobbin: BobbinSchema,
    pattern: z.enum(['layer', 'orthocyclic', 'random']),
    fillFactor: z
      .number()
      .positive('fill factor must be above 0')
      .max(MAX_FILL, 'fill factor cannot exceed close packing')
      .optional(),
    turns: z.int().min(1, 'turns must be a whole number of at least 1').optional(),
    leadLength: nonNegative('lead length').optional(),
    drive: DriveSchema,
    dutyCycle: z.number().positive('duty cycle must be above 0').max(1, 'duty cycle must be at most 1'),
    ambient: z.number().min(AMBIENT_MIN_C).max(AMBIENT_MAX_C),
    insulationClass: z.literal(THERMAL_CLASS_VALUES),
    heatTransferCoefficient: positive('heat-transfer coefficient').optional(),
    hotSpotAllowance: nonNegative('hot-spot allowance').optional(),
    magneticCircuit: MagneticCircuitSchema.optional(),
  })
  .superRefine((spec, ctx) => {
    if (spec.fillFactor !== undefined && spec.pattern !== 'random') {
      ctx.addIssue({ code: 'custom', path: ['fillFactor'], message: 'a fill factor applies to random winding only' });
    }
    if (spec.overallDiameter !== undefined) {
      const bare = spec.wire.standard === 'AWG' ? awgBare(spec.wire.gauge) : spec.wire.diameter;
      if (spec.overallDiameter <= bare) {
        ctx.addIssue({
          code: 'custom',
          path: ['overallDiameter'],
          message: 'overall diameter must be larger than the bare diameter',
        });
      }
    }
  });

export type CoilSpec = z.infer<typeof CoilSpecSchema>;

export const CoilTargetSchema = z
  .object({
    ampereTurns: positive('target ampere-turns').optional(),
    pullForce: positive('target pull').optional(),
    gapFluxDensity: positive('target gap flux density').optional(),
  })
  .refine((t) => t.ampereTurns !== undefined || t.pullForce !== undefined || t.gapFluxDensity !== undefined, {
    message: 'name at least one of ampereTurns, pullForce, gapFluxDensity',
  });

export type CoilTarget = z.infer<typeof CoilTargetSchema>;

/** A solve request: a spec and a target; pull and gap targets need a magnetic circuit. */
export const CoilSolveRequestSchema = z
  .object({ spec: CoilSpecSchema, target: CoilTargetSchema })
  .superRefine((req, ctx) => {
    if (!req.spec.magneticCircuit) {
      if (req.target.pullForce !== undefined) {
        ctx.addIssue({ code: 'custom', path: ['target', 'pullForce'], message: 'a pull target needs a magnetic circuit in the spec' });
      }
      if (req.target.gapFluxDensity !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['target', 'gapFluxDensity'],
          message: 'a gap flux density target needs a magnetic circuit in the spec',
        });
      }
    }
  });

export type CoilSolveRequest = z.infer<typeof CoilSolveRequestSchema>;

/** POST /api/coil/profile: the curves a build sheet draws, computed by the engine on the server. */
export const coilProfileResponse = z.object({
  /** On-axis air-core field at the hot operating point, z in m from the winding's centre, B in T. */
  field: z.array(z.object({ z: z.number(), B: z.number() })),
  /** Pull across the working range of the gap (only with a magnetic circuit): gap in m, force in N. */
  pull: z
    .object({
      caution: z.string(),
      points: z.array(z.object({ gap: z.number(), fluxDensity: z.number(), force: z.number(), saturated: z.boolean() })),
    })
    .nullable(),
  /** Winding temperature from switch-on to steady state: t in s, T in °C. */
  warmUp: z.array(z.object({ t: z.number(), T: z.number() })),
});
export type CoilProfileResponse = z.infer<typeof coilProfileResponse>;

/** GET /api/coil/reference: the engine's own conductor constants (SI) with their sources. */
const conductorReference = z.object({
  resistivity20: z.number(),
  alpha20: z.number(),
  density: z.number(),
  specificHeat: z.number(),
  resistanceMethodK: z.number(),
  sources: z.record(z.string(), z.string()),
});
export const coilReferenceResponse = z.object({
  conductors: z.object({ copper: conductorReference, aluminium: conductorReference }),
  thermalClasses: z.array(z.number()),
});
export type CoilReferenceResponse = z.infer<typeof coilReferenceResponse>;
