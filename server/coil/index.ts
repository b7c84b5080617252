/**
 * Spoolwright coil engine: pure functions, SI units, no I/O.
 * Given a coil requirement it computes what the shop will build and what it will do.
 */
export const ENGINE_VERSION = '2.0.0';

export {
  magnetWire,
  awgBareDiameter,
  awgBareLimits,
  awgFormulaDiameter,
  awgOverallDiameter,
  metricOverallDiameter,
  metricDiameterTolerance,
  insulatedMassPerMetre,
  standardSizes,
  AWG_GAUGES,
  METRIC_DIAMETERS,
} from './wire';
export { designCoil, sweepWireSizes, solveCoil } from './design';
export {
  correctResistance,
  temperatureRiseByResistance,
  steadyWindingTemperature,
  heatingLaw,
  heatingTime,
  riseAfter,
  periodicPeakRise,
} from './thermal';
export type { Heating, SteadyState } from './thermal';
export { fieldAlongAxis, pullAgainstGap, warmUpCurve, bhCurvePoints } from './pictures';
export type { AxisGeometry, PullCurve } from './pictures';
export {
  solenoidAxialField,
  solenoidCentreField,
  wheelerInductance,
  circuitReluctance,
  solveCircuit,
  curveFieldStrength,
  circuitInductance,
} from './magnetics';
export type { CircuitSolution } from './magnetics';
export { CORE_MATERIALS, coreMaterial } from './materials';
export type { CoreMaterial } from './materials';
export { CoilSpecError } from './errors';
export { validateSpec, validateTarget, AMBIENT_MIN, AMBIENT_MAX, BH_POINTS_MAX, CYCLE_TIME_MAX, CLAMP_VOLTAGE_MAX, SUPPLY_HIGH_MAX, SUPPLY_LOW_MIN } from './validate';
export {
  MU0,
  CONDUCTORS,
  THERMAL_CLASSES,
  DEFAULT_HEAT_TRANSFER_COEFFICIENT,
  DEFAULT_RANDOM_PACKING,
  DEFAULT_SUPPLY_TOLERANCE,
  HEXAGONAL_PACKING,
  HOT_SPOT_ALLOWANCES,
  HOT_SPOT_SOURCE,
  SUPPLY_TOLERANCE_SOURCE,
  ENAMEL_DENSITY,
  DIODE_FORWARD_DROP,
  BUILD_SPREAD,
  IMPLANT_FIELD_LIMIT,
  hotSpotAllowance,
  temperatureCoefficient,
  resistanceMethodConstant,
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
  CautionCode,
  CoilCaution,
  Corner,
  DutyResult,
  IronOperatingPoint,
  ResistanceBand,
  Suppression,
  SuppressionKind,
  SwitchOffResult,
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
