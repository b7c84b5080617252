/** Number formatting for the build sheet's quantities that are neither lengths nor temperatures. */
import { formatNumber, fromMetres, toSquareMetres, type UnitFormatters } from '../../lib/units';

const NB = '\u00a0';

/** About `sig` significant digits, grouped, never in exponent form. */
export function sig(x: number, sigDigits = 3): string {
  if (!Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const digits = Math.max(0, Math.min(6, sigDigits - 1 - Math.floor(Math.log10(Math.abs(x)))));
  return formatNumber(x, digits);
}

export const ohms = (x: number) => `${sig(x, 4)}${NB}Ω`;
export const amps = (x: number) => `${sig(x, 3)}${NB}A`;
export const watts = (x: number) => `${sig(x, 3)}${NB}W`;
export const ampereTurns = (x: number) => `${formatNumber(Math.round(x), 0)}${NB}A·turns`;
export const millitesla = (t: number) => `${sig(t * 1000, 3)}${NB}mT`;
export const tesla = (t: number) => `${sig(t, 3)}${NB}T`;
export const newtons = (x: number) => `${sig(x, 3)}${NB}N`;
export const kilograms = (x: number) => `${formatNumber(x, 3)}${NB}kg`;
export const henries = (x: number) => (x < 1 ? `${sig(x * 1000, 3)}${NB}mH` : `${sig(x, 3)}${NB}H`);
export const seconds = (x: number) => (x < 1 ? `${sig(x * 1000, 3)}${NB}ms` : x < 600 ? `${sig(x, 3)}${NB}s` : `${sig(x / 60, 3)}${NB}min`);
export const percent = (x: number, digits = 1) => `${formatNumber(x * 100, digits)}${NB}%`;
export const volts = (x: number) => `${sig(x, 3)}${NB}V`;

/** Current density, A/m² → A/mm² or A/in² (the user's length unit squared). */
export const currentDensity = (aPerM2: number, u: UnitFormatters) => `${sig(aPerM2 * toSquareMetres(1, u.prefs.lengthUnit), 3)}${NB}A/${u.areaSymbol}`;

/**
 * A length of wire on the spool scale: metres for millimetre users, feet for inch users
 * (1 m = 1000 mm; 1 ft = 12 in, both exact), from the user's length unit.
 */
export function wireLength(metres: number, u: UnitFormatters): string {
  const inUnit = fromMetres(metres, u.prefs.lengthUnit);
  return u.prefs.lengthUnit === 'mm' ? `${formatNumber(inUnit / 1000, 1)}${NB}m` : `${formatNumber(inUnit / 12, 0)}${NB}ft`;
}
export const joules = (x: number) => (x < 1 ? `${sig(x * 1000, 3)}${NB}mJ` : `${sig(x, 3)}${NB}J`);
/** A field strength in the iron, A/m (kA/m from 10 000). */
export const ampsPerMetre = (x: number) => (x >= 1e4 ? `${sig(x / 1000, 3)}${NB}kA/m` : `${sig(x, 3)}${NB}A/m`);
/** A time to the minute or second it matters at. */
export const duration = (x: number) => (x < 60 ? `${sig(x, 3)}${NB}s` : x < 3600 ? `${sig(x / 60, 3)}${NB}min` : `${sig(x / 3600, 3)}${NB}h`);
