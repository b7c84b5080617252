/**
 * Switch-off (stored energy, clamp, peak voltage, decay against the closed form and a numerical
 * integration), the default resistance band, and the cautions beside the numbers.
 */
import { describe, expect, it } from 'vitest';
import { designCoil } from '../../server/coil/index';
import type { CoilSpec } from '../../server/coil/index';
import { baseSpec, magnetSpec } from './fixtures';

const ALPHA_CU = 1 / 254.5; // IEEE Std 118's 234.5 for copper

/** Time for L di/dt = −R i − V_c to bring i from I₀ to 0.1 I₀, by fine RK4 (independent of the closed form). */
function decayByIntegration(L: number, R: number, Vc: number, I0: number): number {
  const f = (i: number) => (-R * i - Vc) / L;
  const dt = L / R / 20000;
  let i = I0;
  let t = 0;
  while (i > 0.1 * I0) {
    const k1 = f(i);
    const k2 = f(i + (dt / 2) * k1);
    const k3 = f(i + (dt / 2) * k2);
    const k4 = f(i + dt * k3);
    const next = i + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    if (next <= 0.1 * I0) return t + (dt * (i - 0.1 * I0)) / (i - next);
    i = next;
    t += dt;
  }
  return t;
}

describe('switch-off', () => {
  const spec = magnetSpec({ drive: { kind: 'voltage', volts: 24 }, suppression: { kind: 'diode-zener', clampVoltage: 33 } });
  const s = designCoil(spec);
  const Rcold = s.resistance20 * (1 + ALPHA_CU * (25 - 20));
  const I0 = 26.4 / Rcold; // supply × 1.10 into the winding at ambient: the largest current broken

  it('stored energy ½LI² of the largest current, clamp = Zener + diode drop, peak = supply + clamp', () => {
    expect(s.switchOff.current).toBeCloseTo(I0, 12);
    expect(s.switchOff.storedEnergy).toBeCloseTo(0.5 * s.inductance * I0 * I0, 12);
    // diode forward drop 0.7 V (common practice, no published source)
    expect(s.switchOff.clampVoltage).toBeCloseTo(33.7, 12);
    expect(s.switchOff.peakVoltage).toBeCloseTo(26.4 + 33.7, 12);
  });

  it('decay to 10 %: the closed form τ ln((I₀ + V_c/R)/(0.1 I₀ + V_c/R)), and a numerical integration agrees', () => {
    const tau = s.inductance / Rcold;
    const closed = tau * Math.log((I0 + 33.7 / Rcold) / (0.1 * I0 + 33.7 / Rcold));
    expect(s.switchOff.decayTime).toBeCloseTo(closed, 12);
    expect(Math.abs(decayByIntegration(s.inductance, Rcold, 33.7, I0) / s.switchOff.decayTime! - 1)).toBeLessThan(1e-4);
  });

  it('a worked example of the closed form: L 0.5 H, R 20 Ω, I₀ 1.2 A, V_c 24.7 V', () => {
    // τ = 25 ms; V_c/R = 1.235 A; t = 0.025 × ln(2.435/1.355) = 0.025 × 0.586178 = 14.654 ms.
    // A plain diode (0.7 V): 0.025 × ln(1.235/0.155) = 0.025 × 2.07539 = 51.88 ms — a Zener releases faster.
    expect(decayByIntegration(0.5, 20, 24.7, 1.2)).toBeCloseTo(0.014654, 5);
    expect(decayByIntegration(0.5, 20, 0.7, 1.2)).toBeCloseTo(0.051885, 5);
  });

  it('a diode clamps at its drop and releases slower; a TVS at its clamp voltage', () => {
    const diode = designCoil({ ...spec, suppression: { kind: 'diode' } });
    expect(diode.switchOff.clampVoltage).toBe(0.7);
    expect(diode.switchOff.peakVoltage).toBeCloseTo(27.1, 12);
    expect(diode.switchOff.decayTime!).toBeGreaterThan(s.switchOff.decayTime!);
    const tvs = designCoil({ ...spec, suppression: { kind: 'tvs', clampVoltage: 40 } });
    expect(tvs.switchOff.clampVoltage).toBe(40);
    expect(tvs.switchOff.peakVoltage).toBeCloseTo(66.4, 12);
  });

  it('none: no peak figure and a no-suppression warning; none stated: a diode, said to be assumed', () => {
    const none = designCoil({ ...spec, suppression: { kind: 'none' } });
    expect(none.switchOff.peakVoltage).toBeNull();
    expect(none.switchOff.decayTime).toBeNull();
    expect(none.warnings.find((w) => w.code === 'no-suppression')?.message).toMatch(/arcing or breakdown/);
    const unstated = designCoil({ ...spec, suppression: undefined });
    expect(unstated.switchOff.kind).toBe('diode');
    expect(unstated.switchOff.assumed).toBe(true);
    expect(unstated.warnings.map((w) => w.code)).not.toContain('no-suppression');
  });
});

