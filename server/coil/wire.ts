/**
 * Magnet-wire tables: AWG and IEC metric round wire, bare and overall diameters by insulation
 * grade, the wire standard's resistance tolerance, resistance and mass per metre.
 */
import { CONDUCTORS, ENAMEL_DENSITY } from './constants';
import { CoilSpecError } from './errors';
import type { Conductor, InsulationGrade, MagnetWire, WireSize } from './types';

const MIL = 25.4e-6; // one thousandth of an inch, m (exact)

/** AWG sizes the engine stocks, thickest first. */
export const AWG_MIN = 4;
export const AWG_MAX = 44;
export const AWG_GAUGES: readonly number[] = Object.freeze(
  Array.from({ length: AWG_MAX - AWG_MIN + 1 }, (_, i) => AWG_MIN + i),
);

/**
 * The defining formula of the American Wire Gauge, m: d = 0.127 mm × 92^((36 − n)/39)
 * (ASTM B258). The tables round it; the engine uses the tabulated values (awgBareDiameter).
 */
export function awgFormulaDiameter(gauge: number): number {
  return 0.127e-3 * Math.pow(92, (36 - gauge) / 39);
}

/*
 * AWG bare diameters in tenths of a mil, gauges 4..44 in order.
 *  - nominal: ASTM B258 Table 1 nominal diameters (the formula rounded to 0.1 mil, e.g. AWG 40 =
 *    0.0031 in), as printed in NEMA MW 1000 / wire makers' tables.
 *  - min / max, AWG 6–36: the bare-copper diameter limits of the "Copper Magnet Wire Data" table
 *    (NEMA MW 1000 data, scribd document 456864939). Looked up.
 *  - min / max, AWG 4–5: ±1 % (from memory); AWG 37–44: ±0.1 mil, the tolerance the same table
 *    gives AWG 27–36 (from memory for these sizes).
 */
const AWG_NOMINAL_DMIL = [
  2043, 1819, 1620, 1443, 1285, 1144, 1019, 907, 808, 720, 641, 571, 508, 453, 403, 359, 320, 285, 253, 226, 201, 179, 159,
  142, 126, 113, 100, 89, 80, 71, 63, 56, 50, 45, 40, 35, 31, 28, 25, 22, 20,
];
const AWG_MIN_DMIL = [
  2023, 1801, 1604, 1429, 1272, 1133, 1009, 898, 800, 713, 635, 565, 503, 448, 399, 355, 317, 282, 250, 224, 199, 177, 157,
  141, 125, 112, 99, 88, 79, 70, 62, 55, 49, 44, 39, 34, 30, 27, 24, 21, 19,
];
const AWG_MAX_DMIL = [
  2063, 1837, 1633, 1454, 1294, 1153, 1027, 916, 816, 727, 647, 577, 513, 458, 407, 363, 323, 288, 256, 228, 203, 181, 161,
  143, 127, 114, 101, 90, 81, 72, 64, 57, 51, 46, 41, 36, 32, 29, 26, 23, 21,
];

/** AWG bare diameter, m: the ASTM B258 tabulated nominal (rounded) value of gauges 4–44. */
export function awgBareDiameter(gauge: number): number {
  const dmil = AWG_NOMINAL_DMIL[gauge - AWG_MIN];
  if (dmil === undefined) throw new CoilSpecError('wire.gauge', `unknown gauge: AWG ${gauge}`);
  return dmil * 0.1 * MIL;
}

/** The bare diameter limits of an AWG size, m. */
export function awgBareLimits(gauge: number): { min: number; max: number } {
  const i = gauge - AWG_MIN;
  return { min: AWG_MIN_DMIL[i] * 0.1 * MIL, max: AWG_MAX_DMIL[i] * 0.1 * MIL };
}

/*
 * Maximum overall diameters of AWG magnet wire, mils, gauges 4..44 in order.
 * Grade 1 = single build, grade 2 = heavy build, grade 3 = triple build (NEMA MW 1000 names).
 *
 * Where the numbers come from:
 *  - grade 1, AWG 14–40: the single-film maximum diameters of a wire maker's catalogue
 *    table of NEMA MW 1000 dimensions (Centelsa, "Round magnet wires", NEMA MW-1000 / NTC 361).
 *  - grade 2, AWG 6–9: the heavy-film maximum diameters of the same catalogue table.
 *  - all other entries: estimated (from memory, approximate) as the nominal bare diameter
 *    plus the minimum insulation increment of the grade (heavy increments from the same
 *    catalogue; single ≈ half of heavy, triple ≈ 1.5 × heavy, from memory) plus the
 *    allowance for bare and film tolerance seen in the looked-up rows.
 * A spool's data-sheet value (spec.overallDiameter) always overrides these.
 */
