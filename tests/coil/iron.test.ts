/** Non-linear iron: the magnetic circuit solved on a B–H curve, against a point solved by hand. */
import { describe, expect, it } from 'vitest';
import { CORE_MATERIALS, designCoil, solveCircuit } from '../../server/coil/index';
import type { MagneticCircuit } from '../../server/coil/index';
import { magnetSpec } from './fixtures';

const mu0 = 1.25663706212e-6; // CODATA 2018

/** Five points of a typical annealed low-carbon steel curve (from memory), H in A/m, B in T. */
const steel: [number, number][] = [
  [100, 0.2],
  [200, 0.6],
  [300, 0.9],
  [500, 1.15],
  [1000, 1.35],
];
const circuit: MagneticCircuit = {
  relativePermeability: 2000,
  saturationFluxDensity: 1.45,
  ironPathLength: 0.1,
  airGap: 0.0005,
  gapCount: 1,
  area: 1e-4,
  bhCurve: steel,
};

describe('a B–H operating point solved by hand', () => {
  it('600 ampere-turns across 100 mm of steel and a 0.5 mm gap', () => {
    // N·I = H(B)·l + g·B/μ0, l = 0.1 m, g/μ0 = 0.0005 / 1.25663706212e-6 = 397.887 A/T.
    // The left side at the curve's points (H·l + 397.887·B):
    //   (0, 0) → 0;  (100, 0.2) → 10 + 79.577 = 89.577;  (200, 0.6) → 20 + 238.732 = 258.732;
    //   (300, 0.9) → 30 + 358.099 = 388.099;  (500, 1.15) → 50 + 457.570 = 507.570;
    //   (1000, 1.35) → 100 + 537.148 = 637.148.
    // 600 lies between 507.570 and 637.148: t = (600 − 507.570)/(637.148 − 507.570) = 92.430/129.578
    //   = 0.71331, so B = 1.15 + 0.71331 × 0.20 = 1.29266 T and H = 500 + 0.71331 × 500 = 856.66 A/m.
    // Check: 856.66 × 0.1 + 397.887 × 1.29266 = 85.666 + 514.334 = 600.0.
    // Pull F = B²A/(2μ0) = 1.67098 × 1e-4 / 2.51327e-6 = 66.486 N.
    const p = solveCircuit(600, circuit);
    expect(p.model).toBe('curve');
    expect(p.fluxDensity).toBeCloseTo(1.29266, 4);
    expect(p.fieldStrength).toBeCloseTo(856.66, 1);
    expect(p.force).toBeCloseTo(66.486, 2);
    expect(p.saturated).toBe(false);
  });

  it('beyond the last point B rises as μ0·H', () => {
    // 1000 A·turns: past (1000, 1.35) where the left side is 637.148; slope l/μ0 + g/μ0 =
    // 79577.47 + 397.887 = 79975.36 A/T, so B = 1.35 + (1000 − 637.148)/79975.36 = 1.354537 T,
    // below the 1.45 T knee (not saturated); with the knee at 1.30 T it is past it.
    const p = solveCircuit(1000, circuit);
    expect(p.fluxDensity).toBeCloseTo(1.354537, 5);
    expect(p.saturated).toBe(false);
    expect(solveCircuit(1000, { ...circuit, saturationFluxDensity: 1.3 }).saturated).toBe(true);
  });
});

describe('the build sheet solves its circuit on the curve', () => {
  it('B in the gap balances the hot ampere-turns, by an interpolation written here', () => {
    const s = designCoil(magnetSpec({ magneticCircuit: circuit }));
    const B = s.gapFluxDensity!;
    // H(B) on the straight lines between the points (origin first)
    const pts: [number, number][] = [[0, 0], ...steel];
    let H = NaN;
    for (let i = 1; i < pts.length; i++) {
      if (B <= pts[i][1]) {
        H = pts[i - 1][0] + ((B - pts[i - 1][1]) / (pts[i][1] - pts[i - 1][1])) * (pts[i][0] - pts[i - 1][0]);
        break;
      }
    }
    expect(H * 0.1 + (0.0005 * B) / mu0).toBeCloseTo(s.ampereTurnsHot, 6);
    expect(s.ironOperatingPoint?.model).toBe('curve');
    expect(s.ironOperatingPoint?.fieldStrength).toBeCloseTo(H, 6);
    // inductance at the DC point: flux linkage over current
    expect(s.inductance).toBeCloseTo((s.turns * B * 1e-4) / s.currentHot, 12);
  });

  it('past the knee it warns, and the rule-of-thumb linear iron overstates the pull there by about 30 %', () => {
    // At the curve's last point the solve gives 1.35 T with 637.148 A·turns (above). The linear
    // rule of thumb (μr = 6001, capped at 1.6 T; common practice) gives B = μ0·637.148/(g + l/μr)
    // = 8.00672e-4 / (5e-4 + 1.66639e-5) = 1.54968 T, and a pull (1.54968/1.35)² = 1.318 times larger.
    const linear = solveCircuit(637.148, { ...circuit, relativePermeability: 6001, saturationFluxDensity: 1.6, bhCurve: undefined });
    const curved = solveCircuit(637.148, circuit);
    expect(linear.fluxDensity).toBeCloseTo(1.54968, 4);
    expect(curved.fluxDensity).toBeCloseTo(1.35, 4);
    expect(linear.force / curved.force).toBeCloseTo(1.318, 2);
    const hot = designCoil(magnetSpec({ drive: { kind: 'voltage', volts: 24 }, magneticCircuit: { ...circuit, saturationFluxDensity: 0.5 } }));
    expect(hot.warnings.find((w) => w.code === 'saturation')?.message).toMatch(/knee/);
  });

  it('every library material with a curve has rising points and names where they come from', () => {
    const withCurve = CORE_MATERIALS.filter((m) => m.bhCurve);
    expect(withCurve.length).toBeGreaterThanOrEqual(5);
    for (const m of withCurve) {
      expect(m.source).toMatch(/from memory/);
      for (let i = 1; i < m.bhCurve!.length; i++) {
        expect(m.bhCurve![i][0]).toBeGreaterThan(m.bhCurve![i - 1][0]);
        expect(m.bhCurve![i][1]).toBeGreaterThan(m.bhCurve![i - 1][1]);
      }
      expect(m.saturationFluxDensity).toBeLessThan(m.bhCurve![m.bhCurve!.length - 1][1]);
    }
  });
});
