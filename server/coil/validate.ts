/**
 * Validation of a CoilSpec and a solve target. It states the same rules as the zod schema in
 * src/contracts/coil.ts (the server validates requests with that schema; the engine checks
 * again because other callers may reach it directly). tests/coil/contract.test.ts checks
 * that both accept and refuse the same specs and name the same field.
 */
import { HEXAGONAL_PACKING, MAX_FILL_FACTOR, THERMAL_CLASSES } from './constants';
import { CoilSpecError } from './errors';
import { bareDiameterOf, checkWireSize } from './wire';
import type { CoilSpec, CoilTarget } from './types';

/** Lowest and highest ambient temperature accepted, °C. */
export const AMBIENT_MIN = -100;
export const AMBIENT_MAX = 250;
/** Supply band limits: low in (0, 1], high in [1, 2]. */
export const SUPPLY_LOW_MIN = 0.5;
export const SUPPLY_HIGH_MAX = 2;
/** Longest duty cycle period accepted, s (a day). */
export const CYCLE_TIME_MAX = 86400;
/** Highest suppression clamp voltage accepted, V. */
export const CLAMP_VOLTAGE_MAX = 10000;

function isNum(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

function positive(value: unknown, field: string, what: string): void {
  if (!isNum(value) || value <= 0) throw new CoilSpecError(field, `${what} must be a positive number`);
}

function nonNegative(value: unknown, field: string, what: string): void {
  if (!isNum(value) || value < 0) throw new CoilSpecError(field, `${what} must be zero or a positive number`);
}

/** Throws CoilSpecError naming the first bad field of the spec. */
export function validateSpec(spec: CoilSpec): void {
  if (spec === null || typeof spec !== 'object') throw new CoilSpecError('spec', 'a coil spec is required');
  if (spec.conductor !== 'copper' && spec.conductor !== 'aluminium') {
    throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  }
  checkWireSize(spec.wire, 'wire');
  if (spec.insulationGrade !== 1 && spec.insulationGrade !== 2 && spec.insulationGrade !== 3) {
    throw new CoilSpecError('insulationGrade', 'insulation grade must be 1, 2 or 3');
  }
  if (spec.overallDiameter !== undefined) {
    positive(spec.overallDiameter, 'overallDiameter', 'overall diameter');
    const bare = bareDiameterOf(spec.wire);
    if (spec.overallDiameter <= bare) {
      throw new CoilSpecError('overallDiameter', 'overall diameter must be larger than the bare diameter');
    }
  }
  const b = spec.bobbin;
  if (b === null || typeof b !== 'object') throw new CoilSpecError('bobbin', 'bobbin is required');
  nonNegative(b.innerDiameter, 'bobbin.innerDiameter', 'inner diameter');
  positive(b.outerDiameter, 'bobbin.outerDiameter', 'outer diameter');
  positive(b.length, 'bobbin.length', 'traverse length');
  if (b.innerDiameter >= b.outerDiameter) {
    throw new CoilSpecError('bobbin.innerDiameter', 'inner diameter must be smaller than the outer diameter');
  }
  if (spec.pattern !== 'layer' && spec.pattern !== 'orthocyclic' && spec.pattern !== 'random') {
    throw new CoilSpecError('pattern', "pattern must be 'layer', 'orthocyclic' or 'random'");
  }
  if (spec.fillFactor !== undefined) {
    if (!isNum(spec.fillFactor) || spec.fillFactor <= 0 || spec.fillFactor > MAX_FILL_FACTOR) {
      throw new CoilSpecError('fillFactor', `fill factor must be above 0 and at most ${MAX_FILL_FACTOR.toFixed(4)} (close packing)`);
    }
    if (spec.pattern !== 'random') throw new CoilSpecError('fillFactor', 'a fill factor applies to random winding only');
  }
  if (spec.packingFactor !== undefined) {
    if (!isNum(spec.packingFactor) || spec.packingFactor <= 0 || spec.packingFactor > HEXAGONAL_PACKING + 1e-12) {
      throw new CoilSpecError('packingFactor', `packing must be above 0 and at most ${HEXAGONAL_PACKING.toFixed(4)} turns per d² (close packing)`);
    }
    if (spec.pattern !== 'random') throw new CoilSpecError('packingFactor', 'a packing factor applies to random winding only');
  }
  if (spec.turns !== undefined && (!Number.isInteger(spec.turns) || spec.turns < 1)) {
    throw new CoilSpecError('turns', 'turns must be a whole number of at least 1');
  }
  if (spec.leadLength !== undefined) nonNegative(spec.leadLength, 'leadLength', 'lead length');
  const d = spec.drive;
  if (d === null || typeof d !== 'object') throw new CoilSpecError('drive', 'drive is required');
  if (d.kind === 'voltage') positive(d.volts, 'drive.volts', 'drive voltage');
  else if (d.kind === 'current') positive(d.amps, 'drive.amps', 'drive current');
  else throw new CoilSpecError('drive.kind', "drive kind must be 'voltage' or 'current'");
  if (!isNum(spec.dutyCycle) || spec.dutyCycle <= 0 || spec.dutyCycle > 1) {
    throw new CoilSpecError('dutyCycle', 'duty cycle must be above 0 and at most 1');
  }
  if (!isNum(spec.ambient) || spec.ambient < AMBIENT_MIN || spec.ambient > AMBIENT_MAX) {
    throw new CoilSpecError('ambient', `ambient must be between ${AMBIENT_MIN} and ${AMBIENT_MAX} °C`);
  }
  if (spec.ambientMax !== undefined) {
    if (!isNum(spec.ambientMax) || spec.ambientMax > AMBIENT_MAX) {
      throw new CoilSpecError('ambientMax', `highest ambient must be a number up to ${AMBIENT_MAX} °C`);
    }
    if (spec.ambientMax < spec.ambient) throw new CoilSpecError('ambientMax', 'highest ambient must not be below the rated ambient');
  }
  const tol = spec.supplyTolerance;
  if (tol !== undefined) {
    if (tol === null || typeof tol !== 'object') throw new CoilSpecError('supplyTolerance', 'supply band must be { low, high }');
    if (!isNum(tol.low) || tol.low < SUPPLY_LOW_MIN || tol.low > 1) {
      throw new CoilSpecError('supplyTolerance.low', `low end of the supply must be between ${SUPPLY_LOW_MIN} and 1 of the rated value`);
    }
    if (!isNum(tol.high) || tol.high < 1 || tol.high > SUPPLY_HIGH_MAX) {
      throw new CoilSpecError('supplyTolerance.high', `high end of the supply must be between 1 and ${SUPPLY_HIGH_MAX} of the rated value`);
    }
  }
  if (spec.cycleTime !== undefined) {
    if (!isNum(spec.cycleTime) || spec.cycleTime <= 0 || spec.cycleTime > CYCLE_TIME_MAX) {
      throw new CoilSpecError('cycleTime', `cycle time must be above 0 and at most ${CYCLE_TIME_MAX} s`);
    }
  }
  const sup = spec.suppression;
  if (sup !== undefined) {
    if (sup === null || typeof sup !== 'object') throw new CoilSpecError('suppression', 'suppression must be { kind, clampVoltage? }');
    if (sup.kind !== 'none' && sup.kind !== 'diode' && sup.kind !== 'diode-zener' && sup.kind !== 'tvs') {
      throw new CoilSpecError('suppression.kind', "suppression must be 'none', 'diode', 'diode-zener' or 'tvs'");
    }
    if (sup.clampVoltage !== undefined) {
      if (sup.kind === 'none') throw new CoilSpecError('suppression.clampVoltage', 'no clamp voltage without suppression');
      if (!isNum(sup.clampVoltage) || sup.clampVoltage <= 0 || sup.clampVoltage > CLAMP_VOLTAGE_MAX) {
        throw new CoilSpecError('suppression.clampVoltage', `clamp voltage must be above 0 and at most ${CLAMP_VOLTAGE_MAX} V`);
      }
    } else if (sup.kind === 'diode-zener' || sup.kind === 'tvs') {
      throw new CoilSpecError('suppression.clampVoltage', `a ${sup.kind === 'tvs' ? 'TVS' : 'Zener'} needs its clamp voltage`);
    }
  }
  if (!(THERMAL_CLASSES as readonly number[]).includes(spec.insulationClass)) {
    throw new CoilSpecError('insulationClass', `insulation class must be one of ${THERMAL_CLASSES.join(', ')} (IEC 60085)`);
  }
  if (spec.heatTransferCoefficient !== undefined) {
    positive(spec.heatTransferCoefficient, 'heatTransferCoefficient', 'heat-transfer coefficient');
  }
  if (spec.hotSpotAllowance !== undefined) nonNegative(spec.hotSpotAllowance, 'hotSpotAllowance', 'hot-spot allowance');
  const m = spec.magneticCircuit;
  if (m !== undefined) {
    if (m === null || typeof m !== 'object') throw new CoilSpecError('magneticCircuit', 'magnetic circuit must be an object');
    if (!isNum(m.relativePermeability) || m.relativePermeability < 1) {
      throw new CoilSpecError('magneticCircuit.relativePermeability', 'relative permeability must be at least 1');
    }
    positive(m.saturationFluxDensity, 'magneticCircuit.saturationFluxDensity', 'saturation flux density');
    nonNegative(m.ironPathLength, 'magneticCircuit.ironPathLength', 'iron path length');
    nonNegative(m.airGap, 'magneticCircuit.airGap', 'air gap');
    if (!Number.isInteger(m.gapCount) || m.gapCount < 0) {
      throw new CoilSpecError('magneticCircuit.gapCount', 'gap count must be a whole number, zero or more');
    }
    positive(m.area, 'magneticCircuit.area', 'flux path area');
    if (m.ironPathLength === 0 && (m.airGap === 0 || m.gapCount === 0)) {
      throw new CoilSpecError('magneticCircuit.ironPathLength', 'the flux path needs an iron length or an air gap');
    }
    if (m.bhCurve !== undefined) checkCurve(m.bhCurve);
  }
}

/** Throws CoilSpecError naming the first bad field of a solve target. */
export function validateTarget(target: CoilTarget, spec: CoilSpec): void {
  if (target === null || typeof target !== 'object') throw new CoilSpecError('target', 'a target is required');
  const { ampereTurns, pullForce, gapFluxDensity } = target;
  if (ampereTurns === undefined && pullForce === undefined && gapFluxDensity === undefined) {
    throw new CoilSpecError('target', 'name at least one of ampereTurns, pullForce, gapFluxDensity');
  }
  if (ampereTurns !== undefined) positive(ampereTurns, 'target.ampereTurns', 'target ampere-turns');
  if (pullForce !== undefined) {
    positive(pullForce, 'target.pullForce', 'target pull');
    if (!spec.magneticCircuit) throw new CoilSpecError('target.pullForce', 'a pull target needs a magnetic circuit in the spec');
  }
  if (gapFluxDensity !== undefined) {
    positive(gapFluxDensity, 'target.gapFluxDensity', 'target gap flux density');
    if (!spec.magneticCircuit) {
      throw new CoilSpecError('target.gapFluxDensity', 'a gap flux density target needs a magnetic circuit in the spec');
    }
  }
}

/** Largest number of points a B–H curve may have. */
export const BH_POINTS_MAX = 64;

/** A B–H curve: 2–64 points [H ≥ 0 A/m, B ≥ 0 T], both rising strictly. */
function checkCurve(curve: unknown): void {
  const field = 'magneticCircuit.bhCurve';
  if (!Array.isArray(curve) || curve.length < 2 || curve.length > BH_POINTS_MAX) {
    throw new CoilSpecError(field, `a B–H curve needs 2 to ${BH_POINTS_MAX} points [H, B]`);
  }
  let prevH = -1;
  let prevB = -1;
  for (let i = 0; i < curve.length; i++) {
    const pt = curve[i] as unknown;
    if (!Array.isArray(pt) || pt.length !== 2 || !isNum(pt[0]) || !isNum(pt[1]) || pt[0] < 0 || pt[1] < 0) {
      throw new CoilSpecError(`${field}.${i}`, 'each point is [H in A/m, B in T], both zero or positive');
    }
    if (pt[0] <= prevH || pt[1] <= prevB) throw new CoilSpecError(`${field}.${i}`, 'H and B must both rise from point to point');
    prevH = pt[0];
    prevB = pt[1];
  }
}