const AWG_MAX_OD_MILS: Readonly<Record<InsulationGrade, readonly number[]>> = Object.freeze({
  1: [
    207.9, 185.3, 165.4, 147.4, 131.6, 117.3, 104.7, 93.3, 83.3, 74.4, 66.6, 59.4, 53.1, 47.5, 42.4,
    37.9, 33.9, 30.3, 27.0, 24.3, 21.7, 19.4, 17.3, 15.6, 14.0, 12.6, 11.2, 10.0, 9.1, 8.1, 7.2, 6.4,
    5.8, 5.2, 4.7, 4.1, 3.7, 3.3, 3.0, 2.7, 2.5,
  ],
  2: [
    209.7, 187.1, 167.1, 149.1, 133.2, 118.9, 106.2, 94.8, 84.7, 75.8, 68.2, 60.9, 54.6, 48.9, 43.7,
    39.2, 35.0, 31.4, 28.0, 25.3, 22.6, 20.3, 18.1, 16.4, 14.8, 13.4, 11.9, 10.7, 9.7, 8.7, 7.7, 6.9,
    6.2, 5.7, 5.1, 4.5, 4.1, 3.6, 3.3, 2.9, 2.7,
  ],
  3: [
    211.6, 188.9, 168.9, 150.8, 134.9, 120.5, 107.8, 96.3, 86.1, 77.2, 69.8, 62.4, 56.1, 50.3, 45.0,
    40.4, 36.2, 32.5, 29.1, 26.3, 23.6, 21.2, 19.0, 17.2, 15.6, 14.2, 12.6, 11.4, 10.3, 9.3, 8.2, 7.4,
    6.6, 6.1, 5.5, 4.8, 4.4, 3.9, 3.6, 3.1, 2.9,
  ],
});

/** Maximum overall diameter of an AWG magnet wire of the grade, m. */
export function awgOverallDiameter(gauge: number, grade: InsulationGrade): number {
  return AWG_MAX_OD_MILS[grade][gauge - AWG_MIN] * MIL;
}

/*
 * IEC 60317-0-1 nominal conductor diameters (mm) with maximum overall diameters (mm) for
 * grades 1, 2 and 3: [nominal, grade 1, grade 2, grade 3]. The R20 sizes with the R40
 * intermediate sizes of the standard, 0.018–5.000 mm (the series from memory).
 *
 * Where the overall diameters come from: at 0.020, 0.050, 0.100, 0.200, 0.500, 1.000, 2.000 and
 * 5.000 mm they are recalled (from memory, approximate; 0.100 mm grade 1 = 0.117 mm agrees with a
 * wire maker's published grade table); 0.315 mm is looked up (0.349 / 0.367 / 0.384 mm, IS
 * 13730-0-1 — the Indian adoption of IEC 60317-0-1 — as tabulated by Avanti Cables for SWG 30).
 * Every other R20 row is interpolated log-log in the insulation increase (overall − nominal)
 * between those, and every R40 row (marked) between its two R20 neighbours, rounded to 0.001 mm.
 */
