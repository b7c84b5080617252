import { describe, expect, it } from 'vitest';
import { magneticConstant, unit } from 'mathjs';
import {
  CORE_MATERIALS,
  FERROMAGNETIC_SUSCEPTIBILITY_RULE,
  MU0,
  PULL_CAUTION,
  designCoil,
  fieldAlongAxis,
  pullAgainstGap,
  solenoidAxialField,
  wheelerInductance,
} from '../../server/coil/index';
import { baseSpec, magnetSpec } from './fixtures';

const mu0 = magneticConstant.toNumber('H/m'); // mathjs physical constant (CODATA)

/** On-axis field of one circular loop, T: μ0 I a² / (2 (a² + z²)^{3/2}) (Biot–Savart, closed form). */
function loopAxial(current: number, a: number, z: number): number {
  return (mu0 * current * a * a) / (2 * Math.pow(a * a + z * z, 1.5));
}

/** On-axis z-field of a loop summed from straight segments, Biot–Savart dB = μ0 I dl × r / (4π r³). */
function loopBySegments(current: number, a: number, z: number, segments: number): number {
  let bz = 0;
  for (let k = 0; k < segments; k++) {
    const p0 = (2 * Math.PI * k) / segments;
    const p1 = (2 * Math.PI * (k + 1)) / segments;
    const pm = (p0 + p1) / 2;
    const dlx = a * (Math.cos(p1) - Math.cos(p0));
    const dly = a * (Math.sin(p1) - Math.sin(p0));
    // vector from the segment midpoint to the field point (0, 0, z)
    const rx = -a * Math.cos(pm);
    const ry = -a * Math.sin(pm);
    const rz = z;
    const r3 = Math.pow(rx * rx + ry * ry + rz * rz, 1.5);
    bz += (mu0 * current * (dlx * ry - dly * rx)) / (4 * Math.PI * r3);
  }
  return bz;
}

/** Thick solenoid on-axis field as a numerical sum of loops over the winding section (midpoint rule). */
function thickBySum(ni: number, a1: number, a2: number, length: number, z: number, nr = 400, nz = 400): number {
  const iPerLoop = ni / (nr * nz);
  let b = 0;
  for (let i = 0; i < nr; i++) {
    const r = a1 + ((i + 0.5) * (a2 - a1)) / nr;
    for (let j = 0; j < nz; j++) {
      const zc = -length / 2 + ((j + 0.5) * length) / nz;
      b += loopAxial(iPerLoop, r, z - zc);
    }
  }
  return b;
}

describe('magnetic constant', () => {
  it('engine μ0 equals the CODATA value in mathjs', () => {
    expect(MU0).toBeCloseTo(mu0, 18);
  });
});

describe('thick-solenoid field against a numerical Biot–Savart sum', () => {
  it('the loop formula used by the sum agrees with a segment-by-segment Biot–Savart sum', () => {
    for (const z of [0, 0.005, 0.02]) {
      expect(loopBySegments(1, 0.01, z, 2000) / loopAxial(1, 0.01, z)).toBeCloseTo(1, 5);
    }
  });

  it.each([
    [0.005, 0.015, 0.03],
    [0.0, 0.02, 0.01],
    [0.02, 0.021, 0.2],
  ])('a1=%f a2=%f L=%f: closed form matches the sum at the centre, the end and outside', (a1, a2, length) => {
    for (const z of [0, length / 2, 1.5 * length]) {
      const closed = solenoidAxialField(1000, a1, a2, length, z);
      const summed = thickBySum(1000, a1, a2, length, z);
      expect(Math.abs(closed / summed - 1)).toBeLessThan(2e-4);
    }
  });

  it('a long thin coil gives μ0·N·I/ℓ at its centre', () => {
    // Long solenoid: B = μ0 N I / ℓ (textbook closed form); 1 m long, 10 mm bore, one layer.
    const sheet = designCoil(
      baseSpec({
        bobbin: { innerDiameter: 0.01, outerDiameter: 0.0111, length: 1 },
        drive: { kind: 'current', amps: 0.5 },
      }),
    );
    expect(sheet.layers).toBe(1);
    const ideal = (mu0 * sheet.turns * sheet.currentHot) / 1;
    expect(Math.abs(sheet.centreField / ideal - 1)).toBeLessThan(1e-3);
  });

  it('far away the coil looks like a dipole of moment NI·π(a1² + a1a2 + a2²)/3', () => {
    // On-axis dipole field B = μ0 m / (2π z³); the moment of a uniform thick winding is
    // the sum of I·πr² over the section (closed form).
    const [a1, a2, length, ni] = [0.005, 0.015, 0.02, 500];
    const moment = (ni * Math.PI * (a1 * a1 + a1 * a2 + a2 * a2)) / 3;
    const z = 2;
    const dipole = (mu0 * moment) / (2 * Math.PI * z ** 3);
    expect(Math.abs(solenoidAxialField(ni, a1, a2, length, z) / dipole - 1)).toBeLessThan(1e-3);
  });
});

