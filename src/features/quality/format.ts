/**
 * Test readings for people: SI values from the server shown with a unit and a sensible prefix
 * (Ω / kΩ, MΩ / GΩ, mA, mH). Temperatures go through src/lib/units.ts (the user's °C/°F).
 */
import type { ReadingName } from '../../contracts/test-records';
import { formatNumber, UNIT_SPACE } from '../../lib/units';

/** A number to `digits` significant figures, grouped, without exponent noise. */
export function sig(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(Math.abs(x))));
  return formatNumber(x, Math.min(decimals, 6));
}

const withUnit = (v: string, unit: string) => `${v}${UNIT_SPACE}${unit}`;

export const ohms = (x: number) => (Math.abs(x) >= 1e4 ? withUnit(sig(x / 1e3), 'kΩ') : withUnit(sig(x), 'Ω'));
export const megohms = (x: number) => (x >= 1e9 ? withUnit(sig(x / 1e9, 3), 'GΩ') : withUnit(sig(x / 1e6, 3), 'MΩ'));
export const milliamps = (a: number) => withUnit(sig(a * 1000, 3), 'mA');
export const volts = (v: number) => withUnit(sig(v, 4), 'V');
export const seconds = (s: number) => withUnit(sig(s, 3), 's');
export const henries = (h: number) => (h < 1 ? withUnit(sig(h * 1000, 3), 'mH') : withUnit(sig(h, 3), 'H'));
export const newtons = (n: number) => withUnit(sig(n, 3), 'N');
export const heatTransfer = (h: number) => withUnit(sig(h, 3), 'W/(m²·K)');
export const signedPercent = (p: number, digits = 2) => `${p >= 0 ? '+' : '−'}${formatNumber(Math.abs(p), digits)}${UNIT_SPACE}%`;
export const signedOhms = (x: number) => `${x >= 0 ? '+' : '−'}${ohms(Math.abs(x))}`;
export const yieldPercent = (y: number | null) => (y === null ? '—' : withUnit(formatNumber(y * 100, 1), '%'));

export const READING_LABELS: Record<ReadingName, string> = {
  resistance: 'DC resistance (R20)',
  hipot: 'Hi-pot',
  insulation_resistance: 'Insulation resistance',
  inductance: 'Inductance',
  turns: 'Turns',
  pull: 'Pull on fixture',
  heat_run: 'Heat run (winding temperature)',
};