const METRIC_TABLE_MM: readonly (readonly [number, number, number, number])[] = Object.freeze([
  [0.018, 0.023, 0.024, 0.027],
  [0.019, 0.024, 0.025, 0.028], // R40
  [0.02, 0.025, 0.027, 0.03],
  [0.021, 0.026, 0.028, 0.032], // R40
  [0.022, 0.027, 0.03, 0.033],
  [0.024, 0.03, 0.033, 0.036], // R40
  [0.025, 0.031, 0.034, 0.037],
  [0.027, 0.033, 0.036, 0.04], // R40
  [0.028, 0.034, 0.037, 0.041],
  [0.03, 0.036, 0.04, 0.044], // R40
  [0.032, 0.039, 0.043, 0.047],
  [0.034, 0.041, 0.046, 0.05], // R40
  [0.036, 0.044, 0.048, 0.052],
  [0.038, 0.046, 0.051, 0.055], // R40
  [0.04, 0.048, 0.053, 0.058],
  [0.043, 0.052, 0.057, 0.062], // R40
  [0.045, 0.054, 0.06, 0.064],
  [0.048, 0.058, 0.064, 0.068], // R40
  [0.05, 0.06, 0.066, 0.071],
  [0.053, 0.064, 0.07, 0.075], // R40
  [0.056, 0.067, 0.073, 0.078],
  [0.06, 0.072, 0.078, 0.083], // R40
  [0.063, 0.075, 0.082, 0.087],
  [0.067, 0.08, 0.087, 0.092], // R40
  [0.071, 0.084, 0.091, 0.097],
  [0.075, 0.088, 0.096, 0.102], // R40
  [0.08, 0.094, 0.102, 0.108],
  [0.085, 0.1, 0.108, 0.114], // R40
  [0.09, 0.106, 0.113, 0.12],
  [0.095, 0.112, 0.119, 0.126], // R40
  [0.1, 0.117, 0.125, 0.132],
  [0.106, 0.124, 0.132, 0.14], // R40
  [0.112, 0.13, 0.139, 0.147],
  [0.118, 0.136, 0.146, 0.154], // R40
  [0.125, 0.144, 0.154, 0.162],
  [0.132, 0.152, 0.162, 0.171], // R40
  [0.14, 0.161, 0.171, 0.181],
  [0.15, 0.172, 0.183, 0.193], // R40
  [0.16, 0.183, 0.194, 0.204],
  [0.17, 0.194, 0.205, 0.216], // R40
  [0.18, 0.204, 0.216, 0.228],
  [0.19, 0.215, 0.228, 0.24], // R40
  [0.2, 0.226, 0.239, 0.252],
  [0.212, 0.239, 0.253, 0.266], // R40
  [0.224, 0.252, 0.266, 0.279],
  [0.236, 0.265, 0.279, 0.293], // R40
  [0.25, 0.28, 0.294, 0.309],
  [0.265, 0.296, 0.311, 0.326], // R40
  [0.28, 0.312, 0.327, 0.343],
  [0.3, 0.333, 0.35, 0.366], // R40
  [0.315, 0.349, 0.367, 0.384],
  [0.335, 0.37, 0.388, 0.406], // R40
  [0.355, 0.391, 0.409, 0.427],
  [0.375, 0.412, 0.431, 0.449], // R40
  [0.4, 0.439, 0.458, 0.477],
  [0.425, 0.465, 0.485, 0.505], // R40
  [0.45, 0.491, 0.512, 0.532],
  [0.475, 0.518, 0.539, 0.56], // R40
  [0.5, 0.544, 0.566, 0.587],
  [0.53, 0.576, 0.598, 0.62], // R40
  [0.56, 0.607, 0.63, 0.652],
  [0.6, 0.648, 0.672, 0.695], // R40
  [0.63, 0.679, 0.704, 0.728],
  [0.67, 0.721, 0.747, 0.771], // R40
  [0.71, 0.762, 0.789, 0.814],
  [0.75, 0.804, 0.831, 0.857], // R40
  [0.8, 0.856, 0.883, 0.911],
  [0.85, 0.908, 0.936, 0.964], // R40
  [0.9, 0.959, 0.988, 1.017],
  [0.95, 1.011, 1.041, 1.071], // R40
  [1, 1.062, 1.093, 1.124],
  [1.06, 1.123, 1.155, 1.186], // R40
  [1.12, 1.184, 1.216, 1.248],
  [1.18, 1.245, 1.277, 1.31], // R40
  [1.25, 1.316, 1.349, 1.382],
  [1.32, 1.387, 1.42, 1.454], // R40
  [1.4, 1.468, 1.502, 1.536],
  [1.5, 1.569, 1.604, 1.639], // R40
  [1.6, 1.67, 1.705, 1.741],
  [1.7, 1.771, 1.807, 1.844], // R40
  [1.8, 1.872, 1.909, 1.946],
  [1.9, 1.973, 2.011, 2.048], // R40
  [2, 2.074, 2.112, 2.15],
  [2.12, 2.195, 2.233, 2.271], // R40
  [2.24, 2.315, 2.353, 2.392],
  [2.36, 2.435, 2.474, 2.512], // R40
  [2.5, 2.576, 2.615, 2.653],
  [2.65, 2.727, 2.766, 2.804], // R40
  [2.8, 2.878, 2.916, 2.955],
  [3, 3.079, 3.117, 3.156], // R40
  [3.15, 3.229, 3.268, 3.307],
  [3.35, 3.43, 3.469, 3.508], // R40
  [3.55, 3.63, 3.669, 3.709],
  [3.75, 3.83, 3.87, 3.909], // R40
  [4, 4.081, 4.121, 4.16],
  [4.25, 4.332, 4.372, 4.411], // R40
  [4.5, 4.583, 4.623, 4.662],
  [4.75, 4.834, 4.874, 4.913], // R40
  [5, 5.084, 5.124, 5.164],

]);

