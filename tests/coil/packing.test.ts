/**
 * Random winding packs against the overall (insulated) diameter; a short fixed turn count lies
 * in one layer and occupies turns × d of the traverse.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { designCoil } from '../../server/coil/index';
import type { CoilSpec } from '../../server/coil/index';

const mil = unit('1 mil').toNumber('m');
const mu0 = 1.25663706212e-6; // CODATA 2018

/** AWG 42 heavy build on a small bobbin: 4 mm bore, 10 mm limit, 6 mm traverse. */
const fine = (over: Partial<CoilSpec> = {}): CoilSpec => ({
  conductor: 'copper',
  wire: { standard: 'AWG', gauge: 42 },
  insulationGrade: 2,
  bobbin: { innerDiameter: 0.004, outerDiameter: 0.01, length: 0.006 },
  pattern: 'random',
  drive: { kind: 'voltage', volts: 24 },
  dutyCycle: 1,
  ambient: 25,
  insulationClass: 155,
  ...over,
});

describe('random winding against the overall diameter', () => {
  it('AWG 42 heavy: turns = 0.9 × window / d², by hand', () => {
    // Window 6 mm × 3 mm = 18 mm². Overall diameter 3.3 mil (our grade 2 row for AWG 42) =
    // 0.08382 mm, d² = 0.0070258 mm². 0.9 × 18 / 0.0070258 = 2305.8 → 2305 turns.
    // Packing 0.9 turns per d²: common practice, no published source.
    const s = designCoil(fine());
    const d = 3.3 * mil;
    expect(s.turns).toBe(Math.floor((0.9 * 0.006 * 0.003) / (d * d)));
    expect(s.turns).toBe(2305);
    expect(s.packingFactor).toBeCloseTo(0.9, 3);
    // The first edition counted bare copper at fill 0.5: 0.5 × 18 mm² / (π/4 × 0.0635²) = 2841
    // turns, 23 % more (and 23 % more R20) than the coil the machine can wind.
    expect(2841 / s.turns - 1).toBeGreaterThan(0.2);
  });

  it('a thicker insulation grade gives fewer turns in the same window', () => {
    const g1 = designCoil(fine({ insulationGrade: 1 })).turns;
    const g2 = designCoil(fine({ insulationGrade: 2 })).turns;
    const g3 = designCoil(fine({ insulationGrade: 3 })).turns;
    expect(g1).toBeGreaterThan(g2);
    expect(g2).toBeGreaterThan(g3);
  });

  it('never packs beyond hexagonal close packing, 2/√3 turns per d², even from an older bare fill factor', () => {
    // Grade 3 AWG 42 at bare fill 0.5 would be 0.5 × (3.6/2.5)² / (π/4) = 1.32 turns per d².
    const s = designCoil(fine({ insulationGrade: 3, fillFactor: 0.5 }));
    expect(s.packingFactor).toBeLessThanOrEqual(2 / Math.sqrt(3) + 1e-9);
  });

  it('never gets more turns than orthocyclic winding into the same window (any bobbin, size, grade)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10, max: 44 }),
        fc.constantFrom(1 as const, 2 as const, 3 as const),
        fc.double({ min: 0.0005, max: 0.02, noNaN: true }),
        fc.double({ min: 0.0003, max: 0.01, noNaN: true }),
        fc.double({ min: 0.05, max: 1.1547, noNaN: true }),
        (gauge, grade, length, depth, packing) => {
          const base = fine({ wire: { standard: 'AWG', gauge }, insulationGrade: grade, bobbin: { innerDiameter: 0.005, outerDiameter: 0.005 + 2 * depth, length } });
          const random = designCoil({ ...base, packingFactor: packing });
          const ortho = designCoil({ ...base, pattern: 'orthocyclic' });
          expect(random.turns).toBeLessThanOrEqual(ortho.turns);
          expect(random.packingFactor).toBeLessThanOrEqual(2 / Math.sqrt(3) + 1e-9);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('fill factor is the bare-copper fill for every pattern', () => {
    for (const pattern of ['layer', 'orthocyclic', 'random'] as const) {
      const s = designCoil(fine({ pattern }));
      const a = (Math.PI / 4) * (2.5 * mil) ** 2; // AWG 42 bare 0.0025 in (ASTM B258)
      expect(s.fillFactor).toBeCloseTo((s.turns * a) / (0.006 * 0.003), 12);
    }
  });
});

describe('a fixed turn count shorter than one layer', () => {
  // 10 turns of AWG 22 heavy on a 50 mm traverse: overall diameter 28.0 mil (our grade 2 row) =
  // 0.7112 mm, so the turns occupy 10 × 0.7112 = 7.112 mm, not 50 mm.
  const spec: CoilSpec = {
    conductor: 'copper',
    wire: { standard: 'AWG', gauge: 22 },
    insulationGrade: 2,
    bobbin: { innerDiameter: 0.02, outerDiameter: 0.04, length: 0.05 },
    pattern: 'layer',
    turns: 10,
    drive: { kind: 'current', amps: 2 },
    dutyCycle: 1,
    ambient: 25,
    insulationClass: 155,
  };
  const s = designCoil(spec);

  it('occupies turns × d of the traverse in one layer', () => {
    expect(s.layers).toBe(1);
    expect(s.windingLength).toBeCloseTo(10 * 28.0 * mil, 12);
    expect(s.outerDiameter).toBeCloseTo(0.02 + 2 * 28.0 * mil, 12);
  });

  it('its centre field is that of 10 loops side by side (numerical Biot–Savart sum), not of a 50 mm sheet', () => {
    // Sum of the on-axis loop field μ0 I a²/(2(a² + z²)^{3/2}) over 10 loops at pitch d, radius the
    // mean of the single layer: a = (20 + 0.7112)/2 mm.
    const d = 28.0 * mil;
    const a = (0.02 + d) / 2;
    let sum = 0;
    for (let i = 0; i < 10; i++) {
      const z = (i - 4.5) * d;
      sum += (mu0 * 2 * a * a) / (2 * (a * a + z * z) ** 1.5);
    }
    expect(Math.abs(s.centreField / sum - 1)).toBeLessThan(0.01);
    // spread over the whole 50 mm traverse it would read less than half
    const sheet50 = (mu0 * 20) / (2 * 0.025) * (0.025 / Math.sqrt(a * a + 0.025 * 0.025));
    expect(sum / sheet50).toBeGreaterThan(2);
  });

  it('its inductance is the single-layer Wheeler value for 7.1 mm, and its surface the short cylinder', () => {
    // Wheeler (1928) single layer: L = a²N²/(9a + 10b) µH, a and b in inches.
    const d = 28.0 * mil;
    const aIn = (0.02 + d) / 2 / 0.0254;
    const bIn = (10 * d) / 0.0254;
    expect(s.inductance).toBeCloseTo(((aIn * aIn * 100) / (9 * aIn + 10 * bIn)) * 1e-6, 12);
    const D = 0.02 + 2 * d;
    expect(s.surfaceArea).toBeCloseTo(Math.PI * D * 10 * d + (Math.PI / 2) * (D * D - 0.02 * 0.02), 12);
  });
});
