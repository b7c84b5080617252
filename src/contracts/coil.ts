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

/** IEC 60317-0-1 nominal conductor diameters, mm: the R20 sizes with the R40 intermediate sizes (from memory). */
export const METRIC_NOMINAL_DIAMETERS_MM = [
  0.018, 0.019, 0.02, 0.021, 0.022, 0.024, 0.025, 0.027, 0.028, 0.03, 0.032, 0.034, 0.036, 0.038, 0.04,
  0.043, 0.045, 0.048, 0.05, 0.053, 0.056, 0.06, 0.063, 0.067, 0.071, 0.075, 0.08, 0.085, 0.09, 0.095, 0.1,
  0.106, 0.112, 0.118, 0.125, 0.132, 0.14, 0.15, 0.16, 0.17, 0.18, 0.19, 0.2, 0.212, 0.224, 0.236, 0.25,
  0.265, 0.28, 0.3, 0.315, 0.335, 0.355, 0.375, 0.4, 0.425, 0.45, 0.475, 0.5, 0.53, 0.56, 0.6, 0.63, 0.67,
  0.71, 0.75, 0.8, 0.85, 0.9, 0.95, 1, 1.06, 1.12, 1.18, 1.25, 1.32, 1.4, 1.5, 1.6, 1.7, 1.8, 1.9, 2, 2.12,
  2.24, 2.36, 2.5, 2.65, 2.8, 3, 3.15, 3.35, 3.55, 3.75, 4, 4.25, 4.5, 4.75, 5,
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

/**
 * AWG nominal bare diameters, inches, AWG 4..44 in order: ASTM B258 Table 1 (the defining formula
 * rounded to 0.1 mil). The engine holds the same table (server/coil/wire.ts).
 */
export const AWG_NOMINAL_DIAMETERS_IN = [
  0.2043, 0.1819, 0.162, 0.1443, 0.1285, 0.1144, 0.1019, 0.0907, 0.0808, 0.072, 0.0641, 0.0571, 0.0508, 0.0453, 0.0403, 0.0359,
  0.032, 0.0285, 0.0253, 0.0226, 0.0201, 0.0179, 0.0159, 0.0142, 0.0126, 0.0113, 0.01, 0.0089, 0.008, 0.0071, 0.0063, 0.0056,
  0.005, 0.0045, 0.004, 0.0035, 0.0031, 0.0028, 0.0025, 0.0022, 0.002,
] as const;

/** AWG bare diameter, m: the ASTM B258 tabulated nominal value. */
function awgBare(gauge: number): number {
  return (AWG_NOMINAL_DIAMETERS_IN[gauge - AWG_GAUGE_MIN] ?? Number.NaN) * 0.0254;
}

/** Turns per overall-diameter² of window of hexagonal close packing, 2/√3. */
export const MAX_PACKING = 2 / Math.sqrt(3);

/** Spec limits shared with the engine (server/coil/validate.ts). */
export const SUPPLY_LOW_MIN = 0.5;
export const SUPPLY_HIGH_MAX = 2;
export const CYCLE_TIME_MAX_S = 86400;
export const CLAMP_VOLTAGE_MAX_V = 10000;
export const BH_POINTS_MAX = 64;
export const SUPPRESSION_KINDS = ['none', 'diode', 'diode-zener', 'tvs'] as const;

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

/** A DC magnetization curve: 2–64 points [H (A/m), B (T)], both rising strictly. */
export const BHCurveSchema = z
  .array(
    z.tuple([nonNegative('H'), nonNegative('B')], { error: 'each point is [H in A/m, B in T], both zero or positive' }),
    { error: `a B–H curve needs 2 to ${BH_POINTS_MAX} points [H, B]` },
  )
  .min(2, `a B–H curve needs 2 to ${BH_POINTS_MAX} points [H, B]`)
  .max(BH_POINTS_MAX, `a B–H curve needs 2 to ${BH_POINTS_MAX} points [H, B]`)
  .superRefine((pts, ctx) => {
    for (let i = 1; i < pts.length; i++) {
      if (!(pts[i][0] > pts[i - 1][0]) || !(pts[i][1] > pts[i - 1][1])) {
        ctx.addIssue({ code: 'custom', path: [i], message: 'H and B must both rise from point to point' });
        return;
      }
    }
  });

export const MagneticCircuitSchema = z
  .object({
    relativePermeability: z.number().min(1, 'relative permeability must be at least 1'),
    saturationFluxDensity: positive('saturation flux density'),
    ironPathLength: nonNegative('iron path length'),
    airGap: nonNegative('air gap'),
    gapCount: z.int().min(0, 'gap count must be a whole number, zero or more'),
    area: positive('flux path area'),
    /** The iron's B–H curve; with it the engine solves the circuit on the curve and reads saturationFluxDensity as its knee. */
    bhCurve: BHCurveSchema.optional(),
  })
  .refine((m) => m.ironPathLength > 0 || (m.airGap > 0 && m.gapCount > 0), {
    message: 'the flux path needs an iron length or an air gap',
    path: ['ironPathLength'],
  });

export const SupplyToleranceSchema = z.object({
  low: z
    .number({ error: 'low end of the supply must be a number' })
    .min(SUPPLY_LOW_MIN, `low end of the supply must be between ${SUPPLY_LOW_MIN} and 1 of the rated value`)
    .max(1, `low end of the supply must be between ${SUPPLY_LOW_MIN} and 1 of the rated value`),
  high: z
    .number({ error: 'high end of the supply must be a number' })
    .min(1, `high end of the supply must be between 1 and ${SUPPLY_HIGH_MAX} of the rated value`)
    .max(SUPPLY_HIGH_MAX, `high end of the supply must be between 1 and ${SUPPLY_HIGH_MAX} of the rated value`),
});

export const SuppressionSchema = z
  .object({
    kind: z.enum(SUPPRESSION_KINDS, { error: "suppression must be 'none', 'diode', 'diode-zener' or 'tvs'" }),
    clampVoltage: positive('clamp voltage').max(CLAMP_VOLTAGE_MAX_V, `clamp voltage: at most ${CLAMP_VOLTAGE_MAX_V} V`).optional(),
  })
  .superRefine((s, ctx) => {
    if (s.kind === 'none' && s.clampVoltage !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['clampVoltage'], message: 'no clamp voltage without suppression' });
    }
    if ((s.kind === 'diode-zener' || s.kind === 'tvs') && s.clampVoltage === undefined) {
      ctx.addIssue({ code: 'custom', path: ['clampVoltage'], message: `a ${s.kind === 'tvs' ? 'TVS' : 'Zener'} needs its clamp voltage` });
    }
  });

