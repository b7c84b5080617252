/**
 * Spoolwright coil engine: pure functions, SI units, no I/O.
 * Given a coil requirement it computes what the shop will build and what it will do.
 */
export const ENGINE_VERSION = '1.0.0';

export { magnetWire, awgBareDiameter, awgOverallDiameter, metricOverallDiameter, standardSizes, AWG_GAUGES, METRIC_DIAMETERS } from './wire';
export { designCoil, sweepWireSizes, solveCoil } from './design';
export { correctResistance, temperatureRiseByResistance } from './thermal';
export { fieldAlongAxis, pullAgainstGap, warmUpCurve } from './pictures';
export type { AxisGeometry, PullCurve } from './pictures';
export { solenoidAxialField, solenoidCentreField, wheelerInductance, circuitReluctance } from './magnetics';
export { CORE_MATERIALS, coreMaterial } from './materials';
export type { CoreMaterial } from './materials';
export { CoilSpecError } from './errors';
export { validateSpec, validateTarget, AMBIENT_MIN, AMBIENT_MAX } from './validate';
export {
  MU0,
  CONDUCTORS,
  THERMAL_CLASSES,
  DEFAULT_HEAT_TRANSFER_COEFFICIENT,
  DEFAULT_HOT_SPOT_ALLOWANCE,
  DEFAULT_RANDOM_FILL_FACTOR,
  CURRENT_DENSITY_LIMIT,
  MAX_FILL_FACTOR,
  RUNAWAY_LIMIT,
  FERROMAGNETIC_SUSCEPTIBILITY_RULE,
  PARAMAGNETIC_SUSCEPTIBILITY_RULE,
  PULL_CAUTION,
} from './constants';
export type {
  Assumption,
  Bobbin,
  BuildSheet,
  CoilSpec,
  CoilTarget,
  CoilWarning,
  Conductor,
  Drive,
  InsulationClass,
  InsulationGrade,
  MagneticCircuit,
  MagnetWire,
  SolveResult,
  WarningCode,
  WindingPattern,
  WireSize,
} from './types';
