/**
 * Physical constants, conductor properties and shop defaults used by the engine, each with
 * its source. Values recalled rather than looked up are marked "from memory"; shop rules of
 * thumb are marked "common practice, no published source".
 */
import type { Assumption, Conductor } from './types';

/** Vacuum magnetic permeability μ0, N/A² (CODATA 2018 recommended value). */
export const MU0 = 1.25663706212e-6;

/** Properties of a conductor material at 20 °C. */
export interface ConductorProperties {
  /** Resistivity at 20 °C, Ω·m. */
  resistivity20: number;
  /** Temperature coefficient of resistance at 20 °C, 1/K. */
  alpha20: number;
  /** Density, kg/m³. */
  density: number;
  /** Specific heat capacity, J/(kg·K). */
  specificHeat: number;
  /** Inferred zero-resistance temperature for the resistance method, °C (k in IEC 60034-1). */
  resistanceMethodK: number;
  sources: {
    resistivity20: string;
    alpha20: string;
    density: string;
    specificHeat: string;
    resistanceMethodK: string;
  };
}

/** Annealed copper resistivity 1/58 Ω·mm²/m = 1/58 × 10⁻⁶ Ω·m (IEC 60028). */
const COPPER_RESISTIVITY = 1e-6 / 58;

export const CONDUCTORS: Readonly<Record<Conductor, ConductorProperties>> = Object.freeze({
  copper: {
    resistivity20: COPPER_RESISTIVITY,
    alpha20: 0.00393,
    density: 8890,
    specificHeat: 385,
    resistanceMethodK: 234.5,
    sources: {
      resistivity20: 'IEC 60028 annealed copper standard: 1/58 Ω·mm²/m at 20 °C',
      alpha20: 'IEC 60028: 0.00393 /K at 20 °C',
      density: 'IEC 60028: 8.89 g/cm³',
      specificHeat: 'handbook value for copper near room temperature, 385 J/(kg·K) (from memory)',
      resistanceMethodK: 'IEC 60034-1 / IEEE Std 118 resistance method: 234.5 for copper',
    },
  },
  aluminium: {
    // 61 % IACS: the resistivity of annealed copper divided by 0.61.
    resistivity20: COPPER_RESISTIVITY / 0.61,
    alpha20: 0.00403,
    density: 2700,
    specificHeat: 897,
    resistanceMethodK: 225,
    sources: {
      resistivity20: 'aluminium for electrical purposes at 61 % IACS (conductivity relative to IEC 60028 copper)',
      alpha20: '0.00403 /K at 20 °C for 61 % IACS aluminium (from memory)',
      density: '2.70 g/cm³ (from memory)',
      specificHeat: 'handbook value for aluminium near room temperature, 897 J/(kg·K) (from memory)',
      resistanceMethodK: 'IEC 60034-1 resistance method: 225 for aluminium',
    },
  },
});

/** IEC 60085 thermal classes, °C. */
export const THERMAL_CLASSES = [105, 120, 130, 155, 180, 200, 220] as const;

/**
 * Default combined convection + radiation heat-transfer coefficient from a coil surface in
 * still air, W/(m²·K): roughly 5 of natural convection plus 5 of radiation at modest rises
 * (common practice, no published source). The shop overrides it with
 * spec.heatTransferCoefficient.
 */
export const DEFAULT_HEAT_TRANSFER_COEFFICIENT = 10;

/**
 * Default hot-spot allowance, K: the difference between the hottest point and the mean
 * winding temperature measured by resistance. IEC 60034-1 sets its resistance-method limits
 * about 10 K below the thermal class for class 130 (B) (from memory); we use 10 K as a
 * default (common practice, no published source).
 */
export const DEFAULT_HOT_SPOT_ALLOWANCE = 10;

/**
 * Continuous-duty current-density limit, A/m² (4 A/mm²), for a coil cooled by still air.
 * Scaled for intermittent duty d by 1/√d, since heating follows the RMS current
 * (common practice, no published source).
 */
