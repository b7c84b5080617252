/**
 * Types of the coil engine. Every quantity is SI: metres, square metres, kilograms,
 * amperes, volts, ohms, watts, tesla, newtons, henries, seconds; temperatures in °C and
 * temperature differences in kelvin.
 *
 * These shapes mirror the zod schema in src/contracts/coil.ts (the engine may not import
 * from outside server/coil, so the shapes are written twice; tests/coil/contract.test.ts
 * checks that the two stay assignable to each other and that they accept and refuse the
 * same specs).
 */

export type Conductor = 'copper' | 'aluminium';
export type InsulationGrade = 1 | 2 | 3;
export type WindingPattern = 'layer' | 'orthocyclic' | 'random';
export type InsulationClass = 105 | 120 | 130 | 155 | 180 | 200 | 220;

/** A wire size: an AWG gauge number, or a metric nominal bare diameter in metres. */
export type WireSize = { standard: 'AWG'; gauge: number } | { standard: 'metric'; diameter: number };

export type Drive = { kind: 'voltage'; volts: number } | { kind: 'current'; amps: number };

/** An iron magnetic circuit around the coil: a core with `gapCount` equal air gaps. */
export interface MagneticCircuit {
  /** μr = 1 + χ of the iron (the linear model; not used for the flux when `bhCurve` is given). */
  relativePermeability: number;
  /**
   * Flux density at which the iron saturates, T: the cap of the linear model, or, with a
   * `bhCurve`, the knee of the curve past which the engine warns.
   */
  saturationFluxDensity: number;
  /**
   * The iron's DC magnetization curve: points [H (A/m), B (T)], both rising strictly. When given,
   * N·I = H(B)·ironPathLength + gapCount·airGap·B/μ0 is solved on it (straight lines between the
   * points, from the origin to the first; beyond the last, B rises as μ0·H).
   */
  bhCurve?: [number, number][];
  /** Mean length of the flux path in iron, m. */
  ironPathLength: number;
  /** Length of each air gap, m. */
  airGap: number;
  /** Number of air gaps the flux crosses in series (a plunger: 1; a U-magnet with armature: 2). */
  gapCount: number;
  /** Cross-section of the flux path (iron and gap face), m². */
  area: number;
}

export interface Bobbin {
  /** Diameter the winding starts on, m. */
  innerDiameter: number;
  /** Largest diameter the winding may build up to, m. */
  outerDiameter: number;
  /** Traverse length between the flanges, m. */
  length: number;
}

/** How the coil's current is caught at switch-off. */
export type SuppressionKind = 'none' | 'diode' | 'diode-zener' | 'tvs';

export interface Suppression {
  kind: SuppressionKind;
  /**
   * The clamp, V: the Zener voltage (diode-zener, the diode's drop is added), the TVS clamping
   * voltage (tvs), or the diode's forward drop (diode; default 0.7 V). Not given with 'none'.
   */
  clampVoltage?: number;
}

export interface CoilSpec {
  conductor: Conductor;
  wire: WireSize;
  insulationGrade: InsulationGrade;
  /** Overall (insulated) diameter from the spool's data sheet, m; overrides the table. */
  overallDiameter?: number;
  bobbin: Bobbin;
  pattern: WindingPattern;
  /**
   * Random winding only: turns per overall-diameter² of window (turns = packing × window area /
   * d_overall²), at most hexagonal close packing 2/√3. Default 0.9.
   */
  packingFactor?: number;
  /**
   * Random winding only, kept for sheets drafted before packingFactor: the bare-copper fill the
   * engineer asked for. Read as packing = fill × d_overall² / bare area, never above close packing.
   */
  fillFactor?: number;
  /** A fixed number of turns instead of filling the window. */
  turns?: number;
  /** Length of both leads together, m (default 0). */
  leadLength?: number;
  drive: Drive;
  /** Fraction of time energised, 0 < d ≤ 1. */
  dutyCycle: number;
  /** Ambient temperature, °C (the rated point). */
  ambient: number;
  /** Highest ambient the coil must work in, °C (default `ambient`); the corners are taken there. */
  ambientMax?: number;
  /** Operating band of the supply as fractions of the rated drive (default 0.85 / 1.10). */
  supplyTolerance?: { low: number; high: number };
  /** Period of the on/off cycle, s (intermittent duty); without it duty is taken as average power. */
  cycleTime?: number;
  /** Switch-off suppression across the coil (default: a plain diode, assumed and said so). */
  suppression?: Suppression;
  insulationClass: InsulationClass;
  /** Combined convection and radiation coefficient from the winding surface, W/(m²·K). */
  heatTransferCoefficient?: number;
  /** Hot-spot allowance added to the mean winding temperature, K (default: the class's, see hotSpotAllowance). */
  hotSpotAllowance?: number;
  magneticCircuit?: MagneticCircuit;
}

