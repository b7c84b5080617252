/** Resistance with temperature, the resistance method, and the steady winding temperature. */
import { CONDUCTORS, RUNAWAY_LIMIT, resistanceMethodConstant } from './constants';
import { CoilSpecError } from './errors';
import type { Conductor, Drive } from './types';

function finite(x: unknown, field: string): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new CoilSpecError(field, 'must be a finite number');
}

/**
 * Correct a measured resistance to a reference temperature:
 *   R_ref = R · (k + T_ref) / (k + T_measured),
 * k = resistanceMethodConstant(conductor) = 1/α20 − 20: 234.5 for copper (IEEE Std 118), 228.1
 * for 61 % IACS aluminium (see constants.ts for why not IEC 60034-1's 225).
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
  if (!CONDUCTORS[conductor]) throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  const k = resistanceMethodConstant(conductor);
  if (measuredAt <= -k) throw new CoilSpecError('measuredAt', `temperature must be above ${-k} °C`);
  if (referenceAt <= -k) throw new CoilSpecError('referenceAt', `temperature must be above ${-k} °C`);
  return (resistance * (k + referenceAt)) / (k + measuredAt);
}

/**
 * Temperature rise by the resistance method (IEC 60034-1 / IEEE Std 118):
 *   Δθ = (R2 − R1)/R1 · (k + θ1) + θ1 − θa,
 * R1 cold resistance at θ1, R2 hot resistance, θa ambient at the end of the test,
 * k = resistanceMethodConstant(conductor) (copper 234.5, aluminium 228.1). Returns kelvin.
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
  if (!CONDUCTORS[conductor]) throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  const k = resistanceMethodConstant(conductor);
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

/**
 * The steady winding temperature of a coil, for "the same coil at another ambient" (or another
 * supply): resistance feedback with the conductor's one α model, Newton's law of cooling through
 * `conductance` = h·A (W/K), average power × duty. Pure; throws CoilSpecError for bad input.
 */
export function steadyWindingTemperature(input: {
  drive: Drive;
  /** Resistance at 20 °C, Ω. */
  resistance20: number;
  conductor: Conductor;
  /** °C. */
  ambient: number;
  dutyCycle: number;
  /** W/K (h × surface area). */
  conductance: number;
}): SteadyState & { resistance: number; current: number; power: number } {
  const { drive, resistance20, conductor, ambient, dutyCycle, conductance } = input;
  if (!CONDUCTORS[conductor]) throw new CoilSpecError('conductor', "conductor must be 'copper' or 'aluminium'");
  finite(resistance20, 'resistance20');
  finite(ambient, 'ambient');
  finite(dutyCycle, 'dutyCycle');
  finite(conductance, 'conductance');
  if (resistance20 <= 0) throw new CoilSpecError('resistance20', 'resistance must be positive');
  if (conductance <= 0) throw new CoilSpecError('conductance', 'conductance must be positive');
  if (dutyCycle <= 0 || dutyCycle > 1) throw new CoilSpecError('dutyCycle', 'duty cycle must be above 0 and at most 1');
  const value = drive.kind === 'voltage' ? drive.volts : drive.amps;
  finite(value, drive.kind === 'voltage' ? 'drive.volts' : 'drive.amps');
  if (value <= 0) throw new CoilSpecError(drive.kind === 'voltage' ? 'drive.volts' : 'drive.amps', 'drive must be positive');
  const alpha = CONDUCTORS[conductor].alpha20;
  const st = steadyTemperature(drive.kind, value, resistance20, alpha, ambient, dutyCycle, conductance);
  const resistance = resistance20 * (1 + alpha * (st.windingTemperature - 20));
  const current = drive.kind === 'voltage' ? value / resistance : value;
  return { ...st, resistance, current, power: current * current * resistance };
}

// ── Transients with the resistance feedback (closed forms) ───────────────────────────────────
//
// With θ the rise over ambient, R(θ) = R_a (1 + aθ), R_a = R(ambient), a = α/(1 + α(Tₐ − 20)),
// C the thermal capacity (J/K) and G = h·A (W/K), the winding obeys C dθ/dt = P(θ) − Gθ:
//   voltage drive: P = P_a/(1 + aθ), P_a = V²/R_a;   current drive: P = P_a (1 + aθ), P_a = I² R_a.
// Both separate, so the time between two temperatures has a closed form (heatingTime), which is
// what the engine integrates: no constant-power assumption and no step-size error.

/** The heating law of one coil at one drive and ambient (while energised). */
export interface Heating {
  kind: 'voltage' | 'current';
  /** Power at ambient, W. */
  powerAtAmbient: number;
  /** a = α / (1 + α (Tₐ − 20)), 1/K. */
  a: number;
  /** Thermal capacity, J/K. */
  capacity: number;
  /** W/K. */
  conductance: number;
  /** Steady rise while energised continuously, K (Infinity when a current drive runs away). */
  steadyRise: number;
}

