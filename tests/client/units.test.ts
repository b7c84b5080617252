// @vitest-environment node
/**
 * Unit conversions at the client's edges, checked against outside references:
 *  - mathjs 15 unit conversions (`unit(v, from).toNumber(to)`), an independent implementation;
 *  - NIST SP 811 (2008) appendix B: 1 in = 25.4 mm exactly;
 *  - NIST SP 811 §4.2.1.1 / ISO 80000-5: t/°F = t/°C × 9/5 + 32, and a difference of 1 K = 1 °C = 9/5 °F.
 */
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  formatLength,
  formatTemperature,
  formatTemperatureDifference,
  fromCelsius,
  fromKelvinDifference,
  fromMetres,
  MISSING,
  toCelsius,
  toKelvinDifference,
  toMetres,
  unitsInText,
  unitFormatters,
} from '../../src/lib/units';

const NBSP = '\u00a0';

describe('lengths', () => {
  it('1 in is 25.4 mm exactly (NIST SP 811 appendix B; mathjs agrees)', () => {
    expect(fromMetres(toMetres(1, 'in'), 'mm')).toBeCloseTo(25.4, 12);
    expect(unit(1, 'inch').toNumber('mm')).toBeCloseTo(25.4, 12); // the reference itself
    expect(toMetres(1, 'in')).toBe(0.0254);
  });

  it.each([0.0005106, 0.001, 0.0254, 0.05, 1.234, 12])('%f m matches mathjs in mm and in', (m) => {
    expect(fromMetres(m, 'mm')).toBeCloseTo(unit(m, 'm').toNumber('mm'), 9); // mathjs
    expect(fromMetres(m, 'in')).toBeCloseTo(unit(m, 'm').toNumber('inch'), 9); // mathjs
  });

  it('AWG 24 bare diameter 0.0201 in is 0.51054 mm (ASTM B258 table value; NIST inch)', () => {
    expect(fromMetres(toMetres(0.0201, 'in'), 'mm')).toBeCloseTo(0.51054, 9);
  });

  it('round-trips through metres', () => {
    for (const v of [0, 0.1, 3.3, 250]) {
      expect(fromMetres(toMetres(v, 'mm'), 'mm')).toBeCloseTo(v, 12);
      expect(fromMetres(toMetres(v, 'in'), 'in')).toBeCloseTo(v, 12);
    }
  });

  it('formats with the unit always shown', () => {
    expect(formatLength(0.0254, 'mm')).toBe(`25.40${NBSP}mm`);
    expect(formatLength(0.0254, 'in')).toBe(`1.0000${NBSP}in`);
    expect(formatLength(0.0005106, 'mm', 3)).toBe(`0.511${NBSP}mm`);
    expect(formatLength(1.5, 'mm', 0)).toBe(`1,500${NBSP}mm`);
    expect(formatLength(null, 'mm')).toBe(MISSING);
    expect(formatLength(Number.NaN, 'in')).toBe(MISSING);
  });
});

describe('temperatures', () => {
  it.each([
    [-40, -40], // the two scales cross at −40 (follows from °F = °C × 9/5 + 32, NIST SP 811)
    [0, 32], // ice point (NIST SP 811)
    [20, 68], // reference temperature of IEC 60028 resistances
    [100, 212], // steam point (NIST SP 811)
    [155, 311], // IEC 60085 class 155 limit in °F
  ])('%d °C is %d °F', (c, f) => {
    expect(fromCelsius(c, 'F')).toBeCloseTo(f, 10);
    expect(toCelsius(f, 'F')).toBeCloseTo(c, 10);
    expect(fromCelsius(c, 'F')).toBeCloseTo(unit(c, 'degC').toNumber('degF'), 9); // mathjs
  });

  it('Celsius users see Celsius unchanged', () => {
    expect(fromCelsius(42.5, 'C')).toBe(42.5);
    expect(toCelsius(42.5, 'C')).toBe(42.5);
  });

  it('formats points on the scale', () => {
    expect(formatTemperature(20, 'C')).toBe(`20.0${NBSP}°C`);
    expect(formatTemperature(20, 'F')).toBe(`68.0${NBSP}°F`);
    expect(formatTemperature(-0.01, 'C', 1)).toBe(`0.0${NBSP}°C`); // no "-0.0"
    expect(formatTemperature(undefined, 'F')).toBe(MISSING);
  });
});

