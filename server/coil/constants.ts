/**
 * Physical constants, conductor properties and shop defaults used by the engine, each with
 * its source. Values recalled rather than looked up are marked "from memory"; shop rules of
 * thumb are marked "common practice, no published source".
 */
import type { Assumption, Conductor, InsulationClass, WindingPattern } from './types';

/** Vacuum magnetic permeability μ0, N/A² (CODATA 2018 recommended value). */
export const MU0 = 1.25663706212e-6;

/** Properties of a conductor material at 20 °C. */
export interface ConductorProperties {
  /** Resistivity at 20 °C, Ω·m. */
  resistivity20: number;
  /**
   * Temperature coefficient of resistance at 20 °C, 1/K: R(T) = R20 (1 + α20 (T − 20)). The one
   * resistance–temperature model of the conductor; the design and the bench both use it.
   */
  alpha20: number;
  /** Density, kg/m³. */
  density: number;
  /** Specific heat capacity, J/(kg·K). */
  specificHeat: number;
  /**
   * Inferred zero-resistance temperature of the resistance method, derived from α20:
   * k = 1/α20 − 20, so that R2/R1 = (k + θ2)/(k + θ1) is the same straight line as α20.
   */
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

/**
 * Copper: α20 = 1/254.5 /K. IEEE Std 118 gives the resistance-method constant 234.5 for copper;
 * IEC 60028 states α20 = 0.00393 /K, which is 1/254.5 = 0.0039293 rounded to three figures, so
 * the two are one line. IEC 60034-1 rounds further to 235 (0.2 % of a rise).
 */
const COPPER_ALPHA = 1 / 254.5;

/**
 * Aluminium: α20 = 0.00403 /K for 61 % IACS aluminium (IEC 60121 annealed aluminium and IEC 60889,
 * from memory) — the same 61 % IACS conductivity the engine's resistivity uses. It gives
 * k = 1/0.00403 − 20 = 228.1. IEC 60034-1's 225 for aluminium corresponds to α20 = 1/245 =
 * 0.00408, a conductor of about 62 % IACS (α·ρ is nearly constant, Matthiessen's rule); it is a
 * rounded default that IEC 60034-1 itself sets aside where another value is specified. The
 * conductor's own coefficient wins because the resistance method must follow the conductor
 * actually wound, and because the design's R20 and the bench's correction must use one line.
 */
const ALUMINIUM_ALPHA = 0.00403;

export const CONDUCTORS: Readonly<Record<Conductor, ConductorProperties>> = Object.freeze({
  copper: {
    resistivity20: COPPER_RESISTIVITY,
    alpha20: COPPER_ALPHA,
    density: 8890,
    specificHeat: 385,
    resistanceMethodK: 1 / COPPER_ALPHA - 20,
    sources: {
      resistivity20: 'IEC 60028 annealed copper standard: 1/58 Ω·mm²/m at 20 °C',
      alpha20: 'IEC 60028: 0.00393 /K at 20 °C, carried as 1/254.5 = 0.0039293 /K (the line through −234.5 °C of IEEE Std 118)',
      density: 'IEC 60028: 8.89 g/cm³',
      specificHeat: 'handbook value for copper near room temperature, 385 J/(kg·K) (from memory)',
      resistanceMethodK: 'derived from α20: k = 1/α20 − 20 = 234.5, the copper constant of IEEE Std 118 (IEC 60034-1 rounds it to 235)',
    },
  },
  aluminium: {
    // 61 % IACS: the resistivity of annealed copper divided by 0.61.
    resistivity20: COPPER_RESISTIVITY / 0.61,
    alpha20: ALUMINIUM_ALPHA,
    density: 2700,
    specificHeat: 897,
    resistanceMethodK: 1 / ALUMINIUM_ALPHA - 20,
    sources: {
      resistivity20: 'aluminium for electrical purposes at 61 % IACS (conductivity relative to IEC 60028 copper)',
      alpha20: '0.00403 /K at 20 °C for 61 % IACS aluminium, IEC 60121 / IEC 60889 (from memory)',
      density: '2.70 g/cm³ (from memory)',
      specificHeat: 'handbook value for aluminium near room temperature, 897 J/(kg·K) (from memory)',
      resistanceMethodK:
        'derived from α20: k = 1/0.00403 − 20 = 228.1; IEC 60034-1 uses 225, which fits 62 % IACS aluminium (α20 ≈ 0.00408), not the 61 % IACS conductor the engine models',
    },
  },
});

/** Temperature coefficient of resistance at 20 °C of a conductor, 1/K (the one α model). */
export function temperatureCoefficient(conductor: Conductor): number {
  return CONDUCTORS[conductor].alpha20;
}

/**
 * The resistance method's constant k of a conductor, °C, derived from the same α model:
 * k = 1/α20 − 20 (copper 234.5, aluminium 228.1). R2/R1 = (k + θ2)/(k + θ1).
 */
export function resistanceMethodConstant(conductor: Conductor): number {
  return 1 / CONDUCTORS[conductor].alpha20 - 20;
}

/** IEC 60085 thermal classes, °C. */
export const THERMAL_CLASSES = [105, 120, 130, 155, 180, 200, 220] as const;

/**
 * Hot-spot allowance of each thermal class, K: how far the hottest point of a winding lies above
 * the mean temperature the resistance method measures. IEC 60034-1, Table 7 (indirectly cooled
 * windings, resistance method, 40 °C coolant) limits the rise to 60, 75, 80, 105 and 125 K for
 * classes 105 (A), 120 (E), 130 (B), 155 (F) and 180 (H) (from memory): the mean winding may
 * then reach the class less 5, 5, 10, 10 and 15 K. Classes 200 and 220 are not in that table;
 * they keep the 15 K of class 180 (engine rule, no published source).
 */
export const HOT_SPOT_ALLOWANCES: Readonly<Record<InsulationClass, number>> = Object.freeze({
  105: 5,
  120: 5,
  130: 10,
  155: 10,
  180: 15,
  200: 15,
  220: 15,
});

export const HOT_SPOT_SOURCE =
  'IEC 60034-1 Table 7 resistance-method rise limits at 40 °C (60/75/80/105/125 K for classes 105/120/130/155/180, from memory): class − 40 °C − limit; 200 and 220 keep the 15 K of class 180 (engine rule)';

/** The hot-spot allowance of an IEC 60085 thermal class, K (see HOT_SPOT_ALLOWANCES). */
export function hotSpotAllowance(insulationClass: InsulationClass): number {
  const k = HOT_SPOT_ALLOWANCES[insulationClass];
  if (k === undefined) throw new RangeError(`no hot-spot allowance for class ${insulationClass}`);
  return k;
}

/**
 * Default operating band of the supply, as fractions of the rated value: electromagnets of
 * control circuits must operate between 85 % and 110 % of the rated control supply voltage
 * (IEC 60947-4-1 / IEC 60947-5-1 operating limits, from memory).
 */
export const DEFAULT_SUPPLY_TOLERANCE = Object.freeze({ low: 0.85, high: 1.1 });
export const SUPPLY_TOLERANCE_SOURCE = 'IEC 60947-4-1 / 60947-5-1: operate between 85 % and 110 % of the rated control supply (from memory)';

/**
 * Default combined convection + radiation heat-transfer coefficient from a coil surface in
 * still air, W/(m²·K): roughly 5 of natural convection plus 5 of radiation at modest rises
 * (common practice, no published source). The shop overrides it with
 * spec.heatTransferCoefficient.
 */
export const DEFAULT_HEAT_TRANSFER_COEFFICIENT = 10;

/**
 * Continuous-duty current-density limit, A/m² (4 A/mm²), for a coil cooled by still air.
 * Scaled for intermittent duty d by 1/√d, since heating follows the RMS current
 * (common practice, no published source).
 */
export const CURRENT_DENSITY_LIMIT = 4e6;

/** Turns per overall-diameter² of window of hexagonal close packing: 2/√3 ≈ 1.155. */
export const HEXAGONAL_PACKING = 2 / Math.sqrt(3);

/**
 * Default packing of a random winding: turns = packing × window area / d_overall². 0.9 turns
 * per d² is a mechanical fill of π/4 × 0.9 ≈ 71 % of the window, about 78 % of hexagonal close
 * packing — what random winding on automatic machines usually reaches (common practice, no
 * published source; the ~73 % mechanical fill often quoted for wild winding, from memory).
 */
export const DEFAULT_RANDOM_PACKING = 0.9;

/** Largest bare fill of round wires: hexagonal close packing, π/(2√3). */
export const MAX_FILL_FACTOR = Math.PI / (2 * Math.sqrt(3));

/**
 * Density of the enamel film, kg/m³: 1.4 g/cm³, cured polyesterimide and polyamide-imide
 * magnet-wire enamels (resin makers' data sheets give 1.3–1.45 g/cm³; from memory).
 */
export const ENAMEL_DENSITY = 1400;

/** Forward drop of a silicon rectifier diode across the coil at switch-off, V (common practice, no published source). */
export const DIODE_FORWARD_DROP = 0.7;

/**
 * Spread of a built coil's resistance from its build (mean turn length: tension, bulge, where
 * the layers end), ± fraction, by pattern: layer and orthocyclic ±1 %, random ±3 % (common
 * practice, no published source). Added to the wire's own resistance tolerance for the band.
 */
export const BUILD_SPREAD: Readonly<Record<WindingPattern, number>> = Object.freeze({ layer: 0.01, orthocyclic: 0.01, random: 0.03 });

/** Above this winding temperature (°C) the engine reports thermal runaway: no usable steady state. */
export const RUNAWAY_LIMIT = 1000;

/**
 * Static field above which people with active implants (pacemakers, defibrillators) should keep
 * away: 0.5 mT, the level the ICNIRP 2009 static-field guidelines name for interference with
 * implanted devices and the usual boundary of marked areas (from memory).
 */
export const IMPLANT_FIELD_LIMIT = 0.5e-3;

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
    { name: `${conductor} resistance-method constant k`, value: p.resistanceMethodK, unit: '°C', source: p.sources.resistanceMethodK },
    { name: `${conductor} density`, value: p.density, unit: 'kg/m³', source: p.sources.density },
    { name: `${conductor} specific heat`, value: p.specificHeat, unit: 'J/(kg·K)', source: p.sources.specificHeat },
    { name: 'enamel density', value: ENAMEL_DENSITY, unit: 'kg/m³', source: 'polyesterimide / polyamide-imide films, 1.3–1.45 g/cm³ (from memory)' },
    { name: 'magnetic constant μ0', value: MU0, unit: 'N/A²', source: 'CODATA 2018' },
    {
      name: 'AWG bare diameter',
      value: 'nominal diameters as tabulated (rounded to 0.1 mil), d = 0.127 mm × 92^((36 − n)/39) before rounding',
      unit: 'm',
      source: 'ASTM B258',
    },
    {
      name: 'overall diameter',
      value: 'maximum overall diameter of the grade',
      unit: 'm',
      source: 'NEMA MW 1000 / IEC 60317-0-1 tables (partly from memory, see server/coil/wire.ts)',
    },
    {
      name: 'wire mass',
      value: 'conductor (density × bare area) plus enamel (enamel density × the annulus up to the overall diameter) per metre',
      unit: 'kg/m',
      source: 'geometry; the enamel counted up to the maximum overall diameter errs on the heavy side for stock',
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
      value: 'C dθ/dt = P(θ) − h A θ, P(θ) with the hot resistance; steady ΔT = P × duty / (h × A), A = outer cylinder + both end faces',
      unit: 'K',
      source: "Newton's law of cooling with a combined coefficient; one thermal capacity (the conductor)",
    },
  ];
  const frozen = Object.freeze(list.map((a) => Object.freeze(a)));
  conductorAssumptionCache.set(conductor, frozen);
  return frozen;
}