export function heatingLaw(
  kind: 'voltage' | 'current',
  powerAtAmbient: number,
  alpha: number,
  ambient: number,
  capacity: number,
  conductance: number,
): Heating {
  const a = alpha / (1 + alpha * (ambient - 20));
  let steadyRise: number;
  if (kind === 'voltage') {
    // a G θ² + G θ − P_a = 0, positive root in the cancellation-free form.
    steadyRise = (2 * powerAtAmbient) / (conductance * (1 + Math.sqrt(1 + (4 * a * powerAtAmbient) / conductance)));
  } else {
    const k = conductance - a * powerAtAmbient;
    steadyRise = k > 0 ? powerAtAmbient / k : Infinity;
  }
  return { kind, powerAtAmbient, a, capacity, conductance, steadyRise };
}

/**
 * Time to heat from rise θ1 to rise θ2 while energised, s (θ1 ≤ θ2; Infinity when θ2 is never
 * reached). Voltage drive, with θ+ the steady rise and θ− = −1/a − θ+ the other root of
 * aGθ² + Gθ − P_a:
 *   t = C/(G (1 + 2aθ+)) · [ (1 + aθ+) ln((θ+ − θ1)/(θ+ − θ2)) − aθ+ ln((1 + a(θ2 + θ+))/(1 + a(θ1 + θ+))) ]
 * (partial fractions of C(1 + aθ)/(P_a − Gθ − aGθ²)). Current drive, k = G − aP_a:
 *   t = C/k · ln((P_a − kθ1)/(P_a − kθ2))   (k = 0: C(θ2 − θ1)/P_a).
 */
export function heatingTime(h: Heating, rise1: number, rise2: number): number {
  if (rise2 <= rise1) return 0;
  const C = h.capacity;
  const G = h.conductance;
  if (h.kind === 'voltage') {
    const tp = h.steadyRise;
    if (rise2 >= tp) return Infinity;
    const a = h.a;
    return (
      (C / (G * (1 + 2 * a * tp))) *
      ((1 + a * tp) * Math.log((tp - rise1) / (tp - rise2)) - a * tp * Math.log((1 + a * (rise2 + tp)) / (1 + a * (rise1 + tp))))
    );
  }
  const P = h.powerAtAmbient;
  const k = G - h.a * P;
  if (k === 0) return (C * (rise2 - rise1)) / P;
  const den = P - k * rise2;
  if (den <= 0) return Infinity;
  return (C / k) * Math.log((P - k * rise1) / den);
}

/** Rise after `time` s energised from rise θ1, K (the inverse of heatingTime). */
export function riseAfter(h: Heating, rise1: number, time: number): number {
  if (time <= 0) return rise1;
  if (h.kind === 'current') {
    const P = h.powerAtAmbient;
    const k = h.conductance - h.a * P;
    if (k === 0) return rise1 + (P * time) / h.capacity;
    // θ(t) = P/k − (P/k − θ1) e^(−kt/C), also for k < 0 (growth without bound).
    return P / k - (P / k - rise1) * Math.exp((-k * time) / h.capacity);
  }
  const tp = h.steadyRise;
  if (rise1 >= tp) return tp;
  // heatingTime rises monotonically from 0 to ∞ on [θ1, θ+): bisect on it.
  let lo = rise1;
  let hi = tp;
  for (let i = 0; i < 60; i++) {
    const mid = 0.5 * (lo + hi);
    if (heatingTime(h, rise1, mid) < time) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-9 * (1 + tp)) break;
  }
  return 0.5 * (lo + hi);
}

/**
 * The peak rise of the repeating on/off cycle (periodic steady state): the rise θp at the end of
 * each on-time, when the off-time cools it to θs = θp·e^(−t_off·G/C) and the on-time heats θs back
 * to θp: heatingTime(θs, θp) = t_on. heatingTime(kθp, θp) rises from 0 to ∞ with θp, so the
 * root is bracketed and bisected. Returns Infinity when the on-time alone runs away.
 */
export function periodicPeakRise(h: Heating, onTime: number, offTime: number): number {
  const k = Math.exp((-offTime * h.conductance) / h.capacity);
  const g = (peak: number) => heatingTime(h, k * peak, peak) - onTime;
  let hi = Number.isFinite(h.steadyRise) ? h.steadyRise : RUNAWAY_LIMIT;
  if (!Number.isFinite(h.steadyRise)) {
    // A runaway current drive: widen until the cycle's own heating bounds it, up to the runaway limit.
    while (g(hi) < 0 && hi < 1e6) hi *= 2;
    if (g(hi) < 0) return Infinity;
  }
  let lo = 0;
  for (let i = 0; i < 80; i++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) < 0) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-9 * (1 + hi)) break;
  }
  return 0.5 * (lo + hi);
}
