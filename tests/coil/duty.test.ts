/**
 * Intermittent duty with the resistance feedback, against an independent RK4 integration of
 * C dT/dt = P(T) − G (T − Tₐ) written in tests/coil/integrate.ts.
 */
import { describe, expect, it } from 'vitest';
import { designCoil } from '../../server/coil/index';
import type { BuildSheet } from '../../server/coil/index';
import { baseSpec } from './fixtures';
import { periodicPeak, timeToReach, type Drive, type ThermalModel } from './integrate';

const ALPHA_CU = 1 / 254.5; // IEEE Std 118's 234.5 for copper
const h = 10; // W/(m²·K), still air (common practice, no published source)
const C_CU = 385; // J/(kg·K), copper near room temperature (from memory)

/** The sheet's coil as the RK4 sees it, at the high corner's ambient. */
const model = (s: BuildSheet): ThermalModel => ({
  capacity: s.conductorMass * C_CU,
  conductance: h * s.surfaceArea,
  resistance20: s.resistance20,
  alpha: ALPHA_CU,
  ambient: s.duty.ambient,
});

describe('periodic peak of an on/off cycle', () => {
  it('voltage drive, 40 % of a cycle as long as the thermal time constant', () => {
    const tau = designCoil(baseSpec()).thermalTimeConstant; // ≈ 590 s for this coil
    const cycle = Math.round(tau);
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 5 }, dutyCycle: 0.4, cycleTime: cycle, ambientMax: 40 }));
    expect(s.duty.basis).toBe('periodic');
    expect(s.duty.supply).toBeCloseTo(5.5, 12); // the high corner: 1.10 × 5 V
    const drive: Drive = { kind: 'voltage', volts: 5.5 };
    const onTime = 0.4 * cycle;
    const rk = periodicPeak(model(s), drive, onTime, cycle - onTime, cycle / 2000);
    expect(s.duty.peakTemperature).toBeCloseTo(rk, 2);
    expect(s.duty.onTime).toBeCloseTo(onTime, 12);
    // the peak lies above the duty-averaged steady temperature of the same corner
    expect(s.duty.peakTemperature).toBeGreaterThan(s.corners.high.windingTemperature + 1);
  });

  it('current drive: the peak rises with the resistance too', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'current', amps: 0.9 }, dutyCycle: 0.25, cycleTime: 600, supplyTolerance: { low: 0.9, high: 1.05 } }));
    const rk = periodicPeak(model(s), { kind: 'current', amps: 0.945 }, 150, 450, 0.25);
    expect(s.duty.peakTemperature).toBeCloseTo(rk, 2);
  });

  it('a short cycle approaches the duty-averaged steady state; duty 1 is continuous', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 5 }, dutyCycle: 0.5, cycleTime: 1 }));
    expect(Math.abs(s.duty.peakTemperature - s.corners.high.windingTemperature)).toBeLessThan(0.5);
    const c = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 5 }, dutyCycle: 1, cycleTime: 60 }));
    expect(c.duty.basis).toBe('continuous');
    expect(c.duty.peakTemperature).toBe(c.corners.high.windingTemperature);
  });

  it('a long cycle heats far above the average: over-temperature names the cycle', () => {
    // 10 % duty over 2 h: the average says cool, each 12 minute pulse nearly reaches the continuous temperature.
    const spec = baseSpec({ drive: { kind: 'voltage', volts: 6 }, dutyCycle: 0.1, insulationClass: 130 });
    expect(designCoil(spec).warnings.map((w) => w.code)).not.toContain('over-temperature');
    const long = designCoil({ ...spec, cycleTime: 7200 });
    expect(long.duty.peakTemperature + long.hotSpotAllowance).toBeGreaterThan(130);
    expect(long.warnings.find((w) => w.code === 'over-temperature')?.message).toMatch(/cycle/);
  });
});

describe('longest on-time from cold', () => {
  it('voltage drive: the time the RK4 takes to reach the class less the allowance', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 6 }, insulationClass: 130, dutyCycle: 0.2 }));
    expect(s.duty.limitTemperature).toBe(120); // class 130 less 10 K (IEC 60034-1 Table 7, from memory)
    const rk = timeToReach(model(s), { kind: 'voltage', volts: 6.6 }, s.duty.ambient, 120, 0.05, 1e5);
    expect(rk).not.toBeNull();
    expect(s.duty.maxOnTimeFromCold!).toBeCloseTo(rk!, 0);
    // a constant power at the cold resistance would reach it sooner: the feedback buys time
    const pCold = (6.6 * 6.6) / (s.resistance20 * (1 + ALPHA_CU * (25 - 20)));
    const constant = -(s.thermalTimeConstant) * Math.log(1 - (95 * h * s.surfaceArea) / pCold);
    expect(s.duty.maxOnTimeFromCold!).toBeGreaterThan(constant);
  });

  it('current drive against RK4', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'current', amps: 1.2 }, insulationClass: 155, dutyCycle: 0.1 }));
    const rk = timeToReach(model(s), { kind: 'current', amps: 1.32 }, s.duty.ambient, 145, 0.02, 1e5);
    expect(s.duty.maxOnTimeFromCold!).toBeCloseTo(rk!, 0);
  });

  it('null when continuous operation never reaches the limit', () => {
    const s = designCoil(baseSpec({ drive: { kind: 'voltage', volts: 1 } }));
    expect(s.corners.high.windingTemperature).toBeLessThan(s.duty.limitTemperature);
    expect(s.duty.maxOnTimeFromCold).toBeNull();
  });
});
