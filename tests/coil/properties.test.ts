import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AWG_GAUGES, METRIC_DIAMETERS, correctResistance, designCoil } from '../../server/coil/index';
import type { BuildSheet, CoilSpec } from '../../server/coil/index';

const bobbinArb = fc
  .record({
    innerDiameter: fc.double({ min: 0, max: 0.05, noNaN: true }),
    depth: fc.double({ min: 1e-4, max: 0.03, noNaN: true }),
    length: fc.double({ min: 5e-4, max: 0.1, noNaN: true }),
  })
  .map(({ innerDiameter, depth, length }) => ({ innerDiameter, outerDiameter: innerDiameter + 2 * depth, length }));

const patternArb = fc.constantFrom('layer' as const, 'orthocyclic' as const, 'random' as const);
const gradeArb = fc.constantFrom(1 as const, 2 as const, 3 as const);
const classArb = fc.constantFrom(105, 120, 130, 155, 180, 200, 220) as fc.Arbitrary<CoilSpec['insulationClass']>;

const specArb: fc.Arbitrary<CoilSpec> = fc
  .record({
    conductor: fc.constantFrom('copper' as const, 'aluminium' as const),
    gauge: fc.integer({ min: 4, max: 44 }),
    grade: gradeArb,
    bobbin: bobbinArb,
    pattern: patternArb,
    turns: fc.option(fc.integer({ min: 1, max: 100000 }), { nil: undefined }),
    drive: fc.oneof(
      fc.double({ min: 0.01, max: 1000, noNaN: true }).map((volts) => ({ kind: 'voltage' as const, volts })),
      fc.double({ min: 1e-4, max: 100, noNaN: true }).map((amps) => ({ kind: 'current' as const, amps })),
    ),
    dutyCycle: fc.double({ min: 0.001, max: 1, noNaN: true }),
    ambient: fc.double({ min: -40, max: 200, noNaN: true }),
    insulationClass: classArb,
    leadLength: fc.option(fc.double({ min: 0, max: 2, noNaN: true }), { nil: undefined }),
    circuit: fc.option(
      fc.record({
        relativePermeability: fc.double({ min: 1, max: 1e5, noNaN: true }),
        saturationFluxDensity: fc.double({ min: 0.1, max: 2.5, noNaN: true }),
        ironPathLength: fc.double({ min: 1e-3, max: 1, noNaN: true }),
        airGap: fc.double({ min: 0, max: 0.02, noNaN: true }),
        gapCount: fc.integer({ min: 0, max: 2 }),
        area: fc.double({ min: 1e-6, max: 1e-2, noNaN: true }),
      }),
      { nil: undefined },
    ),
  })
  .map((r) => ({
    conductor: r.conductor,
    wire: { standard: 'AWG' as const, gauge: r.gauge },
    insulationGrade: r.grade,
    bobbin: r.bobbin,
    pattern: r.pattern,
    turns: r.turns,
    leadLength: r.leadLength,
    drive: r.drive,
    dutyCycle: r.dutyCycle,
    ambient: r.ambient,
    insulationClass: r.insulationClass,
    magneticCircuit: r.circuit,
  }));

describe('invariants (fast-check)', () => {
  it('thicker wire never gives more turns (AWG and metric, every pattern)', () => {
    fc.assert(
      fc.property(bobbinArb, patternArb, gradeArb, (bobbin, pattern, grade) => {
        const base = {
          conductor: 'copper' as const,
          insulationGrade: grade,
          bobbin,
          pattern,
          drive: { kind: 'voltage' as const, volts: 12 },
          dutyCycle: 1,
          ambient: 25,
          insulationClass: 155 as const,
        };
        let previous = -1;
        for (const gauge of AWG_GAUGES) {
          // thickest first: turns may only grow as the gauge number rises
          const t = designCoil({ ...base, wire: { standard: 'AWG', gauge } }).turns;
          expect(t).toBeGreaterThanOrEqual(previous);
          previous = t;
        }
        previous = -1;
        for (const diameter of METRIC_DIAMETERS) {
          const t = designCoil({ ...base, wire: { standard: 'metric', diameter } }).turns;
          expect(t).toBeGreaterThanOrEqual(previous);
          previous = t;
        }
      }),
      { numRuns: 150 },
    );
  });

  it('more voltage never gives a lower temperature', () => {
    fc.assert(
      fc.property(
        specArb,
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        (spec, v1, v2) => {
          const [lo, hi] = v1 <= v2 ? [v1, v2] : [v2, v1];
          const a = designCoil({ ...spec, drive: { kind: 'voltage', volts: lo } });
          const b = designCoil({ ...spec, drive: { kind: 'voltage', volts: hi } });
          expect(b.windingTemperature).toBeGreaterThanOrEqual(a.windingTemperature);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('results are finite or warned', () => {
    const numbers = (s: BuildSheet): number[] => [
      s.turns, s.turnsPerLayer, s.layers, s.outerDiameter, s.meanTurnLength, s.wireLength, s.wireMass, s.fillFactor,
      s.resistance20, s.resistanceHot, s.windingTemperature, s.temperatureRise, s.surfaceArea, s.voltage,
      s.currentCold, s.currentHot, s.powerCold, s.powerHot, s.ampereTurnsCold, s.ampereTurnsHot, s.currentDensity,
      s.centreField, s.gapFluxDensity ?? 0, s.pullForce ?? 0, s.inductance, s.timeConstant, s.thermalTimeConstant,
    ];
    fc.assert(
      fc.property(specArb, (spec) => {
        const s = designCoil(spec);
        const finite = numbers(s).every((x) => Number.isFinite(x));
        expect(finite || s.warnings.length > 0).toBe(true);
        for (const w of s.warnings) expect(w.message.length).toBeGreaterThan(20);
      }),
      { numRuns: 500 },
    );
  });

  it('hot is never cooler than ambient, and voltage-driven ampere-turns fall as the coil warms', () => {
    fc.assert(
      fc.property(specArb, (spec) => {
        const s = designCoil(spec);
        expect(s.windingTemperature).toBeGreaterThanOrEqual(spec.ambient - 1e-9);
        if (spec.drive.kind === 'voltage' && s.turns > 0) {
          expect(s.ampereTurnsHot).toBeLessThanOrEqual(s.ampereTurnsCold * (1 + 1e-12));
        }
      }),
      { numRuns: 300 },
    );
  });

  it('correctResistance round-trips between any two temperatures', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e5, noNaN: true }),
        fc.double({ min: -50, max: 250, noNaN: true }),
        fc.double({ min: -50, max: 250, noNaN: true }),
        fc.constantFrom('copper' as const, 'aluminium' as const),
        (r, t1, t2, c) => {
          const back = correctResistance(correctResistance(r, t1, t2, c), t2, t1, c);
          expect(Math.abs(back / r - 1)).toBeLessThan(1e-12);
        },
      ),
    );
  });
});