describe('fieldAlongAxis', () => {
  const sheet = designCoil(baseSpec());
  it('equals centreField at z = 0 and is symmetric', () => {
    const pts = fieldAlongAxis(sheet, [0, 0.004, -0.004, 0.03, -0.03]);
    expect(pts[0].B).toBeCloseTo(sheet.centreField, 15);
    expect(pts[1].B).toBeCloseTo(pts[2].B, 15);
    expect(pts[3].B).toBeCloseTo(pts[4].B, 15);
    expect(pts[0].B).toBeGreaterThan(pts[1].B);
  });
  it('spreads a point count from −L to +L and accepts a bare geometry', () => {
    const pts = fieldAlongAxis({ innerDiameter: 0.01, outerDiameter: 0.03, length: 0.02, ampereTurns: 1000 }, 5);
    [-0.02, -0.01, 0, 0.01, 0.02].forEach((z, i) => expect(pts[i].z).toBeCloseTo(z, 15));
    expect(pts[2].B).toBeCloseTo(thickBySum(1000, 0.005, 0.015, 0.02, 0), 6);
  });
});

/** Complete elliptic integrals K(k), E(k) by the arithmetic–geometric mean. */
function ellipticKE(k: number): [number, number] {
  let a = 1;
  let b = Math.sqrt(1 - k * k);
  let c = k;
  let sum = 0.5 * c * c;
  let pow = 0.5;
  for (let n = 0; n < 40 && Math.abs(c) > 1e-16; n++) {
    const an = (a + b) / 2;
    const bn = Math.sqrt(a * b);
    c = (a - b) / 2;
    pow *= 2;
    sum += pow * c * c;
    a = an;
    b = bn;
  }
  const K = Math.PI / (2 * a);
  return [K, K * (1 - sum)];
}

/** Mutual inductance of two coaxial circular filaments (Maxwell's formula with elliptic integrals). */
function mutual(r1: number, r2: number, d: number): number {
  const k2 = (4 * r1 * r2) / ((r1 + r2) ** 2 + d * d);
  const k = Math.sqrt(k2);
  const [K, E] = ellipticKE(k);
  return mu0 * Math.sqrt(r1 * r2) * ((2 / k - k) * K - (2 / k) * E);
}

/**
 * Inductance of a rectangular-section winding by the filament method (Maxwell; Grover,
 * Inductance Calculations): split the section into cells, sum mutual inductances between
 * cell filaments, and use μ0 r (ln(8r/g) − 2) for each cell, g = 0.2235 (w + h) the geometric
 * mean distance of a rectangle.
 */
function filamentInductance(turns: number, a1: number, a2: number, length: number, nr: number, nz: number): number {
  const rs: number[] = [];
  const zs: number[] = [];
  const w = (a2 - a1) / nr;
  const h = length / nz;
  for (let i = 0; i < nr; i++) for (let j = 0; j < nz; j++) {
    rs.push(a1 + (i + 0.5) * w);
    zs.push(-length / 2 + (j + 0.5) * h);
  }
  const g = 0.2235 * (w + h);
  let sum = 0;
  for (let p = 0; p < rs.length; p++) {
    sum += mu0 * rs[p] * (Math.log((8 * rs[p]) / g) - 2);
    for (let q = p + 1; q < rs.length; q++) sum += 2 * mutual(rs[p], rs[q], zs[p] - zs[q]);
  }
  const perCell = turns / rs.length;
  return perCell * perCell * sum;
}

