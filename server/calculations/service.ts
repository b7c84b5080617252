import type { CoilSolveRequest, CoilSpec } from '../../src/contracts/coil';
import type { CoilProfileResponse, CoilReferenceResponse } from '../../src/contracts/coil';
import {
  CONDUCTORS,
  CORE_MATERIALS,
  ENGINE_VERSION,
  MU0,
  CoilSpecError,
  DEFAULT_SUPPLY_TOLERANCE,
  HOT_SPOT_ALLOWANCES,
  HOT_SPOT_SOURCE,
  SUPPLY_TOLERANCE_SOURCE,
  THERMAL_CLASSES,
  bhCurvePoints,
  curveFieldStrength,
  designCoil,
  fieldAlongAxis,
  pullAgainstGap,
  solveCircuit,
  solveCoil,
  sweepWireSizes,
  warmUpCurve,
} from '../coil';
import { badRequest } from '../http/errors';

/** Runs the engine; a spec it refuses becomes 400 `validation` naming the field. */
function run<T>(fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof CoilSpecError) throw badRequest(e.message, { [e.field]: e.message.replace(`${e.field}: `, '') });
    throw e;
  }
}

export const calculate = (spec: CoilSpec) => run(() => designCoil(spec));
export const sweep = (spec: CoilSpec) => run(() => sweepWireSizes(spec));
export const solve = (req: CoilSolveRequest) => run(() => solveCoil(req.spec, req.target));

/**
 * The curves for a build sheet's pictures: field along the axis (to twice the winding length each
 * side), pull from zero gap to three times the design gap, the warm-up to steady temperature, and
 * with a core the iron's B–H curve with the corners' operating points.
 */
export const profile = (spec: CoilSpec): CoilProfileResponse =>
  run(() => {
    const sheet = designCoil(spec);
    const half = 2 * sheet.windingLength;
    const field = fieldAlongAxis(sheet, Array.from({ length: 121 }, (_, i) => -half + (2 * half * i) / 120));
    let pull: CoilProfileResponse['pull'] = null;
    const m = spec.magneticCircuit;
    if (m && m.gapCount > 0) {
      const top = Math.max(m.airGap * 3, 1e-3);
      const gaps = Array.from({ length: 61 }, (_, i) => (top * i) / 60);
      const curve = pullAgainstGap(spec, gaps);
      pull = { caution: curve.caution, points: curve.points };
    }
    let bh: CoilProfileResponse['bh'] = null;
    if (m) {
      const points = (['low', 'nominal', 'high'] as const).map((corner) => {
        const p = solveCircuit(sheet.corners[corner].ampereTurns, m);
        return { corner, H: p.fieldStrength, B: p.fluxDensity };
      });
      // Wide enough for the operating points with room beside them, and for the knee.
      const kneeH = m.bhCurve ? curveFieldStrength(m.bhCurve, m.saturationFluxDensity) : m.saturationFluxDensity / (MU0 * m.relativePermeability);
      const hMax = Math.max(2.5 * Math.max(...points.map((p) => p.H)), 1.15 * kneeH) || 1;
      bh = { model: m.bhCurve ? 'curve' : 'linear', knee: m.saturationFluxDensity, curve: bhCurvePoints(m, hMax), points };
    }
    return { field, pull, warmUp: warmUpCurve(sheet, 81), bh };
  });

/** The engine's constants, for the engineer's reference panel (one source: server/coil). */
export const reference = (): CoilReferenceResponse => ({
  engineVersion: ENGINE_VERSION,
  conductors: CONDUCTORS,
  thermalClasses: [...THERMAL_CLASSES],
  hotSpot: { allowances: { ...HOT_SPOT_ALLOWANCES }, source: HOT_SPOT_SOURCE },
  supplyTolerance: { ...DEFAULT_SUPPLY_TOLERANCE, source: SUPPLY_TOLERANCE_SOURCE },
  coreMaterials: CORE_MATERIALS.map((m) => ({ ...m })),
});
