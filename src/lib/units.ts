/**
 * SI inside, units at the edges. The server, the coil engine and the database speak metres,
 * degrees Celsius and kelvin differences; these helpers convert to and from the user's choice
 * (mm or in; °C or °F) and format with the unit always shown.
 *
 * Definitions: 1 in = 25.4 mm exactly (international inch, NIST SP 811 appendix B);
 * °F = °C × 9/5 + 32 and a temperature difference of 1 K = 1 °C = 9/5 °F (NIST SP 811 §4.2.1.1).
 */
import type { UnitPreferences } from '../contracts/auth';

export type LengthUnit = UnitPreferences['lengthUnit'];
export type TemperatureUnit = UnitPreferences['temperatureUnit'];

export const MM_PER_INCH = 25.4;
export const METRES_PER_INCH = MM_PER_INCH / 1000;
/** Between a number and its unit: a no-break space, so "12.7 mm" never wraps apart. */
export const UNIT_SPACE = '\u00a0';

// ── lengths ─────────────────────────────────────────────────────────────────

/** Metres → the user's length unit. */
export function fromMetres(metres: number, unit: LengthUnit): number {
  return unit === 'mm' ? metres * 1000 : metres / METRES_PER_INCH;
}

/** A value in the user's length unit → metres. */
export function toMetres(value: number, unit: LengthUnit): number {
  return unit === 'mm' ? value / 1000 : value * METRES_PER_INCH;
}

export const lengthSymbol = (unit: LengthUnit) => (unit === 'mm' ? 'mm' : 'in');

// ── areas (a length unit squared) ───────────────────────────────────────────

/** Square metres → mm² or in². */
export function fromSquareMetres(m2: number, unit: LengthUnit): number {
  const perUnit = toMetres(1, unit);
  return m2 / (perUnit * perUnit);
}

/** mm² or in² → square metres. */
export function toSquareMetres(value: number, unit: LengthUnit): number {
  const perUnit = toMetres(1, unit);
  return value * perUnit * perUnit;
}

export const areaSymbol = (unit: LengthUnit) => `${lengthSymbol(unit)}²`;

// ── temperatures (points on the scale) ──────────────────────────────────────

/** °C → the user's temperature unit. */
export function fromCelsius(celsius: number, unit: TemperatureUnit): number {
  return unit === 'C' ? celsius : (celsius * 9) / 5 + 32;
}

/** A temperature in the user's unit → °C. */
export function toCelsius(value: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value : ((value - 32) * 5) / 9;
}

export const temperatureSymbol = (unit: TemperatureUnit) => (unit === 'C' ? '°C' : '°F');

// ── temperature differences (rises, tolerances) ─────────────────────────────

/** A difference in kelvin → the user's unit (K for Celsius users, °F for Fahrenheit users). */
export function fromKelvinDifference(kelvin: number, unit: TemperatureUnit): number {
  return unit === 'C' ? kelvin : (kelvin * 9) / 5;
}

/** A difference in the user's unit → kelvin. */
export function toKelvinDifference(value: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value : (value * 5) / 9;
}

export const temperatureDifferenceSymbol = (unit: TemperatureUnit) => (unit === 'C' ? 'K' : '°F');

// ── masses (a shipment's packages) ──────────────────────────────────────────
// There is no separate mass preference: metric (mm) users weigh in kilograms, inch users in pounds.
// 1 lb = 0.453 592 37 kg exactly (international avoirdupois pound, NIST SP 811 appendix B).

export type MassUnit = 'kg' | 'lb';
export const KG_PER_POUND = 0.45359237;

export const massUnitFor = (length: LengthUnit): MassUnit => (length === 'mm' ? 'kg' : 'lb');

/** Kilograms → kg or lb. */
export function fromKilograms(kg: number, unit: MassUnit): number {
  return unit === 'kg' ? kg : kg / KG_PER_POUND;
}

/** kg or lb → kilograms. */
export function toKilograms(value: number, unit: MassUnit): number {
  return unit === 'kg' ? value : value * KG_PER_POUND;
}

// ── formatting ──────────────────────────────────────────────────────────────

export const MISSING = '—';

