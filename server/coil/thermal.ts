/** Resistance with temperature, the resistance method, and the steady winding temperature. */
import { CONDUCTORS, RUNAWAY_LIMIT } from './constants';
import { CoilSpecError } from './errors';
import type { Conductor } from './types';

function finite(x: unknown, field: string): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new CoilSpecError(field, 'must be a finite number');
}

/**
 * Correct a measured resistance to a reference temperature:
 *   R_ref = R · (k + T_ref) / (k + T_measured),
 * k = 234.5 for copper, 225 for aluminium (IEC 60034-1 / IEEE Std 118 resistance method).
 */
export function correctResistance(
  resistance: number,
  measuredAt: number,
  referenceAt: number,
  conductor: Conductor,
): number {
  finite(resistance, 'resistance');
  finite(measuredAt, 'measuredAt');
  finite(referenceAt, 'referenceAt');
  if (resistance <= 0) throw new CoilSpecError('resistance', 'resistance must be positive');
  const p = CONDUCTORS[conductor];
  if (!p) throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  const k = p.resistanceMethodK;
  if (measuredAt <= -k) throw new CoilSpecError('measuredAt', `temperature must be above ${-k} °C`);
  if (referenceAt <= -k) throw new CoilSpecError('referenceAt', `temperature must be above ${-k} °C`);
  return (resistance * (k + referenceAt)) / (k + measuredAt);
}

/**
 * Temperature rise by the resistance method (IEC 60034-1 / IEEE Std 118):
 *   Δθ = (R2 − R1)/R1 · (k + θ1) + θ1 − θa,
 * R1 cold resistance at θ1, R2 hot resistance, θa ambient at the end of the test,
 * k = 234.5 for copper, 225 for aluminium. Returns kelvin.
 */
export function temperatureRiseByResistance(input: {
  coldResistance: number;
  coldTemperature: number;
  hotResistance: number;
  ambient: number;
  conductor: Conductor;
}): number {
  const { coldResistance, coldTemperature, hotResistance, ambient, conductor } = input;
  finite(coldResistance, 'coldResistance');
  finite(coldTemperature, 'coldTemperature');
  finite(hotResistance, 'hotResistance');
  finite(ambient, 'ambient');
  if (coldResistance <= 0) throw new CoilSpecError('coldResistance', 'resistance must be positive');
  if (hotResistance <= 0) throw new CoilSpecError('hotResistance', 'resistance must be positive');
  const p = CONDUCTORS[conductor];
  if (!p) throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  const k = p.resistanceMethodK;
  return ((hotResistance - coldResistance) / coldResistance) * (k + coldTemperature) + coldTemperature - ambient;
}

export interface SteadyState {
  windingTemperature: number;
  runaway: boolean;
}

/**
 * Steady winding temperature with resistance feedback. The average heat P(T) · duty leaves
 * through conductance G = h·A (Newton's law of cooling); R(T) = R20 (1 + α (T − 20)).
 *
 * Voltage drive: ΔT = V² d / (G R(Tₐ + ΔT)). With u = 1 + α (Tₐ − 20) and c = V² d / (G R20)
 * this is αΔT² + uΔT − c = 0, whose one positive root ΔT = 2c / (u + √(u² + 4αc)) is the
 * unique fixed point (the left side rises and the right side falls with ΔT); taking the root
 * directly is exact, with no iteration error.
 *
 * Current drive: ΔT = k (1 + α (Tₐ − 20)) / (1 − kα), k = I² R20 d / G; no steady state
 * (runaway) when kα ≥ 1.
 *
 * Either way a steady temperature above RUNAWAY_LIMIT (1000 °C) counts as runaway; the
 * temperature is then reported at that limit (a finite, clearly flagged figure).
 */
export function steadyTemperature(
  drive: 'voltage' | 'current',
  driveValue: number,
  resistance20: number,
  alpha: number,
  ambient: number,
  dutyCycle: number,
  conductance: number,
): SteadyState {
  const u = 1 + alpha * (ambient - 20);
  let rise: number;
  let runaway = false;
  if (drive === 'voltage') {
    const c = (driveValue * driveValue * dutyCycle) / (conductance * resistance20);
    rise = (2 * c) / (u + Math.sqrt(u * u + 4 * alpha * c));
  } else {
    const k = (driveValue * driveValue * resistance20 * dutyCycle) / conductance;
    if (k * alpha >= 1) {
      runaway = true;
      rise = RUNAWAY_LIMIT - ambient;
    } else {
      rise = (k * u) / (1 - k * alpha);
    }
  }
  let t = ambient + rise;
  if (!(t <= RUNAWAY_LIMIT)) {
    runaway = true;
    t = RUNAWAY_LIMIT;
  }
  return { windingTemperature: t, runaway };
}