/** What solveCoil must reach at the low operating corner (low supply, winding hot at the highest ambient); at least one field. */
export interface CoilTarget {
  ampereTurns?: number;
  pullForce?: number;
  gapFluxDensity?: number;
}

/** A magnet wire of one size, conductor and insulation grade. */
export interface MagnetWire {
  size: WireSize;
  conductor: Conductor;
  grade: InsulationGrade;
  /** Nominal bare conductor diameter, m. */
  bareDiameter: number;
  /** Overall diameter over the insulation, m (table maximum, or the spool's value). */
  overallDiameter: number;
  /** Bare conductor cross-section, m². */
  area: number;
  /** DC resistance per metre at 20 °C, Ω/m. */
  resistancePerMetre20: number;
  /** The wire standard's limits on resistance per metre, as fractions below and above nominal. */
  resistanceTolerance: { minus: number; plus: number; source: string };
  /** Bare metal mass per metre, kg/m. */
  conductorMassPerMetre: number;
  /** Insulated wire mass per metre (conductor plus enamel), kg/m: what a spool's net mass counts. */
  massPerMetre: number;
}

export type WarningCode =
  | 'does-not-fit'
  | 'over-temperature'
  | 'thermal-runaway'
  | 'saturation'
  | 'current-density'
  | 'no-suppression';

export interface CoilWarning {
  code: WarningCode;
  message: string;
}

/** Where someone can get hurt: said beside the numbers it concerns. */
export type CautionCode = 'switch-off' | 'stored-charge' | 'hot-surface' | 'strong-field' | 'pinch' | 'lifting';

export interface CoilCaution {
  code: CautionCode;
  message: string;
}

/** One operating corner of the coil. */
export interface Corner {
  /** The drive at this corner: volts for a voltage drive, amperes for a current drive. */
  supply: number;
  /** Ambient, °C. */
  ambient: number;
  /** Mean winding temperature, °C (steady, duty-averaged power). */
  windingTemperature: number;
  /** Resistance at that temperature, Ω. */
  resistance: number;
  current: number;
  /** Dissipated power while energised, W. */
  power: number;
  ampereTurns: number;
  gapFluxDensity?: number;
  pullForce?: number;
  /** No steady temperature below the runaway limit at this corner. */
  runaway: boolean;
}

/** Intermittent duty at the high corner (supply × high, ambientMax), with the resistance feedback. */
export interface DutyResult {
  supply: number;
  ambient: number;
  /** 'continuous' (duty 1), 'average' (no cycle time: duty-averaged power), 'periodic' (on/off cycle integrated). */
  basis: 'continuous' | 'average' | 'periodic';
  cycleTime: number | null;
  onTime: number | null;
  /** Highest mean winding temperature of the repeating cycle, °C. */
  peakTemperature: number;
  /** The class limit less the hot-spot allowance, °C. */
  limitTemperature: number;
  /** Longest time energised from ambient before the winding reaches limitTemperature, s; null when it never does. */
  maxOnTimeFromCold: number | null;
}

