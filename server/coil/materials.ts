/**
 * A small library of soft-magnetic core materials for magneticCircuit. Each has a working
 * relative permeability for the linear model and, where the shop has one, a DC magnetization
 * (B–H) curve the engine solves on, with the knee past which it warns. Every curve is an
 * approximate typical curve recalled from handbook figures (from memory, named per material);
 * real values vary with grade, anneal and stress: the shop should replace them with its
 * supplier's measured curve.
 */
import { FERROMAGNETIC_SUSCEPTIBILITY_RULE } from './constants';

export interface CoreMaterial {
  id: string;
  name: string;
  /** μr = 1 + χ, for the linear model. */
  relativePermeability: number;
  /** Linear model: saturation flux density, T. With a curve: its knee, T. */
  saturationFluxDensity: number;
  /** DC magnetization curve: [H (A/m), B (T)], both rising. */
  bhCurve?: [number, number][];
  source: string;
}

export const CORE_MATERIALS: readonly CoreMaterial[] = Object.freeze(
  [
    {
      id: 'generic-iron',
      name: 'Generic ferromagnetic iron (rule of thumb, linear)',
      relativePermeability: 1 + FERROMAGNETIC_SUSCEPTIBILITY_RULE,
      saturationFluxDensity: 1.6,
      source:
        'susceptibility of the order of 6×10³ (common practice, no published source); ' +
        'saturation 1.6 T chosen below that of plain steels (common practice, no published source)',
    },
    {
      id: 'pure-iron',
      name: 'Annealed commercially pure iron',
      relativePermeability: 5000,
      saturationFluxDensity: 1.5,
      bhCurve: [
        [10, 0.02],
        [30, 0.1],
        [50, 0.3],
        [80, 0.7],
        [120, 1.0],
        [200, 1.25],
        [400, 1.42],
        [800, 1.52],
        [2000, 1.62],
        [5000, 1.72],
        [10000, 1.82],
        [30000, 1.98],
        [100000, 2.12],
      ],
      source:
        'typical DC magnetization curve of annealed commercial iron, after the curves in R. M. Bozorth, Ferromagnetism (1951) (from memory, approximate); knee 1.5 T',
    },
    {
      id: 'low-carbon-steel',
      name: 'Low-carbon steel (about 0.1 % C, 1010 type), annealed',
      relativePermeability: 2000,
      saturationFluxDensity: 1.45,
      bhCurve: [
        [100, 0.2],
        [200, 0.6],
        [300, 0.9],
        [500, 1.15],
        [1000, 1.35],
        [2000, 1.5],
        [4000, 1.62],
        [8000, 1.72],
        [16000, 1.85],
        [40000, 2.0],
        [100000, 2.12],
      ],
      source:
        'typical DC magnetization curve of annealed 1010 steel in handbook tables of magnetic steels (from memory, approximate); knee 1.45 T',
    },
    {
      id: 'silicon-steel',
      name: 'Non-oriented silicon steel (about 3 % Si)',
      relativePermeability: 4000,
      saturationFluxDensity: 1.35,
      bhCurve: [
        [20, 0.1],
        [40, 0.5],
        [60, 0.8],
        [100, 1.1],
        [200, 1.28],
        [500, 1.4],
        [1000, 1.48],
        [3000, 1.6],
        [10000, 1.75],
        [30000, 1.9],
        [100000, 2.05],
      ],
      source:
        'typical DC magnetization curve of fully processed non-oriented electrical steel (M-19 class) in steel makers’ data (from memory, approximate); knee 1.35 T',
    },
    {
      id: 'ferritic-stainless',
      name: 'Ferritic stainless steel (430 type), annealed',
      relativePermeability: 1000,
      saturationFluxDensity: 1.2,
      bhCurve: [
        [100, 0.1],
        [300, 0.5],
        [600, 0.9],
        [1000, 1.1],
        [2000, 1.25],
        [5000, 1.38],
        [10000, 1.45],
        [30000, 1.55],
        [100000, 1.7],
      ],
      source: 'typical DC magnetization curve of annealed 430 stainless for solenoid cores (from memory, approximate); knee 1.2 T',
    },
    {
      id: 'nickel-iron-50',
      name: '50 % nickel–iron alloy',
      relativePermeability: 20000,
      saturationFluxDensity: 1.4,
      bhCurve: [
        [2, 0.05],
        [5, 0.3],
        [10, 0.8],
        [20, 1.2],
        [50, 1.4],
        [100, 1.48],
        [500, 1.55],
        [5000, 1.6],
        [50000, 1.66],
      ],
      source: 'typical DC magnetization curve of annealed 50 % Ni–Fe alloys, after Bozorth, Ferromagnetism (1951) (from memory, approximate); knee 1.4 T',
    },
    {
      id: 'mnzn-ferrite',
      name: 'Manganese–zinc power ferrite (25 °C)',
      relativePermeability: 2000,
      saturationFluxDensity: 0.4,
      bhCurve: [
        [10, 0.05],
        [20, 0.15],
        [50, 0.3],
        [100, 0.38],
        [200, 0.43],
        [500, 0.48],
        [1000, 0.5],
        [3000, 0.52],
      ],
      source: 'typical MnZn power ferrite at 25 °C in ferrite makers’ data (from memory, approximate); knee 0.4 T; lower when hot',
    },
  ].map((m) => Object.freeze(m as CoreMaterial)),
);

/** Look up a core material by id; undefined when unknown. */
export function coreMaterial(id: string): CoreMaterial | undefined {
  return CORE_MATERIALS.find((m) => m.id === id);
}
