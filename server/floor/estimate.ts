/**
 * Estimated hours of floor work and the late / at-risk flags. Pure functions; the shop's numbers
 * come from getFloorSettings (server/settings/service.ts).
 *
 * Rules (common practice in job shops, no published source):
 * - winding = quantity × turns ÷ spindle speed (rev/min) ÷ 60 + set-up (s) ÷ 3600, hours — the
 *   work order's station when it states a spindle speed, else the shop's default winder;
 * - every other floor stage = (minutes per unit × quantity + minutes per batch) ÷ 60, hours;
 * - what remains = the current stage counted whole, then every floor stage after it up to
 *   packing; on_hold counts from the stage it was held in, rework from winding, engineering from
 *   ready; shipped = 0;
 * - late = due date before today and not shipped;
 * - at risk = not late, not shipped, and remaining hours > working hours left: working days
 *   (Mon–Fri) from today through the due date × shift hours per day.
 */
import { FLOOR_STAGES } from '../../src/contracts/floor';
import type { Stage } from '../../src/contracts/stages';
import type { FloorSettings, StandardTimedStage } from '../settings/service';

export type StationTiming = { spindleRpm: number | null; setupSeconds: number } | null;

/** Winding hours of a batch: quantity × turns ÷ rev/min ÷ 60 + set-up s ÷ 3600. */
export function windingHours(quantity: number, turns: number, spindleRpm: number, setupSeconds: number): number {
  return (quantity * turns) / spindleRpm / 60 + setupSeconds / 3600;
}

/** The floor stages still ahead of a work order, its current one included. */
export function stagesAhead(stage: Stage, heldFrom: Stage | null): Stage[] {
  let start: Stage;
  if (stage === 'shipped') return [];
  if (stage === 'engineering') start = 'ready';
  else if (stage === 'rework') start = 'winding';
  else if (stage === 'on_hold') start = heldFrom && FLOOR_STAGES.includes(heldFrom) ? heldFrom : 'ready';
  else start = stage;
  const i = FLOOR_STAGES.indexOf(start);
  return i < 0 ? [] : FLOOR_STAGES.slice(i);
}

export type Estimate = { windingHours: number; otherHours: number; hours: number };

/**
 * Work orders in the same stage (and, on hold, held from the same stage) at the same station,
 * summed: how many, their units and their units × turns. The estimate is linear in these, so a
 * group's estimate is the sum of its members' (the load view and the board's column hours are
 * computed from such groups, aggregated by the database).
 */
export type EstimateGroup = { count: number; quantity: number; quantityTurns: number; stage: Stage; heldFrom: Stage | null };

export function estimateGroup(g: EstimateGroup, station: StationTiming, s: FloorSettings): Estimate {
  let winding = 0;
  let other = 0;
  for (const stage of stagesAhead(g.stage, g.heldFrom)) {
    if (stage === 'winding') {
      const own = station?.spindleRpm ? station : null;
      const rpm = own?.spindleRpm ?? s.defaultSpindleRpm;
      const setup = own ? own.setupSeconds : s.defaultSetupSeconds;
      // Σ windingHours(q, turns, rpm, setup) over the group.
      winding = g.quantityTurns / rpm / 60 + (g.count * setup) / 3600;
    } else {
      const t = s.stageStandardTimes[stage as StandardTimedStage];
      if (t) other += (t.minutesPerUnit * g.quantity + t.minutesPerBatch * g.count) / 60;
    }
  }
  return { windingHours: winding, otherHours: other, hours: winding + other };
}

export function estimateRemaining(
  wo: { quantity: number; stage: Stage; heldFrom: Stage | null; turns: number },
  station: StationTiming,
  s: FloorSettings,
): Estimate {
  return estimateGroup({ count: 1, quantity: wo.quantity, quantityTurns: wo.quantity * wo.turns, stage: wo.stage, heldFrom: wo.heldFrom }, station, s);
}

/** The shop's calendar date (server local time), YYYY-MM-DD. */
export function localDate(d = new Date()): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}`;
}

const dayMs = 86_400_000;
const utc = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

/** Whole days from a to b (dates), negative when b is before a. */
export const daysBetween = (a: string, b: string) => Math.round((utc(b) - utc(a)) / dayMs);

/** The date `n` days after `iso`. */
export const addDays = (iso: string, n: number) => new Date(utc(iso) + n * dayMs).toISOString().slice(0, 10);

/** Working days (Mon–Fri) from `from` through `to`, both included; 0 when `to` is before `from`. */
export function workingDays(from: string, to: string): number {
  const n = daysBetween(from, to) + 1;
  if (n <= 0) return 0;
  let count = 0;
  const start = new Date(utc(from)).getUTCDay();
  for (let i = 0; i < n; i++) {
    const dow = (start + i) % 7;
    if (dow !== 0 && dow !== 6) count++;
  }
  return count;
}

export function lateness(dueDate: string, stage: Stage, hours: number, today: string, s: FloorSettings) {
  if (stage === 'shipped') return { late: false, atRisk: false };
  const late = dueDate < today;
  const atRisk = !late && hours > workingDays(today, dueDate) * s.shiftHoursPerDay;
  return { late, atRisk };
}
