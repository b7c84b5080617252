import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CoilSolveRequestSchema,
  CoilSpecSchema,
  METRIC_NOMINAL_DIAMETERS_MM,
  THERMAL_CLASS_VALUES,
} from '../../src/contracts/coil';
import type { CoilSpec as ContractSpec, CoilTarget as ContractTarget } from '../../src/contracts/coil';
import {
  CoilSpecError,
  METRIC_DIAMETERS,
  THERMAL_CLASSES,
  designCoil,
  solveCoil,
  validateSpec,
} from '../../server/coil/index';
import type { CoilSpec as EngineSpec, CoilTarget as EngineTarget } from '../../server/coil/index';
import { baseSpec, magnetSpec } from './fixtures';

// Compile-time: the zod-inferred types and the engine types are assignable both ways
// (checked by `tsc --noEmit`).
const toEngine = (s: ContractSpec): EngineSpec => s;
const toContract = (s: EngineSpec): ContractSpec => s;
const targetToEngine = (t: ContractTarget): EngineTarget => t;
const targetToContract = (t: EngineTarget): ContractTarget => t;
void [toEngine, toContract, targetToEngine, targetToContract];

function engineField(spec: unknown): string | null {
  try {
    validateSpec(spec as EngineSpec);
    return null;
  } catch (e) {
    if (e instanceof CoilSpecError) return e.field;
    throw e;
  }
}

function zodPaths(spec: unknown): string[] | null {
  const r = CoilSpecSchema.safeParse(spec);
  return r.success ? null : r.error.issues.map((i) => i.path.join('.'));
}

