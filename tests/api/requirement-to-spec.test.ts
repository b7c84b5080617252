import { describe, expect, it } from 'vitest';
import { CoilSolveRequestSchema, CoilSpecSchema } from '../../src/contracts/coil';
import { RequirementSchema, type RequirementInput } from '../../src/contracts/orders';
import { formatWorkOrderNumber, requirementToSpec, splitQuantity } from '../../server/build-sheets/service';
import { solveCoil } from '../../server/coil';

const base: RequirementInput = {
  drive: { kind: 'current', amps: 1.5 },
  dutyCycle: 0.3,
  ambient: 25,
  insulationClass: 155,
  bobbin: { innerDiameter: 0.012, outerDiameter: 0.03, length: 0.04 },
  target: { kind: 'ampereTurns', ampereTurns: 500 },
};
const req = (over: Partial<RequirementInput> = {}) => RequirementSchema.parse({ ...base, ...over });

describe('requirementToSpec (pure)', () => {
  it('carries drive, duty, ambient, class and bobbin over and fills the rest with stated defaults', () => {
    const { spec, target, notes } = requirementToSpec(req());
    expect(spec).toMatchObject({ drive: base.drive, dutyCycle: 0.3, ambient: 25, insulationClass: 155, bobbin: base.bobbin });
    expect(spec).toMatchObject({ conductor: 'copper', insulationGrade: 2, pattern: 'layer', wire: { standard: 'AWG', gauge: 28 } });
    expect(target).toEqual({ ampereTurns: 500 });
    expect(notes.join(' ')).toMatch(/placeholder/);
    // A valid spec and solve request for /api/coil/calculate and /api/coil/solve.
    expect(CoilSpecSchema.safeParse(spec).success).toBe(true);
    expect(CoilSolveRequestSchema.safeParse({ spec, target }).success).toBe(true);
    expect(() => solveCoil(spec, target!)).not.toThrow();
  });

  it("uses the customer's conductor preference and the engineer's choices over it", () => {
    const r = req({ conductor: { material: 'aluminium', wire: { standard: 'metric', diameter: 0.0005 }, insulationGrade: 1 } });
    expect(requirementToSpec(r).spec).toMatchObject({ conductor: 'aluminium', wire: { standard: 'metric', diameter: 0.0005 }, insulationGrade: 1 });
    expect(requirementToSpec(r, { wire: { standard: 'AWG', gauge: 30 }, pattern: 'random' }).spec).toMatchObject({
      conductor: 'aluminium',
      wire: { standard: 'AWG', gauge: 30 },
      pattern: 'random',
    });
  });

  it('maps pull and gap-field targets to the solver with the magnetic circuit', () => {
    const magneticCircuit = { relativePermeability: 2000, saturationFluxDensity: 1.5, ironPathLength: 0.06, airGap: 0.002, gapCount: 1, area: 9.5e-5 };
    const pull = requirementToSpec(req({ magneticCircuit, target: { kind: 'pull', force: 12 } }));
    expect(pull.target).toEqual({ pullForce: 12 });
    expect(pull.spec.magneticCircuit).toEqual(magneticCircuit);
    expect(requirementToSpec(req({ magneticCircuit, target: { kind: 'field', fluxDensity: 0.6, at: 'gap' } })).target).toEqual({ gapFluxDensity: 0.6 });
  });

  it('converts a field at the centre to ampere-turns with the long-solenoid approximation, and says so', () => {
    const { target, notes } = requirementToSpec(req({ target: { kind: 'field', fluxDensity: 0.015, at: 'centre' } }));
    // N·I = B·ℓ/μ₀ = 0.015 T × 0.040 m / 1.25663706212e-6 H/m = 477.46 A (μ₀ from CODATA 2018).
    expect(target!.ampereTurns).toBeCloseTo(477.46, 1);
    expect(notes.join(' ')).toMatch(/long-solenoid approximation/);
  });

  it('notes an envelope and a resistance the customer expects', () => {
    const { notes } = requirementToSpec(req({ fit: 'envelope', resistance: 48 }));
    expect(notes.join(' ')).toMatch(/envelope/);
    expect(notes.join(' ')).toMatch(/48 Ω at 20 °C/);
  });
});

describe('release arithmetic', () => {
  it('splits a quantity into batches of at most the shop setting', () => {
    expect(splitQuantity(60, 25)).toEqual([25, 25, 10]);
    expect(splitQuantity(25, 25)).toEqual([25]);
    expect(splitQuantity(1, 25)).toEqual([1]);
    expect(splitQuantity(101, 25)).toHaveLength(Math.ceil(101 / 25));
  });

  it('numbers work orders WO-<yy>-<five-digit sequence>', () => {
    expect(formatWorkOrderNumber(new Date(2026, 2, 1), 42)).toBe('WO-26-00042');
    expect(formatWorkOrderNumber(new Date(2031, 0, 1), 123456)).toBe('WO-31-123456');
  });
});