export const CURRENT_DENSITY_LIMIT = 4e6;

/** Default bare-copper fill factor of a random winding (common practice, no published source). */
export const DEFAULT_RANDOM_FILL_FACTOR = 0.5;

/** Largest bare fill of round wires: hexagonal close packing, π/(2√3). */
export const MAX_FILL_FACTOR = Math.PI / (2 * Math.sqrt(3));

/** Above this winding temperature (°C) the engine reports thermal runaway: no usable steady state. */
export const RUNAWAY_LIMIT = 1000;

/**
 * Susceptibility of a ferromagnetic core, of the order of 6×10³ (common practice, no
 * published source). A core multiplies the field a coil makes by orders of magnitude.
 */
export const FERROMAGNETIC_SUSCEPTIBILITY_RULE = 6e3;

/** Susceptibility of a strongly paramagnetic material, of the order of 10⁻³ (common practice, no published source). */
export const PARAMAGNETIC_SUSCEPTIBILITY_RULE = 1e-3;

/** Caution attached to every computed pull. */
export const PULL_CAUTION =
  'A computed pull is not a lifting or holding rating. Never rate a lifting or holding magnet ' +
  'from this figure: follow the applicable lifting-device standard and test the unit with a safety factor.';

const conductorAssumptionCache = new Map<Conductor, readonly Assumption[]>();

/** The conductor and physical constants used, with sources (shared, frozen). */
export function conductorAssumptions(conductor: Conductor): readonly Assumption[] {
  const cached = conductorAssumptionCache.get(conductor);
  if (cached) return cached;
  const p = CONDUCTORS[conductor];
  const list: Assumption[] = [
    { name: `${conductor} resistivity at 20 °C`, value: p.resistivity20, unit: 'Ω·m', source: p.sources.resistivity20 },
    { name: `${conductor} temperature coefficient at 20 °C`, value: p.alpha20, unit: '1/K', source: p.sources.alpha20 },
    { name: `${conductor} density`, value: p.density, unit: 'kg/m³', source: p.sources.density },
    { name: `${conductor} specific heat`, value: p.specificHeat, unit: 'J/(kg·K)', source: p.sources.specificHeat },
    { name: 'magnetic constant μ0', value: MU0, unit: 'N/A²', source: 'CODATA 2018' },
    { name: 'AWG bare diameter', value: 'd = 0.127 mm × 92^((36 − n)/39)', unit: 'm', source: 'ASTM B258' },
    {
      name: 'overall diameter',
      value: 'maximum overall diameter of the grade',
      unit: 'm',
      source: 'NEMA MW 1000 / IEC 60317-0-1 tables (partly from memory, see server/coil/wire.ts)',
    },
    {
      name: 'current-density limit (continuous duty)',
      value: CURRENT_DENSITY_LIMIT,
      unit: 'A/m²',
      source: 'common practice, no published source; scaled by 1/√duty',
    },
    {
      name: 'air-core inductance',
      value: "Wheeler's multilayer formula L = 0.8 a²N²/(6a + 9b + 10c) µH, lengths in inches",
      unit: 'H',
      source: 'H. A. Wheeler, Proc. IRE 16 (1928)',
    },
    {
      name: 'centre field',
      value: 'thick solenoid of uniform current density, integrated from the on-axis loop field',
      unit: 'T',
      source: 'Biot–Savart law; see D. B. Montgomery, Solenoid Magnet Design (1969)',
    },
    {
      name: 'temperature rise',
      value: 'ΔT = P × duty / (h × A), A = outer cylinder + both end faces',
      unit: 'K',
      source: "Newton's law of cooling with a combined coefficient",
    },
  ];
  const frozen = Object.freeze(list.map((a) => Object.freeze(a)));
  conductorAssumptionCache.set(conductor, frozen);
  return frozen;
}
