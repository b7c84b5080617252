/** Air-core field, inductance and iron magnetic circuits. */
import { MU0 } from './constants';

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