describe('temperature differences', () => {
  it('a 1 K difference is 9/5 °F, not 33.8 °F (NIST SP 811 §4.2.1.1)', () => {
    expect(fromKelvinDifference(1, 'F')).toBeCloseTo(1.8, 12);
    expect(fromKelvinDifference(1, 'F')).not.toBeCloseTo(fromCelsius(1, 'F'), 3);
  });

  it.each([1, 40, 65, 125])('%d K matches mathjs kelvin → rankine (same step size as °F)', (k) => {
    // Kelvin and Rankine both start at absolute zero, so their ratio is the size of one step.
    expect(fromKelvinDifference(k, 'F')).toBeCloseTo(unit(k, 'K').toNumber('degR'), 9); // mathjs
    expect(toKelvinDifference(fromKelvinDifference(k, 'F'), 'F')).toBeCloseTo(k, 12);
  });

  it('Celsius users see kelvin', () => {
    expect(fromKelvinDifference(40, 'C')).toBe(40);
    expect(formatTemperatureDifference(40, 'C', 0)).toBe(`40${NBSP}K`);
    expect(formatTemperatureDifference(40, 'F', 0)).toBe(`72${NBSP}°F`);
  });
});

describe('formatters bound to preferences', () => {
  it('follow the user’s choice', () => {
    const imperial = unitFormatters({ lengthUnit: 'in', temperatureUnit: 'F' });
    expect(imperial.length(0.0127)).toBe(`0.5000${NBSP}in`);
    expect(imperial.temperature(100, 0)).toBe(`212${NBSP}°F`);
    expect(imperial.temperatureDifference(10, 0)).toBe(`18${NBSP}°F`);
    const metric = unitFormatters({ lengthUnit: 'mm', temperatureUnit: 'C' });
    expect(metric.length(0.0127)).toBe(`12.70${NBSP}mm`);
    expect(metric.temperatureDifferenceSymbol).toBe('K');
  });
});

describe('areas', () => {
  it('1 in² is 645.16 mm² exactly (25.4² from NIST SP 811 appendix B; mathjs agrees)', async () => {
    const { fromSquareMetres, toSquareMetres, formatArea } = await import('../../src/lib/units');
    expect(unit(1, 'inch^2').toNumber('mm^2')).toBeCloseTo(645.16, 9); // the reference itself
    expect(fromSquareMetres(toSquareMetres(1, 'in'), 'mm')).toBeCloseTo(645.16, 9);
    expect(toSquareMetres(95, 'mm')).toBeCloseTo(9.5e-5, 15);
    expect(fromSquareMetres(9.5e-5, 'mm')).toBeCloseTo(95, 9);
    expect(formatArea(9.5e-5, 'mm')).toBe(`95.00${NBSP}mm²`);
    expect(formatArea(toSquareMetres(0.5, 'in'), 'in')).toBe(`0.50000${NBSP}in²`);
    expect(formatArea(null, 'mm')).toBe(MISSING);
  });
});

describe('unitsInText: a server sentence in the user’s units', () => {
  // °F = °C × 9/5 + 32; a difference of 1 K = 9/5 °F; 1 in = 25.4 mm exactly (NIST SP 811 §4.2.1.1, appendix B).
  const sentence = 'The winding reaches 182.4 °C, plus 10.0 K hot-spot allowance, above the 155 °C limit; a 0.361 mm wire.';
  it('leaves it alone for metric, Celsius users', () => {
    expect(unitsInText(sentence, { lengthUnit: 'mm', temperatureUnit: 'C' })).toBe(sentence);
  });
  it('restates temperatures, differences and lengths for inch, Fahrenheit users', () => {
    const out = unitsInText(sentence, { lengthUnit: 'in', temperatureUnit: 'F' });
    expect(out).toContain('360.3\u00a0°F'); // 182.4 × 9/5 + 32 = 360.32
    expect(out).toContain('18.0\u00a0°F hot-spot'); // 10.0 K × 9/5
    expect(out).toContain('311\u00a0°F limit'); // 155 × 9/5 + 32
    expect(out).toContain('0.0142\u00a0in wire'); // 0.361 / 25.4 = 0.014213
    expect(out).not.toMatch(/°C|\bK\b|mm/);
  });
  it('does not touch a unit that merely contains K, such as W/(m²·K)', () => {
    expect(unitsInText('h = 10 W/(m²·K)', { lengthUnit: 'in', temperatureUnit: 'F' })).toBe('h = 10 W/(m²·K)');
  });
});
