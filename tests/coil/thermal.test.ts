import { describe, expect, it } from 'vitest';
import {
  CoilSpecError,
  RUNAWAY_LIMIT,
  THERMAL_CLASSES,
  correctResistance,
  designCoil,
  temperatureRiseByResistance,
  warmUpCurve,
} from '../../server/coil/index';
import { baseSpec } from './fixtures';
import { heat } from './integrate';

/** Copper's line through −234.5 °C (IEEE Std 118): α20 = 1/254.5 (IEC 60028's 0.00393 to three figures). */
const ALPHA_CU = 1 / 254.5;

describe('resistance method (IEC 60034-1 / IEEE Std 118)', () => {
  it('copper: Δθ = (R2 − R1)/R1 · (234.5 + θ1) + θ1 − θa', () => {
    // R1 = 10 Ω at 20 °C, R2 = 12.5 Ω, ambient 25 °C: 0.25 × 254.5 + 20 − 25 = 58.625 K
    expect(
      temperatureRiseByResistance({ coldResistance: 10, coldTemperature: 20, hotResistance: 12.5, ambient: 25, conductor: 'copper' }),
    ).toBeCloseTo(58.625, 12);
  });
  it('aluminium uses k = 1/0.00403 − 20 = 228.139, from the one α model (not IEC 60034-1’s 225)', () => {
    // 61 % IACS aluminium α20 = 0.00403 /K (IEC 60121, from memory): k = 248.1390 − 20 = 228.1390.
    // 0.25 × (228.1390 + 20) + 20 − 25 = 57.0347 K (with 225 it would read 56.25 K).
    expect(
      temperatureRiseByResistance({ coldResistance: 10, coldTemperature: 20, hotResistance: 12.5, ambient: 25, conductor: 'aluminium' }),
    ).toBeCloseTo(57.0347, 3);
  });
  it('correctResistance scales by (k + T_ref)/(k + T_measured)', () => {
    // 10 Ω measured at 75 °C, referred to 20 °C: 10 × 254.5 / 309.5
    expect(correctResistance(10, 75, 20, 'copper')).toBeCloseTo((10 * 254.5) / 309.5, 12);
    // aluminium: 10 × 248.1390 / 303.1390 = 8.18566 Ω
    expect(correctResistance(10, 75, 20, 'aluminium')).toBeCloseTo(8.18566, 4);
    // the same measurement read back at its own temperature is unchanged
    expect(correctResistance(7.3, 31, 31, 'copper')).toBeCloseTo(7.3, 14);
  });
  it('agrees with the build sheet: a coil measured hot reads back its own rise', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 4 } }));
    const cold = s.resistance20 * (1 + ALPHA_CU * (s.ambient - 20));
    const rise = temperatureRiseByResistance({
      coldResistance: cold,
      coldTemperature: s.ambient,
      hotResistance: s.resistanceHot,
      ambient: s.ambient,
      conductor: 'copper',
    });
    // the design and the bench use one line (α = 1/254.5 ⇔ k = 234.5): the rise reads back exactly
    expect(Math.abs(rise - s.temperatureRise)).toBeLessThan(1e-9);
  });
  it('refuses nonsense', () => {
    expect(() => correctResistance(-1, 20, 20, 'copper')).toThrow(CoilSpecError);
    expect(() => correctResistance(1, -300, 20, 'copper')).toThrow(CoilSpecError);
  });
});

const h = 10; // default still-air coefficient (common practice, no published source)