describe("Wheeler's inductance formulas", () => {
  it('the mutual-inductance formula reaches the dipole limit μ0 π a² b² / (2 d³)', () => {
    // Far-field limit of two coaxial loops (closed form).
    const d = 5;
    expect(mutual(0.01, 0.02, d) / ((mu0 * Math.PI * 0.01 ** 2 * 0.02 ** 2) / (2 * d ** 3))).toBeCloseTo(1, 4);
  });

  it('multilayer formula agrees with the Brooks-coil constant of Brooks & Turner', () => {
    // Brooks coil (square section c × c, mean radius 1.5c): L = 0.025491 c N² µH with c in cm
    // (Brooks & Turner, 1912; from memory). Wheeler claims about 1 % for this shape.
    const c = 0.02;
    const n = 500;
    const brooks = 0.025491e-6 * (c * 100) * n * n;
    const wheeler = wheelerInductance(n, 1.5 * c, c, c, false);
    expect(Math.abs(wheeler / brooks - 1)).toBeLessThan(0.015);
  });

  it('multilayer formula agrees with a numerical mutual-inductance sum of loops', () => {
    const [a1, a2, length, n] = [0.008, 0.016, 0.02, 800];
    const numeric = filamentInductance(n, a1, a2, length, 16, 20);
    const wheeler = wheelerInductance(n, (a1 + a2) / 2, length, a2 - a1, false);
    expect(Math.abs(wheeler / numeric - 1)).toBeLessThan(0.03);
  });

  it('single-layer formula agrees with a numerical sum over the turns', () => {
    // 100 turns of 0.36 mm wire at 0.4 mm pitch on a 10 mm radius: each turn a filament,
    // self term μ0 r (ln(8r/ρ) − 7/4) for a round wire of radius ρ (Grover).
    const [r, turns, pitch, rho] = [0.01, 100, 0.4e-3, 0.18e-3];
    let sum = 0;
    for (let i = 0; i < turns; i++) {
      sum += mu0 * r * (Math.log((8 * r) / rho) - 1.75);
      for (let j = i + 1; j < turns; j++) sum += 2 * mutual(r, r, (i - j) * pitch);
    }
    const wheeler = wheelerInductance(turns, r, turns * pitch, 0, true);
    expect(Math.abs(wheeler / sum - 1)).toBeLessThan(0.03);
  });

  it('an air-core build sheet uses the formula for its own winding', () => {
    const s = designCoil(baseSpec());
    const a = (s.innerDiameter + s.outerDiameter) / 4;
    const c = (s.outerDiameter - s.innerDiameter) / 2;
    // Wheeler 1928, inches → metres with mathjs
    const inch = unit('1 inch').toNumber('m');
    const expected = (0.8e-6 * (a / inch) ** 2 * s.turns ** 2) / ((6 * a + 9 * s.windingLength + 10 * c) / inch);
    expect(s.inductance).toBeCloseTo(expected, 12);
    expect(s.timeConstant).toBeCloseTo(s.inductance / s.resistanceHot, 15);
  });
});