const formatters = new Map<number, Intl.NumberFormat>();
/** A number with a fixed count of decimals, grouped thousands, and no "-0". */
export function formatNumber(value: number, digits: number): string {
  let f = formatters.get(digits);
  if (!f) {
    f = new Intl.NumberFormat('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits, signDisplay: 'negative' });
    formatters.set(digits, f);
  }
  return f.format(value);
}

const isNumber = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** Decimals that suit each unit unless the caller says otherwise (0.01 mm ≈ 0.0004 in). */
export const DEFAULT_LENGTH_DIGITS: Record<LengthUnit, number> = { mm: 2, in: 4 };

export function formatLength(metres: number | null | undefined, unit: LengthUnit, digits = DEFAULT_LENGTH_DIGITS[unit]): string {
  if (!isNumber(metres)) return MISSING;
  return `${formatNumber(fromMetres(metres, unit), digits)}${UNIT_SPACE}${lengthSymbol(unit)}`;
}

/** Decimals for areas: 0.01 mm², 0.00001 in² (≈ 0.0065 mm²). */
export const DEFAULT_AREA_DIGITS: Record<LengthUnit, number> = { mm: 2, in: 5 };

export function formatArea(m2: number | null | undefined, unit: LengthUnit, digits = DEFAULT_AREA_DIGITS[unit]): string {
  if (!isNumber(m2)) return MISSING;
  return `${formatNumber(fromSquareMetres(m2, unit), digits)}${UNIT_SPACE}${areaSymbol(unit)}`;
}

export function formatTemperature(celsius: number | null | undefined, unit: TemperatureUnit, digits = 1): string {
  if (!isNumber(celsius)) return MISSING;
  return `${formatNumber(fromCelsius(celsius, unit), digits)}${UNIT_SPACE}${temperatureSymbol(unit)}`;
}

export function formatTemperatureDifference(kelvin: number | null | undefined, unit: TemperatureUnit, digits = 1): string {
  if (!isNumber(kelvin)) return MISSING;
  return `${formatNumber(fromKelvinDifference(kelvin, unit), digits)}${UNIT_SPACE}${temperatureDifferenceSymbol(unit)}`;
}

export function formatMass(kg: number | null | undefined, unit: MassUnit, digits = 2): string {
  if (!isNumber(kg)) return MISSING;
  return `${formatNumber(fromKilograms(kg, unit), digits)}${UNIT_SPACE}${unit}`;
}

/**
 * A server sentence (the coil engine's warnings are written in SI: "reaches 182.4 °C, plus 10.0 K
 * hot-spot allowance", "a 0.361 mm wire") restated in the user's units: each "<number> °C" is a
 * temperature, "<number> K" a temperature difference, "<number> mm" a length. Metric / Celsius
 * users get the sentence unchanged.
 */
export function unitsInText(text: string, prefs: UnitPreferences): string {
  const num = String.raw`(-?\d+(?:\.\d+)?)`;
  let out = text;
  if (prefs.temperatureUnit !== 'C') {
    out = out.replace(new RegExp(`${num}\\s?°C`, 'g'), (_, v: string) => formatTemperature(Number(v), prefs.temperatureUnit, decimalsOf(v)));
    out = out.replace(new RegExp(`${num}\\s?K\\b`, 'g'), (_, v: string) => formatTemperatureDifference(Number(v), prefs.temperatureUnit, decimalsOf(v)));
  }
  if (prefs.lengthUnit !== 'mm') {
    out = out.replace(new RegExp(`${num}\\s?mm\\b`, 'g'), (_, v: string) => formatLength(Number(v) / 1000, prefs.lengthUnit));
  }
  return out;
}
const decimalsOf = (v: string) => (v.includes('.') ? v.split('.')[1]!.length : 0);

/** Formatters bound to one user's preferences. */
export function unitFormatters(prefs: UnitPreferences) {
  return {
    prefs,
    /** A server sentence with its SI quantities in the user's units (unitsInText). */
    text: (sentence: string) => unitsInText(sentence, prefs),
    length: (metres: number | null | undefined, digits?: number) => formatLength(metres, prefs.lengthUnit, digits),
    temperature: (celsius: number | null | undefined, digits?: number) => formatTemperature(celsius, prefs.temperatureUnit, digits),
    temperatureDifference: (kelvin: number | null | undefined, digits?: number) =>
      formatTemperatureDifference(kelvin, prefs.temperatureUnit, digits),
    area: (m2: number | null | undefined, digits?: number) => formatArea(m2, prefs.lengthUnit, digits),
    mass: (kg: number | null | undefined, digits?: number) => formatMass(kg, massUnitFor(prefs.lengthUnit), digits),
    massSymbol: massUnitFor(prefs.lengthUnit),
    lengthSymbol: lengthSymbol(prefs.lengthUnit),
    areaSymbol: areaSymbol(prefs.lengthUnit),
    temperatureSymbol: temperatureSymbol(prefs.temperatureUnit),
    temperatureDifferenceSymbol: temperatureDifferenceSymbol(prefs.temperatureUnit),
  };
}
export type UnitFormatters = ReturnType<typeof unitFormatters>;