describe('contract and engine agree', () => {
  it('share the same metric series and thermal classes', () => {
    expect(METRIC_NOMINAL_DIAMETERS_MM.map((mm) => mm * 1e-3).sort((a, b) => a - b)).toEqual(
      [...METRIC_DIAMETERS].sort((a, b) => a - b).map((x) => expect.closeTo(x, 15)),
    );
    expect([...THERMAL_CLASS_VALUES]).toEqual([...THERMAL_CLASSES]);
  });

  it('accept the demo specs', () => {
    const curve: [number, number][] = [[100, 0.2], [300, 0.9], [1000, 1.35]];
    for (const s of [
      baseSpec(),
      magnetSpec(),
      baseSpec({ pattern: 'random', fillFactor: 0.5, turns: 100 }),
      baseSpec({ pattern: 'random', packingFactor: 0.85, ambientMax: 50, supplyTolerance: { low: 0.9, high: 1.05 }, cycleTime: 60 }),
      baseSpec({ suppression: { kind: 'diode-zener', clampVoltage: 33 } }),
      magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, bhCurve: curve }, suppression: { kind: 'none' } }),
    ]) {
      expect(zodPaths(s)).toBeNull();
      expect(engineField(s)).toBeNull();
    }
  });

  const bad: [string, unknown][] = [
    ['negative inner diameter', baseSpec({ bobbin: { innerDiameter: -1e-3, outerDiameter: 0.02, length: 0.02 } })],
    ['negative outer diameter', baseSpec({ bobbin: { innerDiameter: 0, outerDiameter: -0.02, length: 0.02 } })],
    ['zero length', baseSpec({ bobbin: { innerDiameter: 0.01, outerDiameter: 0.02, length: 0 } })],
    ['inner ≥ outer', baseSpec({ bobbin: { innerDiameter: 0.03, outerDiameter: 0.02, length: 0.02 } })],
    ['duty 0', baseSpec({ dutyCycle: 0 })],
    ['duty 1.01', baseSpec({ dutyCycle: 1.01 })],
    ['AWG 3', baseSpec({ wire: { standard: 'AWG', gauge: 3 }, overallDiameter: undefined })],
    ['AWG 45', baseSpec({ wire: { standard: 'AWG', gauge: 45 }, overallDiameter: undefined })],
    ['AWG 22.5', baseSpec({ wire: { standard: 'AWG', gauge: 22.5 }, overallDiameter: undefined })],
    ['metric 0.31 mm', baseSpec({ wire: { standard: 'metric', diameter: 0.31e-3 }, overallDiameter: undefined })],
    ['packing beyond close packing', baseSpec({ pattern: 'random', packingFactor: 1.2 })],
    ['packing on a layer coil', baseSpec({ packingFactor: 0.9 })],
    ['highest ambient below the rated one', baseSpec({ ambientMax: 10 })],
    ['supply low end above 1', baseSpec({ supplyTolerance: { low: 1.1, high: 1.2 } })],
    ['supply high end above 2', baseSpec({ supplyTolerance: { low: 0.85, high: 2.5 } })],
    ['negative cycle time', baseSpec({ cycleTime: -5 })],
    ['TVS without clamp voltage', baseSpec({ suppression: { kind: 'tvs' } })],
    ['unknown suppression', baseSpec({ suppression: { kind: 'varistor' as never } })],
    ['B–H curve whose B falls', magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, bhCurve: [[100, 0.5], [200, 0.4]] } })],
    ['B–H curve of one point', magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, bhCurve: [[100, 0.5]] } })],
    ['grade 4', baseSpec({ insulationGrade: 4 as never })],
    ['class 150', baseSpec({ insulationClass: 150 as never })],
    ['ambient 400', baseSpec({ ambient: 400 })],
    ['current 0', baseSpec({ drive: { kind: 'current', amps: 0 } })],
    ['fill factor on a layer coil', baseSpec({ fillFactor: 0.5 })],
    ['fill factor beyond close packing', baseSpec({ pattern: 'random', fillFactor: 0.95 })],
    ['zero turns', baseSpec({ turns: 0 })],
    ['negative leads', baseSpec({ leadLength: -1 })],
    ['zero h', baseSpec({ heatTransferCoefficient: 0 })],
    ['negative hot spot', baseSpec({ hotSpotAllowance: -5 })],
    ['overall below bare', baseSpec({ overallDiameter: 0.44e-3 })],
    ['μr below 1', magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, relativePermeability: 0.5 } })],
    ['no flux path', magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, ironPathLength: 0, airGap: 0 } })],
    ['fractional gap count', magnetSpec({ magneticCircuit: { ...magnetSpec().magneticCircuit!, gapCount: 1.5 } })],
    ['infinite volts', baseSpec({ drive: { kind: 'voltage', volts: Infinity } })],
    ['NaN ambient', baseSpec({ ambient: NaN })],
  ];
  it.each(bad)('both refuse %s and name the same field', (_label, spec) => {
    const field = engineField(spec);
    const paths = zodPaths(spec);
    expect(field).not.toBeNull();
    expect(paths).not.toBeNull();
    expect(paths).toContain(field);
    expect(() => designCoil(spec as EngineSpec)).toThrow(CoilSpecError);
  });

  it('agree on random specs, valid or not', () => {
    const num = fc.oneof(fc.double({ min: -0.05, max: 0.1 }), fc.constant(0));
    fc.assert(
      fc.property(
        num,
        num,
        num,
        fc.double({ min: -0.5, max: 1.5 }),
        fc.integer({ min: 0, max: 48 }),
        fc.constantFrom(105, 120, 130, 150, 155, 180, 200, 220),
        (inner, outer, length, duty, gauge, cls) => {
          const spec = {
            ...baseSpec({ overallDiameter: undefined }),
            wire: { standard: 'AWG', gauge },
            bobbin: { innerDiameter: inner, outerDiameter: outer, length },
            dutyCycle: duty,
            insulationClass: cls,
          };
          const field = engineField(spec);
          const paths = zodPaths(spec);
          expect(field === null).toBe(paths === null);
          if (field !== null) expect(paths).toContain(field);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('agree on solve requests that need a magnetic circuit', () => {
    const r = CoilSolveRequestSchema.safeParse({ spec: baseSpec(), target: { pullForce: 10 } });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.'))).toContain('target.pullForce');
    try {
      solveCoil(baseSpec(), { pullForce: 10 });
      expect.unreachable();
    } catch (e) {
      expect((e as CoilSpecError).field).toBe('target.pullForce');
    }
    expect(CoilSolveRequestSchema.safeParse({ spec: magnetSpec(), target: { pullForce: 10 } }).success).toBe(true);
    expect(CoilSolveRequestSchema.safeParse({ spec: magnetSpec(), target: {} }).success).toBe(false);
  });
});