describe('magnetic circuit and Maxwell pull', () => {
  it('F = B²A/2μ0: one tesla is 398 kPa, so one square centimetre pulls about 39.8 N', () => {
    // Maxwell pull, closed form: 1² / (2 × 4π × 10⁻⁷) = 397 887 Pa; × 1e-4 m² = 39.789 N
    const s = designCoil(
      magnetSpec({
        drive: { kind: 'current', amps: 1 },
        magneticCircuit: { relativePermeability: 1e9, saturationFluxDensity: 1, ironPathLength: 0.1, airGap: 1e-4, gapCount: 1, area: 1e-4 },
      }),
    );
    expect(s.gapFluxDensity).toBe(1); // driven into the 1 T cap
    expect(s.pullForce).toBeCloseTo(1e-4 / (2 * mu0), 6);
    expect(s.pullForce).toBeCloseTo(39.789, 3);
  });

  it('B = NI/(ℛA), F = n·B²A/(2μ0), L = N²/ℛ with ℛ = n·g/(μ0A) + l/(μ0μrA)', () => {
    const spec = magnetSpec();
    const s = designCoil(spec);
    const m = spec.magneticCircuit!;
    const reluctance = (m.gapCount * m.airGap) / (mu0 * m.area) + m.ironPathLength / (mu0 * m.relativePermeability * m.area);
    const b = s.ampereTurnsHot / (reluctance * m.area);
    expect(b).toBeLessThan(m.saturationFluxDensity);
    expect(s.gapFluxDensity).toBeCloseTo(b, 12);
    expect(s.pullForce).toBeCloseTo((m.gapCount * b * b * m.area) / (2 * mu0), 9);
    expect(s.inductance).toBeCloseTo((s.turns * s.turns) / reluctance, 12);
    expect(s.warnings.map((w) => w.code)).not.toContain('saturation');
  });

  it('caps the flux at saturation and warns', () => {
    const s = designCoil(magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, airGap: 1e-5, saturationFluxDensity: 0.5 } }));
    expect(s.gapFluxDensity).toBe(0.5);
    const w = s.warnings.find((x) => x.code === 'saturation');
    expect(w?.message).toMatch(/saturat/);
  });

  it('a core multiplies the field by orders of magnitude (χ of the order of 6×10³, common practice)', () => {
    const generic = CORE_MATERIALS.find((m) => m.id === 'generic-iron')!;
    expect(generic.relativePermeability).toBe(1 + 6e3);
    expect(FERROMAGNETIC_SUSCEPTIBILITY_RULE).toBe(6e3);
    // Closed iron ring of the winding's length: B = μ0 μr NI / l versus the air-core centre field.
    const spec = magnetSpec({ drive: { kind: 'current', amps: 0.01 } });
    const air = designCoil({ ...spec, magneticCircuit: undefined });
    const cored = designCoil({
      ...spec,
      magneticCircuit: { relativePermeability: generic.relativePermeability, saturationFluxDensity: generic.saturationFluxDensity, ironPathLength: 0.03, airGap: 0, gapCount: 0, area: 1e-4 },
    });
    expect(cored.gapFluxDensity! / air.centreField).toBeGreaterThan(1000);
  });

  it('every core material names its source and has μr ≥ 1 and a positive saturation', () => {
    for (const m of CORE_MATERIALS) {
      expect(m.source.length).toBeGreaterThan(10);
      expect(m.relativePermeability).toBeGreaterThanOrEqual(1);
      expect(m.saturationFluxDensity).toBeGreaterThan(0);
    }
  });
});

describe('pullAgainstGap', () => {
  it('follows Maxwell at every gap, falls as the gap opens, and carries the lifting caution', () => {
    const spec = magnetSpec();
    const m = spec.magneticCircuit!;
    const gaps = [0.0002, 0.0005, 0.001, 0.002, 0.005];
    const curve = pullAgainstGap(spec, gaps);
    const ni = designCoil(spec).ampereTurnsHot;
    expect(curve.ampereTurns).toBeCloseTo(ni, 12);
    curve.points.forEach((p, i) => {
      const r = (m.gapCount * gaps[i]) / (mu0 * m.area) + m.ironPathLength / (mu0 * m.relativePermeability * m.area);
      const b = Math.min(ni / (r * m.area), m.saturationFluxDensity);
      expect(p.fluxDensity).toBeCloseTo(b, 12);
      expect(p.force).toBeCloseTo((m.gapCount * b * b * m.area) / (2 * mu0), 9);
      if (i > 0) expect(p.force).toBeLessThanOrEqual(curve.points[i - 1].force);
    });
    // the pull at the spec's own gap matches the build sheet
    expect(curve.points[2].force).toBeCloseTo(designCoil(spec).pullForce!, 9);
    expect(curve.caution).toBe(PULL_CAUTION);
    expect(curve.caution).toMatch(/not a lifting/);
    expect(curve.caution).toMatch(/safety factor/);
  });

  it('needs a magnetic circuit', () => {
    expect(() => pullAgainstGap(baseSpec(), [0.001])).toThrow(/magnetic circuit/);
  });

  it('build sheets with a circuit carry the caution in their assumptions', () => {
    const s = designCoil(magnetSpec());
    expect(s.assumptions.some((a) => String(a.value).includes('not a lifting'))).toBe(true);
  });
});
