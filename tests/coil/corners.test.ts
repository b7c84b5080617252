/**
 * Operating corners and the hot-spot allowance per thermal class: the pull-in worst case (low
 * supply, winding hot at the highest ambient) and the heating worst case (high supply at the
 * highest ambient), each checked against a steady state found here by bisection.
 */
import { describe, expect, it } from 'vitest';
import { HOT_SPOT_ALLOWANCES, designCoil, hotSpotAllowance, solveCoil } from '../../server/coil/index';
import type { CoilSpec, InsulationClass } from '../../server/coil/index';
import { baseSpec, magnetSpec } from './fixtures';

const ALPHA_CU = 1 / 254.5; // IEEE Std 118's 234.5 for copper (IEC 60028: 0.00393 to three figures)
const h = 10; // W/(m²·K), still air (common practice, no published source)

/** Steady winding temperature by bisection of G·θ = d·P(Tₐ + θ), voltage or current drive. */
function steady(spec: CoilSpec, r20: number, area: number, value: number, ambient: number): number {
  const G = h * area;
  const P = (T: number) => {
    const R = r20 * (1 + ALPHA_CU * (T - 20));
    return spec.drive.kind === 'voltage' ? (value * value) / R : value * value * R;
  };
  let lo = 0;
  let hi = 1000;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (G * mid - spec.dutyCycle * P(ambient + mid) > 0) hi = mid;
    else lo = mid;
  }
  return ambient + lo;
}

describe('operating corners', () => {
  const spec = baseSpec({ drive: { kind: 'voltage', volts: 3 }, ambientMax: 40 });
  const s = designCoil(spec);
  const R = (T: number) => s.resistance20 * (1 + ALPHA_CU * (T - 20));

  it('default band 0.85 / 1.10 of the rated supply (IEC 60947-4-1 / 60947-5-1 operating limits, from memory)', () => {
    expect(s.corners.low.supply).toBeCloseTo(0.85 * 3, 12);
    expect(s.corners.high.supply).toBeCloseTo(1.1 * 3, 12);
    expect(s.corners.nominal.supply).toBe(3);
    expect(s.corners.low.ambient).toBe(40);
    expect(s.corners.high.ambient).toBe(40);
    expect(s.corners.nominal.ambient).toBe(25);
  });

  it('low: 0.85 × supply with the winding at the steady temperature of the rated supply at the highest ambient', () => {
    const T = steady(spec, s.resistance20, s.surfaceArea, 3, 40);
    expect(s.corners.low.windingTemperature).toBeCloseTo(T, 8);
    expect(s.corners.low.resistance).toBeCloseTo(R(T), 10);
    expect(s.corners.low.current).toBeCloseTo(2.55 / R(T), 10);
    expect(s.corners.low.ampereTurns).toBeCloseTo((s.turns * 2.55) / R(T), 8);
    // the pull-in worst case gives fewer ampere-turns than the nominal hot point
    expect(s.corners.low.ampereTurns).toBeLessThan(s.ampereTurnsHot);
  });

  it('high: 1.10 × supply at its own steady temperature at the highest ambient', () => {
    const T = steady(spec, s.resistance20, s.surfaceArea, 3.3, 40);
    expect(s.corners.high.windingTemperature).toBeCloseTo(T, 8);
    expect(s.corners.high.power).toBeCloseTo((3.3 * 3.3) / R(T), 10);
    expect(s.corners.high.windingTemperature).toBeGreaterThan(s.windingTemperature);
  });

  it('a current drive scales the current; the nominal corner is the sheet’s own figures', () => {
    const c = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.4 }, supplyTolerance: { low: 0.9, high: 1.05 } }));
    expect(c.corners.low.ampereTurns).toBeCloseTo(c.turns * 0.36, 9);
    expect(c.corners.high.current).toBeCloseTo(0.42, 12);
    expect(c.corners.nominal.windingTemperature).toBe(c.windingTemperature);
    expect(c.corners.nominal.ampereTurns).toBe(c.ampereTurnsHot);
  });

  it('with a magnetic circuit each corner carries its gap flux density and pull', () => {
    const m = designCoil(magnetSpec({ ambientMax: 50 }));
    expect(m.corners.low.pullForce!).toBeLessThan(m.pullForce!);
    expect(m.corners.high.pullForce!).toBeGreaterThan(m.corners.low.pullForce!);
    expect(m.corners.nominal.pullForce).toBe(m.pullForce);
  });

  it('the solver meets its target at the low corner', () => {
    const spec2 = magnetSpec({ dutyCycle: 0.5, ambientMax: 40 });
    const r = solveCoil(spec2, { pullForce: 15 });
    expect(r.candidates.length).toBeGreaterThan(0);
    for (const c of r.candidates) expect(c.corners.low.pullForce!).toBeGreaterThanOrEqual(15);
    // a size that meets 15 N hot at the nominal point but not at the low corner is refused, with the reason
    const between = r.rejected.find((x) => x.reasons.some((why) => /at the low corner/.test(why)));
    expect(between).toBeDefined();
  });
});