/** IEC 60317-0-1 nominal conductor diameters, m, thickest first. */
export const METRIC_DIAMETERS: readonly number[] = Object.freeze(
  METRIC_TABLE_MM.map((row) => row[0] * 1e-3).reverse(),
);

/** Index of a metric nominal diameter (m) in the table, or -1 when it is not a nominal size. */
export function metricIndex(diameter: number): number {
  for (let i = 0; i < METRIC_TABLE_MM.length; i++) {
    const nominal = METRIC_TABLE_MM[i][0] * 1e-3;
    if (Math.abs(diameter - nominal) <= nominal * 1e-6) return i;
  }
  return -1;
}

/** Maximum overall diameter of an IEC 60317-0-1 wire of the grade, m. */
export function metricOverallDiameter(diameter: number, grade: InsulationGrade): number {
  const i = metricIndex(diameter);
  if (i < 0) throw new CoilSpecError('wire.diameter', `${diameter * 1e3} mm is not an IEC 60317-0-1 nominal diameter`);
  return METRIC_TABLE_MM[i][grade] * 1e-3;
}

/*
 * Tolerance on the nominal conductor diameter of metric wire, mm, as [up to this nominal, ±tol]:
 * 0.071–5.000 mm from Transwire's "General engineering data — tolerance on nominal diameter of
 * conductor" (the IEC 60317-0-1 values; intermediate sizes take the tolerance of the next larger
 * size listed). Looked up. Below 0.071 mm: ±0.002 mm from 0.040 mm, ±0.001 mm below (from memory;
 * at 0.020 mm it gives about ±10 % in resistance, as Elektrisola's published 0.020 mm limits do).
 */
const METRIC_DIAMETER_TOLERANCE_MM: readonly (readonly [number, number])[] = Object.freeze([
  [0.036, 0.001],
  [0.063, 0.002],
  [0.224, 0.003],
  [0.355, 0.004],
  [0.5, 0.005],
  [0.63, 0.006],
  [0.71, 0.007],
  [0.8, 0.008],
  [0.9, 0.009],
  [1.0, 0.01],
  [1.12, 0.011],
  [1.25, 0.013],
  [1.4, 0.014],
  [1.6, 0.016],
  [1.8, 0.018],
  [2.0, 0.02],
  [2.24, 0.022],
  [2.5, 0.025],
  [2.8, 0.028],
  [3.15, 0.032],
  [3.55, 0.036],
  [4.0, 0.04],
  [5.0, 0.05],
]);

/** ± tolerance on a metric nominal conductor diameter, m. */
export function metricDiameterTolerance(diameter: number): number {
  const mm = diameter * 1e3;
  for (const [upTo, tol] of METRIC_DIAMETER_TOLERANCE_MM) if (mm <= upTo * (1 + 1e-9)) return tol * 1e-3;
  return METRIC_DIAMETER_TOLERANCE_MM[METRIC_DIAMETER_TOLERANCE_MM.length - 1][1] * 1e-3;
}

/** Every standard size of a wire standard, thickest first. */
export function standardSizes(standard: 'AWG' | 'metric'): WireSize[] {
  return standard === 'AWG'
    ? AWG_GAUGES.map((gauge) => ({ standard: 'AWG' as const, gauge }))
    : METRIC_DIAMETERS.map((diameter) => ({ standard: 'metric' as const, diameter }));
}

/** Check that a size is a known standard size; throws CoilSpecError naming `field` otherwise. */
export function checkWireSize(size: WireSize, field = 'wire'): void {
  if (size === null || typeof size !== 'object') throw new CoilSpecError(field, 'wire size is required');
  if (size.standard === 'AWG') {
    if (!Number.isInteger(size.gauge) || size.gauge < AWG_MIN || size.gauge > AWG_MAX) {
      throw new CoilSpecError(`${field}.gauge`, `unknown gauge: AWG ${size.gauge} (stocked sizes are AWG ${AWG_MIN}–${AWG_MAX})`);
    }
  } else if (size.standard === 'metric') {
    if (!(typeof size.diameter === 'number' && Number.isFinite(size.diameter) && size.diameter > 0)) {
      throw new CoilSpecError(`${field}.diameter`, 'metric diameter must be a positive number of metres');
    }
    if (metricIndex(size.diameter) < 0) {
      throw new CoilSpecError(`${field}.diameter`, `unknown gauge: ${size.diameter * 1e3} mm is not an IEC 60317-0-1 nominal diameter`);
    }
  } else {
    throw new CoilSpecError(`${field}.standard`, "wire standard must be 'AWG' or 'metric'");
  }
}

