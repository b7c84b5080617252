/**
 * An independent numerical integrator for the engine's thermal checks: classical fourth-order
 * Runge–Kutta of C dT/dt = P(T) − G (T − Tₐ), with P(T) from the drive and a copper or aluminium
 * resistance R(T) = R20 (1 + α (T − 20)) written out here, not taken from the engine.
 */
export type Drive = { kind: 'voltage'; volts: number } | { kind: 'current'; amps: number };

export interface ThermalModel {
  /** J/K */
  capacity: number;
  /** W/K */
  conductance: number;
  /** Ω at 20 °C */
  resistance20: number;
  /** 1/K */
  alpha: number;
  /** °C */
  ambient: number;
}

export function power(m: ThermalModel, drive: Drive, T: number): number {
  const R = m.resistance20 * (1 + m.alpha * (T - 20));
  return drive.kind === 'voltage' ? (drive.volts * drive.volts) / R : drive.amps * drive.amps * R;
}

/** One RK4 step of length dt, energised (`on`) or not. */
export function rk4Step(m: ThermalModel, drive: Drive, on: boolean, T: number, dt: number): number {
  const f = (t: number) => ((on ? power(m, drive, t) : 0) - m.conductance * (t - m.ambient)) / m.capacity;
  const k1 = f(T);
  const k2 = f(T + (dt / 2) * k1);
  const k3 = f(T + (dt / 2) * k2);
  const k4 = f(T + dt * k3);
  return T + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
}

/** Temperature after `time` s energised from T0, in `steps` RK4 steps. */
export function heat(m: ThermalModel, drive: Drive, T0: number, time: number, steps: number): number {
  let T = T0;
  const dt = time / steps;
  for (let i = 0; i < steps; i++) T = rk4Step(m, drive, true, T, dt);
  return T;
}

/**
 * Peak temperature of the repeating on/off cycle: cycles from ambient until the peak changes by
 * less than `tol` K between cycles. Steps of `dt` s (the on and off times are whole multiples).
 */
export function periodicPeak(m: ThermalModel, drive: Drive, onTime: number, offTime: number, dt: number, tol = 1e-7): number {
  let T = m.ambient;
  let last = -Infinity;
  const onSteps = Math.round(onTime / dt);
  const offSteps = Math.round(offTime / dt);
  for (let cycle = 0; cycle < 100000; cycle++) {
    for (let i = 0; i < onSteps; i++) T = rk4Step(m, drive, true, T, onTime / onSteps);
    const peak = T;
    for (let i = 0; i < offSteps; i++) T = rk4Step(m, drive, false, T, offTime / offSteps);
    if (Math.abs(peak - last) < tol) return peak;
    last = peak;
  }
  throw new Error('no periodic state');
}

/** Time energised from T0 until T reaches `limit` (linear interpolation within the last step); null if not within maxTime. */
export function timeToReach(m: ThermalModel, drive: Drive, T0: number, limit: number, dt: number, maxTime: number): number | null {
  let T = T0;
  for (let t = 0; t < maxTime; t += dt) {
    const next = rk4Step(m, drive, true, T, dt);
    if (next >= limit) return t + (dt * (limit - T)) / (next - T);
    T = next;
  }
  return null;
}
