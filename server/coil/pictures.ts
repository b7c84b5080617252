/**
 * Cheap, pure helpers for the pictures on a build sheet: the field along the axis, pull
 * against gap, and the warm-up curve.
 */
import { CONDUCTORS, MU0, PULL_CAUTION } from './constants';
import { designCoil } from './design';
import { CoilSpecError } from './errors';
import { solenoidAxialField, solveCircuit } from './magnetics';
import { heatingLaw, riseAfter } from './thermal';
import type { BuildSheet, CoilSpec, MagneticCircuit } from './types';

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
 * Pull of the spec's magnetic circuit at each air gap (m), at the hot operating point: the
 * circuit solved as the sheet solves it (B–H curve, or B = NI/(ℛA) capped at saturation),
 * F = gapCount · B² A / (2 μ0) (Maxwell). The coil is designed once; only the gap changes.
 * Requires spec.magneticCircuit.
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
    const pt = solveCircuit(sheet.ampereTurnsHot, m, gap);
    points[i] = { gap, fluxDensity: pt.fluxDensity, force: pt.force, saturated: pt.saturated };
  }
  return { ampereTurns: sheet.ampereTurnsHot, caution: PULL_CAUTION, points };
}

/**
 * Winding temperature after switch-on from ambient, at the sheet's nominal point with the
 * duty-averaged power and the resistance feedback: C dθ/dt = d·P(θ) − G θ, solved in closed form
 * (thermal.ts), C the thermal capacity and G = h·A. `points` is the list of times (s) or a count
 * of evenly spaced times from 0 to 5τ, τ = C/G.
 */
export function warmUpCurve(sheet: BuildSheet, points: number | readonly number[]): { t: number; T: number }[] {
  const tau = sheet.thermalTimeConstant;
  const ts = typeof points === 'number' ? spaced(points, 0, 5 * tau) : points;
  const out = new Array<{ t: number; T: number }>(ts.length);
  if (!(tau > 0) || sheet.turns === 0) {
    for (let i = 0; i < ts.length; i++) out[i] = { t: ts[i], T: sheet.windingTemperature };
    return out;
  }
  const alpha = CONDUCTORS[sheet.wire.conductor].alpha20;
  const rAmbient = sheet.resistance20 * (1 + alpha * (sheet.ambient - 20));
  const p = sheet.driveKind === 'voltage' ? (sheet.voltage * sheet.voltage) / rAmbient : sheet.currentHot * sheet.currentHot * rAmbient;
  const law = heatingLaw(sheet.driveKind, p * sheet.dutyCycle, alpha, sheet.ambient, sheet.thermalCapacity, sheet.conductance);
  for (let i = 0; i < ts.length; i++) {
    const t = ts[i];
    out[i] = { t, T: Math.min(sheet.ambient + riseAfter(law, 0, t), Math.max(sheet.windingTemperature, sheet.ambient)) };
  }
  return out;
}

/** The B–H picture of a circuit: the iron's curve (or the linear model with its cap) up to `hMax` A/m. */
export function bhCurvePoints(m: MagneticCircuit, hMax: number, count = 60): { H: number; B: number }[] {
  const out: { H: number; B: number }[] = [];
  if (m.bhCurve && m.bhCurve.length) {
    const pts = m.bhCurve[0][0] > 0 || m.bhCurve[0][1] > 0 ? [[0, 0] as [number, number], ...m.bhCurve] : [...m.bhCurve];
    for (const [H, B] of pts) if (H <= hMax) out.push({ H, B });
    const [hl, bl] = pts[pts.length - 1];
    if (hMax > hl) out.push({ H: hMax, B: bl + MU0 * (hMax - hl) });
    else {
      // End on the curve at hMax.
      for (let i = 1; i < pts.length; i++) {
        if (pts[i][0] >= hMax) {
          const [h0, b0] = pts[i - 1];
          const [h1, b1] = pts[i];
          out.push({ H: hMax, B: b0 + ((hMax - h0) / (h1 - h0)) * (b1 - b0) });
          break;
        }
      }
    }
    return out;
  }
  const slope = MU0 * m.relativePermeability;
  for (let i = 0; i < count; i++) {
    const H = (hMax * i) / (count - 1);
    out.push({ H, B: Math.min(m.saturationFluxDensity, slope * H) });
  }
  return out;
}