describe('hot-spot allowance per thermal class', () => {
  it('IEC 60034-1 Table 7: class − 40 °C − resistance-method rise limit (from memory)', () => {
    // Rise limits at 40 °C coolant, indirectly cooled windings, by resistance: A 60 K, E 75 K,
    // B 80 K, F 105 K, H 125 K (IEC 60034-1 Table 7, from memory). 200 and 220 keep class H's 15 K.
    const limits: [InsulationClass, number][] = [
      [105, 60],
      [120, 75],
      [130, 80],
      [155, 105],
      [180, 125],
    ];
    for (const [cls, rise] of limits) expect(hotSpotAllowance(cls)).toBe(cls - 40 - rise);
    expect(hotSpotAllowance(200)).toBe(15);
    expect(hotSpotAllowance(220)).toBe(15);
    expect(Object.keys(HOT_SPOT_ALLOWANCES)).toHaveLength(7);
  });

  /** Rated volts that put the high corner at `target` °C (found on the engine's own temperature). */
  function voltsFor(cls: InsulationClass, target: number, over: Partial<CoilSpec> = {}): CoilSpec {
    let lo = 0.1;
    let hi = 50;
    for (let i = 0; i < 80; i++) {
      const mid = (lo + hi) / 2;
      const t = designCoil(baseSpec({ insulationClass: cls, drive: { kind: 'voltage', volts: mid }, ...over })).corners.high.windingTemperature;
      if (t > target) hi = mid;
      else lo = mid;
    }
    return baseSpec({ insulationClass: cls, drive: { kind: 'voltage', volts: lo }, ...over });
  }
  const codes = (spec: CoilSpec) => designCoil(spec).warnings.map((w) => w.code);

  it('class 155 (10 K): 150 °C at the high corner warns, 144 °C does not', () => {
    expect(codes(voltsFor(155, 150))).toContain('over-temperature');
    expect(codes(voltsFor(155, 144))).not.toContain('over-temperature');
  });

  it('class 105 (5 K): 101 °C warns, 99 °C does not — a flat 10 K would have warned at 99 °C', () => {
    expect(codes(voltsFor(105, 101))).toContain('over-temperature');
    expect(codes(voltsFor(105, 99))).not.toContain('over-temperature');
    expect(designCoil(voltsFor(105, 99)).hotSpotAllowance).toBe(5);
  });

  it('class 180 (15 K): 168 °C warns, 164 °C does not', () => {
    expect(codes(voltsFor(180, 168))).toContain('over-temperature');
    expect(codes(voltsFor(180, 164))).not.toContain('over-temperature');
  });

  it('over-temperature is judged at the high corner, not at the nominal point', () => {
    // High corner at 150 °C (class 155): nominal 1.0 × supply at 25 °C is far cooler, yet it warns.
    const spec = voltsFor(155, 150, { ambientMax: 40 });
    const s = designCoil(spec);
    expect(s.windingTemperature + 10).toBeLessThan(155);
    expect(s.warnings.find((w) => w.code === 'over-temperature')?.message).toMatch(/high corner/);
  });

  it('the spec’s own allowance still wins', () => {
    const spec = voltsFor(155, 150);
    expect(codes({ ...spec, hotSpotAllowance: 0 })).not.toContain('over-temperature');
  });
});
