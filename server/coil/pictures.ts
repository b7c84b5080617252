/**
 * Cheap, pure helpers for the pictures on a build sheet: the field along the axis, pull
 * against gap, and the warm-up curve.
 */
import { PULL_CAUTION } from './constants';
import { designCoil } from './design';
import { CoilSpecError } from './errors';
import { circuitPoint, solenoidAxialField } from './magnetics';
import type { BuildSheet, CoilSpec } from './types';

/** An air-core winding for fieldAlongAxis: diameters and length in m, current as ampere-turns. */
export interface AxisGeometry {
  innerDiameter: number;
  outerDiameter: number;
  length: number;
  ampereTurns: number;
}

function isSheet(x: BuildSheet | AxisGeometry): x is BuildSheet {
  return (x as BuildSheet).windingLength !== undefined;
}

/** `n` evenly spaced values from `from` to `to` (one value: `from`). */
function spaced(n: number, from: number, to: number): number[] {
  const count = Math.max(1, Math.floor(n));
  const out = new Array<number>(count);
  if (count === 1) {
    out[0] = from;
    return out;
  }
  const step = (to - from) / (count - 1);
  for (let i = 0; i < count; i++) out[i] = from + i * step;
  return out;
}

/**
 * On-axis field of the air-core winding (thick solenoid of uniform current density, see
 * solenoidAxialField) at axial positions z, m from the winding centre. `points` is either the
 * list of z values or a count of evenly spaced points from −L to +L (L = winding length).
 * A build sheet uses its hot ampere-turns.
 */
export function fieldAlongAxis(
  source: BuildSheet | AxisGeometry,
  points: number | readonly number[],
): { z: number; B: number }[] {
  const di = source.innerDiameter;
  const dout = source.outerDiameter;
  const length = isSheet(source) ? source.windingLength : source.length;
  const ni = isSheet(source) ? source.ampereTurnsHot : source.ampereTurns;
  const zs = typeof points === 'number' ? spaced(points, -length, length) : points;
  const out = new Array<{ z: number; B: number }>(zs.length);
  for (let i = 0; i < zs.length; i++) {
    const z = zs[i];
    out[i] = { z, B: ni === 0 || dout <= di ? 0 : solenoidAxialField(ni, di / 2, dout / 2, length, z) };
  }
  return out;
}

export interface PullCurve {
  /** Hot ampere-turns of the coil, the same at every gap (DC). */
  ampereTurns: number;
  /** A computed pull is not a lifting rating. */
  caution: string;
  points: { gap: number; fluxDensity: number; force: number; saturated: boolean }[];
}

/**
 * Pull of the spec's magnetic circuit at each air gap (m), at the hot operating point:
 * B = NI/(ℛA) capped at saturation, F = gapCount · B² A / (2 μ0) (Maxwell). The coil is
 * designed once; only the gap changes. Requires spec.magneticCircuit.
 */
export function pullAgainstGap(spec: CoilSpec, gaps: readonly number[]): PullCurve {
  if (!spec || !spec.magneticCircuit) {
    throw new CoilSpecError('magneticCircuit', 'a pull curve needs a magnetic circuit in the spec');
  }
  const sheet = designCoil(spec);
  const m = spec.magneticCircuit;
  const points: PullCurve['points'] = new Array(gaps.length);
  for (let i = 0; i < gaps.length; i++) {
    const gap = gaps[i];
    if (typeof gap !== 'number' || !Number.isFinite(gap) || gap < 0) {
      throw new CoilSpecError(`gaps.${i}`, 'each gap must be zero or a positive number of metres');
    }
    const pt = circuitPoint(
      sheet.ampereTurnsHot,
      m.relativePermeability,
      m.saturationFluxDensity,
      m.ironPathLength,
      gap,
      m.gapCount,
      m.area,
    );
    points[i] = { gap, fluxDensity: pt.fluxDensity, force: pt.force, saturated: pt.saturated };
  }
  return { ampereTurns: sheet.ampereTurnsHot, caution: PULL_CAUTION, points };
}

/**
 * Winding temperature after switch-on, first-order model with the sheet's thermal time
 * constant τ = m·c/(h·A): T(t) = Tₐ + ΔT (1 − e^(−t/τ)), ΔT the steady rise. `points` is the
 * list of times (s) or a count of evenly spaced times from 0 to 5τ.
 */
export function warmUpCurve(sheet: BuildSheet, points: number | readonly number[]): { t: number; T: number }[] {
  const tau = sheet.thermalTimeConstant;
  const ts = typeof points === 'number' ? spaced(points, 0, 5 * tau) : points;
  const out = new Array<{ t: number; T: number }>(ts.length);
  for (let i = 0; i < ts.length; i++) {
    const t = ts[i];
    const fraction = tau > 0 ? 1 - Math.exp(-t / tau) : 1;
    out[i] = { t, T: sheet.ambient + sheet.temperatureRise * fraction };
  }
  return out;
}