/** What happens when the current is switched off. */
export interface SwitchOffResult {
  kind: SuppressionKind;
  /** True when the spec named no suppression and a plain diode was assumed. */
  assumed: boolean;
  /** Current broken: supply × high with the winding at ambient (the largest), A. */
  current: number;
  /** ½ L I², J. */
  storedEnergy: number;
  /** The voltage the clamp holds across the coil, V; null without suppression. */
  clampVoltage: number | null;
  /** Across the switch: supply + clamp, V; null without suppression (limited only by arcing or breakdown). */
  peakVoltage: number | null;
  /** L/R with the winding at ambient, s. */
  timeConstant: number;
  /** Time for the current to fall to 10 % of its value, s: τ ln((I₀ + V_c/R)/(0.1 I₀ + V_c/R)); null without suppression. */
  decayTime: number | null;
}

/** The iron's state at the nominal hot point. */
export interface IronOperatingPoint {
  model: 'curve' | 'linear';
  /** H in the iron, A/m. */
  fieldStrength: number;
  /** B in the iron and gap, T. */
  fluxDensity: number;
  /** Past the knee (curve) or at the cap (linear). */
  saturated: boolean;
}

/** The acceptance band of R20 a line gets when the customer states no tolerance. */
export interface ResistanceBand {
  min: number;
  max: number;
  /** The wire's resistance tolerance and the pattern's build spread, in words with sources. */
  basis: string;
  wireMinus: number;
  wirePlus: number;
  build: number;
}

/** A constant or rule the engine used, with where it comes from, for the build sheet. */
export interface Assumption {
  name: string;
  value: number | string;
  unit: string;
  source: string;
}

export interface BuildSheet {
  wire: MagnetWire;
  turns: number;
  turnsPerLayer: number;
  layers: number;
  /** Diameter the winding starts on (the bobbin's inner diameter), m. */
  innerDiameter: number;
  /** Outer diameter as built, m. */
  outerDiameter: number;
  /** Axial length the winding occupies, m: the traverse, or turns × d_overall for less than one layer. */
  windingLength: number;
  meanTurnLength: number;
  wireLength: number;
  /** Insulated wire mass (conductor and enamel), kg: what stock is reserved by. */
  wireMass: number;
  /** Bare metal mass, kg. */
  conductorMass: number;
  /** Bare conductor area of all turns over the winding window (every pattern). */
  fillFactor: number;
  /** Turns × d_overall² over the window area (every pattern; random winding is built to it). */
  packingFactor: number;
  resistance20: number;
  resistanceHot: number;
  ambient: number;
  windingTemperature: number;
  temperatureRise: number;
  surfaceArea: number;
  voltage: number;
  currentCold: number;
  currentHot: number;
  powerCold: number;
  powerHot: number;
  ampereTurnsCold: number;
  ampereTurnsHot: number;
  /** Current over bare area at the hot point, A/m². */
  currentDensity: number;
  /** Air-core field at the centre of the winding, T. */
  centreField: number;
  gapFluxDensity?: number;
  pullForce?: number;
  inductance: number;
  /** Electrical time constant L/R_hot, s. */
  timeConstant: number;
  /** Thermal time constant m·c/(h·A), s. */
  thermalTimeConstant: number;
  /** Thermal capacity m·c of the conductor, J/K. */
  thermalCapacity: number;
  /** Heat-transfer conductance h·A from the winding surface, W/K. */
  conductance: number;
  driveKind: 'voltage' | 'current';
  dutyCycle: number;
  thermalRunaway: boolean;
  /** Hot-spot allowance used, K. */
  hotSpotAllowance: number;
  /** Low (pull-in worst case), nominal (the figures above) and high (heating worst case). */
  corners: { low: Corner; nominal: Corner; high: Corner };
  duty: DutyResult;
  switchOff: SwitchOffResult;
  resistanceBand: ResistanceBand;
  ironOperatingPoint?: IronOperatingPoint;
  warnings: CoilWarning[];
  cautions: CoilCaution[];
  assumptions: readonly Assumption[];
}

export interface SolveResult {
  best: BuildSheet | null;
  candidates: BuildSheet[];
  rejected: { wire: MagnetWire; reasons: string[] }[];
}
