/** Air-core field, inductance and iron magnetic circuits. */
import { MU0 } from './constants';
import type { MagneticCircuit } from './types';

/** Below this relative thickness a winding is treated as a current sheet. */
const THIN_LIMIT = 1e-6;

/**
 * On-axis field of a thick solenoid of uniform current density, T, at axial distance z (m)
 * from its centre. Inner radius a1, outer radius a2, length L (m), NI ampere-turns.
 *
 * Method: integrate the on-axis field of a circular loop, B = μ0 I a² / (2 (a² + z²)^{3/2})
 * (Biot–Savart law), over the winding cross-section. The closed form is
 *   B(z) = μ0 J / 2 · [ F(z + L/2) − F(z − L/2) ],  F(x) = x · ln((a2 + √(a2² + x²)) / (a1 + √(a1² + x²))),
 * with J = NI / ((a2 − a1) L) (see D. B. Montgomery, Solenoid Magnet Design, 1969). For a thin
 * winding it becomes the current-sheet result
 *   B(z) = μ0 NI / (2L) · [ (z + L/2)/√(a² + (z + L/2)²) − (z − L/2)/√(a² + (z − L/2)²) ].
 */
export function solenoidAxialField(ampereTurns: number, a1: number, a2: number, length: number, z: number): number {
  const h = length / 2;
  const zp = z + h;
  const zm = z - h;
  const t = a2 - a1;
  if (t <= THIN_LIMIT * a2) {
    const a = (a1 + a2) / 2;
    return ((MU0 * ampereTurns) / (2 * length)) * (zp / Math.sqrt(a * a + zp * zp) - zm / Math.sqrt(a * a + zm * zm));
  }
  const J = ampereTurns / (t * length);
  return ((MU0 * J) / 2) * (sectionTerm(zp, a1, a2) - sectionTerm(zm, a1, a2));
}

function sectionTerm(x: number, a1: number, a2: number): number {
  if (x === 0) return 0; // x·ln(…) → 0 as x → 0, even for a1 = 0
  return x * Math.log((a2 + Math.sqrt(a2 * a2 + x * x)) / (a1 + Math.sqrt(a1 * a1 + x * x)));
}

/** Field at the centre of a thick solenoid, T (solenoidAxialField at z = 0). */
export function solenoidCentreField(ampereTurns: number, a1: number, a2: number, length: number): number {
  return solenoidAxialField(ampereTurns, a1, a2, length, 0);
}

/** µH per inch in Wheeler's formulas, converted to H per metre: 1e-6 / 0.0254. */
const WHEELER_SCALE = 1e-6 / 0.0254;

/**
 * Air-core inductance, H. Wheeler's multilayer formula
 *   L = 0.8 a² N² / (6a + 9b + 10c)  µH, lengths in inches,
 * a = mean radius, b = winding length, c = winding depth (H. A. Wheeler, "Simple inductance
 * formulas for radio coils", Proc. IRE 16, 1928). For a single layer (c → 0) the same paper's
 * single-layer formula L = a² N² / (9a + 10b) µH is used, since the multilayer one does not
 * reduce to it. Both are converted to SI exactly (1 in = 0.0254 m).
 */
export function wheelerInductance(turns: number, meanRadius: number, length: number, depth: number, singleLayer: boolean): number {
  const a = meanRadius;
  if (singleLayer) return (WHEELER_SCALE * a * a * turns * turns) / (9 * a + 10 * length);
  return (WHEELER_SCALE * 0.8 * a * a * turns * turns) / (6 * a + 9 * length + 10 * depth);
}

/**
 * Reluctance of an iron circuit with air gaps, A/Wb:
 * ℛ = gapCount · airGap / (μ0 A) + ironPathLength / (μ0 μr A).
 */
export function circuitReluctance(
  relativePermeability: number,
  ironPathLength: number,
  airGap: number,
  gapCount: number,
  area: number,
): number {
  return (gapCount * airGap) / (MU0 * area) + ironPathLength / (MU0 * relativePermeability * area);
}

export interface CircuitPoint {
  /** Flux density in the gap and iron, T (capped at saturation). */
  fluxDensity: number;
  /** Total pull over all gaps, N (Maxwell: F = gapCount · B² A / 2μ0). */
  force: number;
  saturated: boolean;
}

/**
 * Flux density B = NI / (ℛ A), capped at the saturation flux density, and the Maxwell pull
 * F = gapCount · B² A / (2 μ0) (magnetic pressure B²/2μ0 on each gap face).
 */
export function circuitPoint(
  ampereTurns: number,
  relativePermeability: number,
  saturationFluxDensity: number,
  ironPathLength: number,
  airGap: number,
  gapCount: number,
  area: number,
): CircuitPoint {
  const r = circuitReluctance(relativePermeability, ironPathLength, airGap, gapCount, area);
  let b = r > 0 ? ampereTurns / (r * area) : Infinity;
  let saturated = false;
  if (!(b <= saturationFluxDensity)) {
    b = saturationFluxDensity;
    saturated = true;
  }
  return { fluxDensity: b, force: (gapCount * b * b * area) / (2 * MU0), saturated };
}

