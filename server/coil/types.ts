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
  /** μr = 1 + χ of the iron. */
  relativePermeability: number;
  /** Flux density at which the iron saturates, T. */
  saturationFluxDensity: number;
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

export interface CoilSpec {
  conductor: Conductor;
  wire: WireSize;
  insulationGrade: InsulationGrade;
  /** Overall (insulated) diameter from the spool's data sheet, m; overrides the table. */
  overallDiameter?: number;
  bobbin: Bobbin;
  pattern: WindingPattern;
  /** Bare copper area over window area; random winding only. */
  fillFactor?: number;
  /** A fixed number of turns instead of filling the window. */
  turns?: number;
  /** Length of both leads together, m (default 0). */
  leadLength?: number;
  drive: Drive;
  /** Fraction of time energised, 0 < d ≤ 1. */
  dutyCycle: number;
  /** Ambient temperature, °C. */
  ambient: number;
  insulationClass: InsulationClass;
  /** Combined convection and radiation coefficient from the winding surface, W/(m²·K). */
  heatTransferCoefficient?: number;
  /** Hot-spot allowance added to the mean winding temperature, K. */
  hotSpotAllowance?: number;
  magneticCircuit?: MagneticCircuit;
}

/** What solveCoil must reach at the hot operating point; at least one field. */
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
  /** Conductor mass per metre (insulation not counted), kg/m. */
  massPerMetre: number;
}

export type WarningCode =
  | 'does-not-fit'
  | 'over-temperature'
  | 'thermal-runaway'
  | 'saturation'
  | 'current-density';

export interface CoilWarning {
  code: WarningCode;
  message: string;
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
  /** Axial length of the winding (the bobbin traverse), m. */
  windingLength: number;
  meanTurnLength: number;
  wireLength: number;
  wireMass: number;
  /** Bare conductor area of all turns over the winding window. */
  fillFactor: number;
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
  thermalRunaway: boolean;
  warnings: CoilWarning[];
  assumptions: readonly Assumption[];
}

export interface SolveResult {
  best: BuildSheet | null;
  candidates: BuildSheet[];
  rejected: { wire: MagnetWire; reasons: string[] }[];
}
