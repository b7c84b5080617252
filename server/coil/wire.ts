/**
 * Magnet-wire tables: AWG and IEC metric round wire, bare and overall diameters by
 * insulation grade, resistance and mass per metre.
 */
import { CONDUCTORS } from './constants';
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
 * AWG bare diameter, m: d = 0.127 mm × 92^((36 − n)/39) (ASTM B258, the defining formula of
 * the American Wire Gauge).
 */
export function awgBareDiameter(gauge: number): number {
  return 0.127e-3 * Math.pow(92, (36 - gauge) / 39);
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
 * grades 1, 2 and 3: [nominal, grade 1, grade 2, grade 3].
 *
 * The nominal series (R20 with R40 intermediates, 0.018–5.000 mm) is from memory. Maximum
 * overall diameters at 0.020, 0.050, 0.100, 0.200, 0.500, 1.000, 2.000 and 5.000 mm are
 * recalled (from memory, approximate; 0.100 mm grade 1 = 0.117 mm agrees with a wire maker's
 * published grade table); the rows between them are interpolated log-log in the insulation
 * increase (overall − nominal) and rounded to 0.001 mm.
 */
const METRIC_TABLE_MM: readonly (readonly [number, number, number, number])[] = Object.freeze([
  [0.018, 0.023, 0.024, 0.027],
  [0.02, 0.025, 0.027, 0.03],
  [0.022, 0.027, 0.03, 0.033],
  [0.025, 0.031, 0.034, 0.037],
  [0.028, 0.034, 0.037, 0.041],
  [0.032, 0.039, 0.043, 0.047],
  [0.036, 0.044, 0.048, 0.052],
  [0.04, 0.048, 0.053, 0.058],
  [0.045, 0.054, 0.06, 0.064],
  [0.05, 0.06, 0.066, 0.071],
  [0.056, 0.067, 0.073, 0.078],
  [0.063, 0.075, 0.082, 0.087],
  [0.071, 0.084, 0.091, 0.097],
  [0.08, 0.094, 0.102, 0.108],
  [0.09, 0.106, 0.113, 0.12],
  [0.1, 0.117, 0.125, 0.132],
  [0.112, 0.13, 0.139, 0.147],
  [0.125, 0.144, 0.154, 0.162],
  [0.14, 0.161, 0.171, 0.181],
  [0.16, 0.183, 0.194, 0.204],
  [0.18, 0.204, 0.216, 0.228],
  [0.2, 0.226, 0.239, 0.252],
  [0.224, 0.252, 0.266, 0.279],
  [0.25, 0.28, 0.294, 0.309],
  [0.28, 0.312, 0.327, 0.343],
  [0.315, 0.349, 0.366, 0.382],
  [0.355, 0.391, 0.409, 0.427],
  [0.4, 0.439, 0.458, 0.477],
  [0.45, 0.491, 0.512, 0.532],
  [0.5, 0.544, 0.566, 0.587],
  [0.56, 0.607, 0.63, 0.652],
  [0.63, 0.679, 0.704, 0.728],
  [0.71, 0.762, 0.789, 0.814],
  [0.8, 0.856, 0.883, 0.911],
  [0.9, 0.959, 0.988, 1.017],
  [1.0, 1.062, 1.093, 1.124],
  [1.12, 1.184, 1.216, 1.248],
  [1.25, 1.316, 1.349, 1.382],
  [1.4, 1.468, 1.502, 1.536],
  [1.6, 1.67, 1.705, 1.741],
  [1.8, 1.872, 1.909, 1.946],
  [2.0, 2.074, 2.112, 2.15],
  [2.24, 2.315, 2.353, 2.392],
  [2.5, 2.576, 2.615, 2.653],
  [2.8, 2.878, 2.916, 2.955],
  [3.15, 3.229, 3.268, 3.307],
  [3.55, 3.63, 3.669, 3.709],
  [4.0, 4.081, 4.121, 4.16],
  [4.5, 4.583, 4.623, 4.662],
  [5.0, 5.084, 5.124, 5.164],
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

/**
 * A magnet wire: bare and overall diameter, bare area, resistance per metre at 20 °C
 * (R' = ρ20 / A) and conductor mass per metre (density × A).
 */
export function magnetWire(size: WireSize, conductor: Conductor, grade: InsulationGrade): MagnetWire {
  checkWireSize(size);
  if (conductor !== 'copper' && conductor !== 'aluminium') {
    throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  }
  if (grade !== 1 && grade !== 2 && grade !== 3) throw new CoilSpecError('insulationGrade', 'insulation grade must be 1, 2 or 3');
  return makeWire(size, conductor, grade, undefined);
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
  const p = CONDUCTORS[conductor];
  return {
    size,
    conductor,
    grade,
    bareDiameter,
    overallDiameter,
    area,
    resistancePerMetre20: p.resistivity20 / area,
    massPerMetre: p.density * area,
  };
}
