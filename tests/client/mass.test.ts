// @vitest-environment node
/**
 * Package masses at the client's edge (the shipment form and page), checked against outside
 * references: NIST SP 811 (2008) appendix B, 1 lb (avoirdupois) = 0.453 592 37 kg exactly; and
 * mathjs 15 unit conversions (`unit(v, from).toNumber(to)`), an independent implementation.
 */
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { formatMass, fromKilograms, massUnitFor, MISSING, toKilograms, unitFormatters } from '../../src/lib/units';

describe('masses', () => {
  it('1 lb is 0.45359237 kg exactly (NIST SP 811 appendix B; mathjs agrees)', () => {
    expect(toKilograms(1, 'lb')).toBe(0.45359237);
    expect(unit(1, 'lbm').toNumber('kg')).toBeCloseTo(0.45359237, 12); // the reference itself
  });

  it.each([0.1, 1, 2.5, 18.75, 640])('%f kg matches mathjs in lb, and comes back', (kg) => {
    expect(fromKilograms(kg, 'lb')).toBeCloseTo(unit(kg, 'kg').toNumber('lbm'), 9); // mathjs
    expect(toKilograms(fromKilograms(kg, 'lb'), 'lb')).toBeCloseTo(kg, 12);
    expect(fromKilograms(kg, 'kg')).toBe(kg);
  });

  it('metric users weigh in kg, inch users in lb; the unit is always shown', () => {
    expect(massUnitFor('mm')).toBe('kg');
    expect(massUnitFor('in')).toBe('lb');
    // 10 kg = 22.046 lb (10 / 0.45359237 = 22.0462…, NIST SP 811 factor)
    expect(formatMass(10, 'lb')).toBe('22.05\u00a0lb');
    expect(unitFormatters({ lengthUnit: 'mm', temperatureUnit: 'C' }).mass(3.2)).toBe('3.20\u00a0kg');
    expect(formatMass(null, 'kg')).toBe(MISSING);
  });
});