export const CoilSpecSchema = z
  .object({
    conductor: z.enum(['copper', 'aluminium']),
    wire: WireSizeSchema,
    insulationGrade: z.literal([1, 2, 3]),
    overallDiameter: positive('overall diameter').optional(),
    bobbin: BobbinSchema,
    pattern: z.enum(['layer', 'orthocyclic', 'random']),
    /** Random winding: turns per overall-diameter² of window (default 0.9, at most 2/√3). */
    packingFactor: z
      .number({ error: 'packing must be a number' })
      .positive('packing must be above 0')
      .max(MAX_PACKING + 1e-12, 'packing cannot exceed close packing (1.155 turns per d²)')
      .optional(),
    /** Random winding, sheets drafted before packingFactor: the bare-copper fill asked for. */
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
    /** Highest ambient, °C (default: ambient); the corners are taken there. */
    ambientMax: z.number({ error: 'highest ambient must be a number' }).max(AMBIENT_MAX_C, `highest ambient: at most ${AMBIENT_MAX_C} °C`).optional(),
    /** Operating band of the supply as fractions of the rated drive (default 0.85 / 1.10). */
    supplyTolerance: SupplyToleranceSchema.optional(),
    /** Period of the on/off cycle, s. */
    cycleTime: positive('cycle time').max(CYCLE_TIME_MAX_S, `cycle time: at most ${CYCLE_TIME_MAX_S} s`).optional(),
    /** Switch-off suppression across the coil (default: a diode, assumed). */
    suppression: SuppressionSchema.optional(),
    insulationClass: z.literal(THERMAL_CLASS_VALUES),
    heatTransferCoefficient: positive('heat-transfer coefficient').optional(),
    hotSpotAllowance: nonNegative('hot-spot allowance').optional(),
    magneticCircuit: MagneticCircuitSchema.optional(),
  })
  .superRefine((spec, ctx) => {
    if (spec.fillFactor !== undefined && spec.pattern !== 'random') {
      ctx.addIssue({ code: 'custom', path: ['fillFactor'], message: 'a fill factor applies to random winding only' });
    }
    if (spec.packingFactor !== undefined && spec.pattern !== 'random') {
      ctx.addIssue({ code: 'custom', path: ['packingFactor'], message: 'a packing factor applies to random winding only' });
    }
    if (spec.ambientMax !== undefined && spec.ambientMax < spec.ambient) {
      ctx.addIssue({ code: 'custom', path: ['ambientMax'], message: 'highest ambient must not be below the rated ambient' });
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
  /** Winding temperature from switch-on to steady state (duty-averaged power, resistance feedback): t in s, T in °C. */
  warmUp: z.array(z.object({ t: z.number(), T: z.number() })),
  /**
   * The iron's B–H picture (only with a magnetic circuit): the curve (or the linear model with its
   * cap) and the operating points of the low, nominal and high corners; H in A/m, B in T.
   */
  bh: z
    .object({
      model: z.enum(['curve', 'linear']),
      knee: z.number(),
      curve: z.array(z.object({ H: z.number(), B: z.number() })),
      points: z.array(z.object({ corner: z.enum(['low', 'nominal', 'high']), H: z.number(), B: z.number() })),
    })
    .nullable(),
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
  /** The engine that computes new drafts now. */
  engineVersion: z.string(),
  conductors: z.object({ copper: conductorReference, aluminium: conductorReference }),
  thermalClasses: z.array(z.number()),
  /** Hot-spot allowance per thermal class, K, with its source. */
  hotSpot: z.object({ allowances: z.record(z.string(), z.number()), source: z.string() }),
  /** The engine's default supply band (fractions of rated) and its source. */
  supplyTolerance: z.object({ low: z.number(), high: z.number(), source: z.string() }),
  /** The core-material library: linear μr, saturation or knee, and a B–H curve where there is one. */
  coreMaterials: z.array(
    z.object({
      id: z.string(),
      name: z.string(),
      relativePermeability: z.number(),
      saturationFluxDensity: z.number(),
      bhCurve: z.array(z.tuple([z.number(), z.number()])).optional(),
      source: z.string(),
    }),
  ),
});
export type CoilReferenceResponse = z.infer<typeof coilReferenceResponse>;