export interface CircuitSolution {
  /** Flux density in the iron and the gap, T. */
  fluxDensity: number;
  /** Field strength in the iron, A/m. */
  fieldStrength: number;
  /** Total pull over all gaps, N (Maxwell: F = gapCount · B² A / 2μ0). */
  force: number;
  /** Linear model: capped at saturation. Curve: past the knee (saturationFluxDensity). */
  saturated: boolean;
  model: 'curve' | 'linear';
}

/** A B–H curve as given, with the origin put in front when it is not its first point. */
function curvePoints(curve: readonly (readonly [number, number])[]): (readonly [number, number])[] {
  return curve[0][0] > 0 || curve[0][1] > 0 ? [[0, 0], ...curve] : [...curve];
}

/** H (A/m) on a B–H curve at flux density B: straight lines between points, μ0 slope beyond the last. */
export function curveFieldStrength(curve: readonly (readonly [number, number])[], b: number): number {
  const pts = curvePoints(curve);
  for (let i = 1; i < pts.length; i++) {
    const [h0, b0] = pts[i - 1];
    const [h1, b1] = pts[i];
    if (b <= b1) return h0 + ((b - b0) / (b1 - b0)) * (h1 - h0);
  }
  const [hl, bl] = pts[pts.length - 1];
  return hl + (b - bl) / MU0;
}

/**
 * The operating point of the iron circuit at `ampereTurns` (DC), across `airGap` (default the
 * circuit's own gap).
 * - With a B–H curve: N·I = H(B)·l + n·g·B/μ0 solved exactly on the piecewise-linear curve
 *   (the left side is piecewise linear in B and rises, so the segment holding N·I is found and
 *   solved as a straight line); beyond the last point B rises as μ0·H.
 * - Without: the linear model B = N·I/(ℛA) with ℛ = n·g/(μ0A) + l/(μ0μrA), capped at saturation.
 */
export function solveCircuit(ampereTurns: number, m: MagneticCircuit, airGap: number = m.airGap): CircuitSolution {
  const l = m.ironPathLength;
  const c = (m.gapCount * airGap) / MU0; // A·turns per tesla across the gaps
  let b: number;
  let hIron: number;
  let saturated: boolean;
  let model: CircuitSolution['model'];
  if (m.bhCurve && m.bhCurve.length > 0) {
    model = 'curve';
    const pts = curvePoints(m.bhCurve);
    const ni = Math.max(0, ampereTurns);
    let found = false;
    b = 0;
    hIron = 0;
    let fPrev = pts[0][0] * l + c * pts[0][1];
    for (let i = 1; i < pts.length && !found; i++) {
      const [h0, b0] = pts[i - 1];
      const [h1, b1] = pts[i];
      const f1 = h1 * l + c * b1;
      if (ni <= f1) {
        const t = f1 > fPrev ? (ni - fPrev) / (f1 - fPrev) : 0;
        b = b0 + t * (b1 - b0);
        hIron = h0 + t * (h1 - h0);
        found = true;
      }
      fPrev = f1;
    }
    if (!found) {
      const [hl, bl] = pts[pts.length - 1];
      // dF/dB = l/μ0 + c beyond the last point.
      const slope = l / MU0 + c;
      b = bl + (ni - fPrev) / slope;
      hIron = hl + (b - bl) / MU0;
    }
    saturated = b > m.saturationFluxDensity;
  } else {
    model = 'linear';
    const r = circuitReluctance(m.relativePermeability, l, airGap, m.gapCount, m.area);
    b = r > 0 ? ampereTurns / (r * m.area) : Infinity;
    saturated = false;
    if (!(b <= m.saturationFluxDensity)) {
      b = m.saturationFluxDensity;
      saturated = true;
    }
    hIron = saturated && l > 0 ? Math.max(0, (ampereTurns - c * b) / l) : b / (MU0 * m.relativePermeability);
  }
  return { fluxDensity: b, fieldStrength: hIron, force: (m.gapCount * b * b * m.area) / (2 * MU0), saturated, model };
}

/**
 * Inductance of a coil on the circuit at its DC operating point, H: flux linkage over current,
 * L = N·B·A / I (for the unsaturated linear model exactly N²/ℛ). At no current, the small-signal
 * value N²/ℛ with the curve's first slope (or μr).
 */
export function circuitInductance(turns: number, current: number, m: MagneticCircuit, point: CircuitSolution): number {
  if (current > 0 && point.fluxDensity > 0) return (turns * point.fluxDensity * m.area) / current;
  let mu = m.relativePermeability;
  if (m.bhCurve && m.bhCurve.length > 0) {
    const [h1, b1] = curvePoints(m.bhCurve)[1] ?? m.bhCurve[0];
    if (h1 > 0) mu = b1 / (MU0 * h1);
  }
  return (turns * turns) / circuitReluctance(mu, m.ironPathLength, m.airGap, m.gapCount, m.area);
}