describe('steady temperature with resistance feedback', () => {
  it('voltage drive: the result is the fixed point of ΔT = V²d/(hA·R(T)) to 1e-9 K, found here by bisection', () => {
    for (const volts of [1, 3, 6, 12]) {
      for (const duty of [1, 0.3]) {
        const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts }, dutyCycle: duty }));
        const g = (rise: number) => rise - (volts * volts * duty) / (h * s.surfaceArea * s.resistance20 * (1 + ALPHA_CU * (s.ambient + rise - 20)));
        let lo = 0;
        let hi = 2000;
        for (let i = 0; i < 200; i++) {
          const mid = (lo + hi) / 2;
          if (g(mid) > 0) hi = mid;
          else lo = mid;
        }
        expect(Math.abs(s.temperatureRise - lo)).toBeLessThan(1e-9);
        expect(Math.abs(g(s.temperatureRise))).toBeLessThan(1e-9);
      }
    }
  });

  it('current drive: ΔT = k(1 + α(Tₐ − 20))/(1 − kα), k = I²R20·d/(hA)', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.8 }, dutyCycle: 0.5, ambient: 40 }));
    const k = (0.8 * 0.8 * s.resistance20 * 0.5) / (h * s.surfaceArea);
    expect(k * ALPHA_CU).toBeLessThan(1);
    expect(s.temperatureRise).toBeCloseTo((k * (1 + ALPHA_CU * 20)) / (1 - k * ALPHA_CU), 9);
    expect(s.voltage).toBeCloseTo(0.8 * s.resistanceHot, 12);
    expect(s.thermalRunaway).toBe(false);
  });

  it('current drive with kα ≥ 1 runs away, warns, and stays finite', () => {
    const amps = 6;
    const s = designCoil(baseSpec({ drive: { kind: 'current', amps } }));
    const k = (amps * amps * s.resistance20) / (h * s.surfaceArea);
    expect(k * ALPHA_CU).toBeGreaterThanOrEqual(1);
    expect(s.thermalRunaway).toBe(true);
    expect(s.windingTemperature).toBe(RUNAWAY_LIMIT);
    expect(s.warnings.map((w) => w.code)).toContain('thermal-runaway');
    expect(Number.isFinite(s.powerHot)).toBe(true);
  });

  it('a voltage-driven coil whose steady state lies above 1000 °C is flagged as runaway', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 200 } }));
    expect(s.thermalRunaway).toBe(true);
    expect(s.windingTemperature).toBe(RUNAWAY_LIMIT);
  });

  it('hot and cold values: R(T) = R20(1 + α(T − 20)), I = V/R, P = I²R', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 5 }, ambient: 30 }));
    const rCold = s.resistance20 * (1 + ALPHA_CU * 10);
    expect(s.resistanceHot).toBeCloseTo(s.resistance20 * (1 + ALPHA_CU * (s.windingTemperature - 20)), 12);
    expect(s.currentCold).toBeCloseTo(5 / rCold, 12);
    expect(s.currentHot).toBeCloseTo(5 / s.resistanceHot, 12);
    expect(s.powerCold).toBeCloseTo(25 / rCold, 9);
    expect(s.powerHot).toBeCloseTo(25 / s.resistanceHot, 9);
    expect(s.ampereTurnsHot).toBeCloseTo(s.turns * s.currentHot, 9);
    expect(s.ampereTurnsHot).toBeLessThan(s.ampereTurnsCold);
  });

  it('uses the shop h when given', () => {
    const a = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.5 } }));
    const b = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.5 }, heatTransferCoefficient: 20 }));
    expect(b.temperatureRise).toBeLessThan(a.temperatureRise);
    expect(b.assumptions.find((x) => x.name.startsWith('heat-transfer'))?.value).toBe(20);
  });

  it('over-temperature: winding + hot-spot allowance above the class, with the fire risk named', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 8 }, insulationClass: 105 }));
    expect(s.windingTemperature + 10).toBeGreaterThan(105);
    const w = s.warnings.find((x) => x.code === 'over-temperature');
    expect(w?.message).toMatch(/fire risk/);
    // the allowance alone can tip it over
    const cool = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 1 }, insulationClass: 105, hotSpotAllowance: 0 }));
    expect(cool.warnings.map((x) => x.code)).not.toContain('over-temperature');
    const margin = 105 - cool.windingTemperature + 1;
    const tipped = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 1 }, insulationClass: 105, hotSpotAllowance: margin }));
    expect(tipped.warnings.map((x) => x.code)).toContain('over-temperature');
  });

  it('thermal time constant m·c/(hA) with copper c = 385 J/(kg·K) (handbook, from memory)', () => {
    const s = designCoil(baseSpec());
    // one thermal capacity: the bare conductor (the enamel's is left out, which errs hot)
    expect(s.thermalTimeConstant).toBeCloseTo((s.conductorMass * 385) / (h * s.surfaceArea), 9);
  });
});

describe('IEC 60085 thermal classes', () => {
  it('are 105, 120, 130, 155, 180, 200 and 220 °C', () => {
    // IEC 60085 thermal classes A, E, B, F, H, 200, 220 (as listed in the product brief)
    expect([...THERMAL_CLASSES]).toEqual([105, 120, 130, 155, 180, 200, 220]);
  });
});

describe('warmUpCurve', () => {
  const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 4 } }));
  it('starts at ambient, follows an RK4 integration with the resistance feedback and reaches the steady value', () => {
    const tau = s.thermalTimeConstant;
    const pts = warmUpCurve(s, [0, tau, 2 * tau, 50 * tau]);
    expect(pts[0].T).toBeCloseTo(s.ambient, 12);
    // C = m·c with c = 385 J/(kg·K) (from memory), G = h·A: an independent RK4 of C dT/dt = V²/R(T) − G(T − Tₐ).
    const model = { capacity: s.conductorMass * 385, conductance: h * s.surfaceArea, resistance20: s.resistance20, alpha: ALPHA_CU, ambient: s.ambient };
    expect(pts[1].T).toBeCloseTo(heat(model, { kind: 'voltage', volts: 4 }, s.ambient, tau, 4000), 6);
    expect(pts[2].T).toBeCloseTo(heat(model, { kind: 'voltage', volts: 4 }, s.ambient, 2 * tau, 8000), 6);
    expect(pts[3].T).toBeCloseTo(s.windingTemperature, 6);
    // constant power at the cold resistance would overshoot: the feedback slows the rise
    expect(pts[1].T).toBeLessThan(s.ambient + (16 / (s.resistance20 * (1 + ALPHA_CU * (s.ambient - 20))) / model.conductance) * (1 - Math.exp(-1)));
  });
  it('a point count spans 0 to 5τ and never falls', () => {
    const pts = warmUpCurve(s, 11);
    expect(pts).toHaveLength(11);
    expect(pts[10].t).toBeCloseTo(5 * s.thermalTimeConstant, 9);
    for (let i = 1; i < pts.length; i++) expect(pts[i].T).toBeGreaterThanOrEqual(pts[i - 1].T);
  });
});