describe('resistance band', () => {
  it('AWG 30 layer wound: the NEMA MW 1000 limits plus ±1 % build', () => {
    // "Copper Magnet Wire Data" (NEMA MW 1000 data, scribd 456864939): AWG 30 101.7 / 103.7 /
    // 105.8 Ω per 1000 ft (looked up): −1.929 % / +2.025 %. Build spread ±1 % layer, ±3 % random
    // (common practice, no published source).
    const spec: CoilSpec = { ...baseSpec({ overallDiameter: undefined }), wire: { standard: 'AWG', gauge: 30 } };
    const s = designCoil(spec);
    // (the table prints four figures: agreement to 0.1 % of R20)
    expect(Math.abs(s.resistanceBand.min / s.resistance20 - (1 - (1 - 101.7 / 103.7) - 0.01))).toBeLessThan(1e-3);
    expect(Math.abs(s.resistanceBand.max / s.resistance20 - (1 + (105.8 / 103.7 - 1) + 0.01))).toBeLessThan(1e-3);
    expect(s.resistanceBand.basis).toMatch(/NEMA MW 1000/);
    const random = designCoil({ ...spec, pattern: 'random' });
    expect(Math.abs(random.resistanceBand.max / random.resistance20 - 1 - (105.8 / 103.7 - 1 + 0.03))).toBeLessThan(1e-3);
  });
});

describe('cautions beside the numbers', () => {
  const codes = (spec: CoilSpec) => designCoil(spec).cautions.map((c) => c.code);

  it('every coil: the switch-off spike and the charge left after an insulation test', () => {
    expect(codes(baseSpec())).toEqual(expect.arrayContaining(['switch-off', 'stored-charge']));
    expect(designCoil(baseSpec()).cautions.find((c) => c.code === 'stored-charge')?.message).toMatch(/discharge/);
  });

  it('strong field at 0.5 mT and above (implants, flying steel); not for a feeble coil', () => {
    // 0.5 mT: the ICNIRP (2009) level for interference with active implants (from memory).
    const strong = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 3 } }));
    expect(strong.centreField).toBeGreaterThan(0.5e-3);
    expect(strong.cautions.find((c) => c.code === 'strong-field')?.message).toMatch(/pacemaker/);
    const feeble = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.001 } }));
    expect(feeble.centreField).toBeLessThan(0.5e-3);
    expect(feeble.cautions.map((c) => c.code)).not.toContain('strong-field');
  });

  it('a magnet with an armature: pinching, and a lifting caution that loss of power drops the load', () => {
    const s = designCoil(magnetSpec());
    const lifting = s.cautions.find((c) => c.code === 'lifting')?.message ?? '';
    expect(lifting).toMatch(/not a lifting/);
    expect(lifting).toMatch(/Loss of power drops the load/);
    expect(lifting).toMatch(/lifting-device standard/);
    expect(s.cautions.map((c) => c.code)).toContain('pinch');
  });

  it('a hot surface from 60 °C (ISO 13732-1 contact burn thresholds, from memory)', () => {
    expect(codes(baseSpec({ drive: { kind: 'voltage', volts: 4 } }))).toContain('hot-surface');
    expect(codes(baseSpec({ drive: { kind: 'voltage', volts: 0.5 } }))).not.toContain('hot-surface');
  });
});