/** Nominal bare diameter of a standard size, m (AWG: the ASTM B258 table; metric: the nominal). */
export function bareDiameterOf(size: WireSize): number {
  return size.standard === 'AWG' ? awgBareDiameter(size.gauge) : size.diameter;
}

/**
 * A magnet wire: bare and overall diameter, bare area, resistance per metre at 20 °C
 * (R' = ρ20 / A) with the standard's tolerance, conductor mass per metre (density × A) and the
 * insulated wire's mass per metre (conductor plus enamel).
 */
export function magnetWire(size: WireSize, conductor: Conductor, grade: InsulationGrade): MagnetWire {
  checkWireSize(size);
  if (conductor !== 'copper' && conductor !== 'aluminium') {
    throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  }
  if (grade !== 1 && grade !== 2 && grade !== 3) throw new CoilSpecError('insulationGrade', 'insulation grade must be 1, 2 or 3');
  return makeWire(size, conductor, grade, undefined);
}

const fmtPct = (x: number) => (x * 100).toFixed(1);

/** Resistance tolerance of a size from its bare-diameter limits: R ∝ 1/d². */
function resistanceToleranceOf(size: WireSize, bare: number): MagnetWire['resistanceTolerance'] {
  if (size.standard === 'AWG') {
    const { min, max } = awgBareLimits(size.gauge);
    const plus = (bare / min) ** 2 - 1;
    const minus = 1 - (bare / max) ** 2;
    const measured = size.gauge >= 6 && size.gauge <= 36;
    return {
      minus,
      plus,
      source: `AWG ${size.gauge} bare-diameter limits ${fmtPct(-minus)}/+${fmtPct(plus)} % in resistance (NEMA MW 1000 table${measured ? '' : ', from memory for this size'})`,
    };
  }
  const tol = metricDiameterTolerance(bare);
  const plus = (bare / (bare - tol)) ** 2 - 1;
  const minus = 1 - (bare / (bare + tol)) ** 2;
  return {
    minus,
    plus,
    source: `${(bare * 1e3).toFixed(3)} mm ±${(tol * 1e3).toFixed(3)} mm conductor tolerance: ${fmtPct(-minus)}/+${fmtPct(plus)} % in resistance (IEC 60317-0-1${bare < 0.0709e-3 ? ', from memory for this size' : ''})`,
  };
}

/**
 * Insulated wire mass per metre, kg/m: conductor density × bare area plus enamel density × the
 * annulus up to the overall diameter. For results computed before the engine counted the enamel.
 */
export function insulatedMassPerMetre(conductor: Conductor, bareDiameter: number, overallDiameter: number): number {
  const area = (Math.PI / 4) * bareDiameter * bareDiameter;
  const enamel = (Math.PI / 4) * Math.max(0, overallDiameter * overallDiameter - bareDiameter * bareDiameter);
  return CONDUCTORS[conductor].density * area + ENAMEL_DENSITY * enamel;
}

/** magnetWire without validation, for the engine's own loops. */
export function makeWire(
  size: WireSize,
  conductor: Conductor,
  grade: InsulationGrade,
  overallOverride: number | undefined,
): MagnetWire {
  let bareDiameter: number;
  let overallDiameter: number;
  if (size.standard === 'AWG') {
    bareDiameter = awgBareDiameter(size.gauge);
    overallDiameter = awgOverallDiameter(size.gauge, grade);
  } else {
    bareDiameter = size.diameter;
    overallDiameter = metricOverallDiameter(size.diameter, grade);
  }
  if (overallOverride !== undefined) overallDiameter = overallOverride;
  const area = (Math.PI / 4) * bareDiameter * bareDiameter;
  const enamelArea = (Math.PI / 4) * (overallDiameter * overallDiameter - bareDiameter * bareDiameter);
  const p = CONDUCTORS[conductor];
  const conductorMassPerMetre = p.density * area;
  return {
    size,
    conductor,
    grade,
    bareDiameter,
    overallDiameter,
    area,
    resistancePerMetre20: p.resistivity20 / area,
    resistanceTolerance: resistanceToleranceOf(size, bareDiameter),
    conductorMassPerMetre,
    massPerMetre: conductorMassPerMetre + ENAMEL_DENSITY * enamelArea,
  };
}
