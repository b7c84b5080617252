/** Shared coil specs for the engine tests (invented demo values, not test expectations). */
import type { CoilSpec } from '../../server/coil/index';

/** A layer-wound copper coil on a 10/20 mm bobbin, 20 mm traverse, metric 0.45 mm wire with a 0.5 mm spool OD. */
export function baseSpec(over: Partial<CoilSpec> = {}): CoilSpec {
  return {
    conductor: 'copper',
    wire: { standard: 'metric', diameter: 0.45e-3 },
    insulationGrade: 2,
    overallDiameter: 0.5e-3,
    bobbin: { innerDiameter: 0.01, outerDiameter: 0.02, length: 0.02 },
    pattern: 'layer',
    drive: { kind: 'voltage', volts: 3 },
    dutyCycle: 1,
    ambient: 25,
    insulationClass: 155,
    ...over,
  };
}

/** An AWG coil with an iron circuit (one air gap). */
export function magnetSpec(over: Partial<CoilSpec> = {}): CoilSpec {
  return {
    conductor: 'copper',
    wire: { standard: 'AWG', gauge: 28 },
    insulationGrade: 2,
    bobbin: { innerDiameter: 0.012, outerDiameter: 0.03, length: 0.03 },
    pattern: 'layer',
    drive: { kind: 'voltage', volts: 12 },
    dutyCycle: 1,
    ambient: 25,
    insulationClass: 155,
    magneticCircuit: {
      relativePermeability: 2000,
      saturationFluxDensity: 1.6,
      ironPathLength: 0.1,
      airGap: 0.001,
      gapCount: 1,
      area: 1e-4,
    },
    ...over,
  };
}
