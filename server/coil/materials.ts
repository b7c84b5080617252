/**
 * A small library of soft-magnetic core materials for magneticCircuit. Relative permeability
 * here is a working value for a DC magnet circuit at moderate flux density, not the peak
 * permeability; real values vary with grade, anneal and flux density. Every number is from
 * memory unless marked otherwise; the shop should replace them with its supplier's data.
 */
import { FERROMAGNETIC_SUSCEPTIBILITY_RULE } from './constants';

export interface CoreMaterial {
  id: string;
  name: string;
  /** μr = 1 + χ. */
  relativePermeability: number;
  /** Saturation flux density, T. */
  saturationFluxDensity: number;
  source: string;
}

export const CORE_MATERIALS: readonly CoreMaterial[] = Object.freeze([
  {
    id: 'generic-iron',
    name: 'Generic ferromagnetic iron (rule of thumb)',
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
    saturationFluxDensity: 2.15,
    source: 'handbook values for annealed pure iron (from memory)',
  },
  {
    id: 'low-carbon-steel',
    name: 'Low-carbon steel (about 0.1 % C), annealed',
    relativePermeability: 2000,
    saturationFluxDensity: 2.0,
    source: 'handbook values for annealed low-carbon steel (from memory)',
  },
  {
    id: 'silicon-steel',
    name: 'Non-oriented silicon steel (about 3 % Si)',
    relativePermeability: 4000,
    saturationFluxDensity: 2.0,
    source: 'handbook values for non-oriented electrical steel (from memory)',
  },
  {
    id: 'ferritic-stainless',
    name: 'Ferritic stainless steel (430 type), annealed',
    relativePermeability: 1000,
    saturationFluxDensity: 1.5,
    source: 'handbook values for annealed 430 stainless (from memory, approximate)',
  },
  {
    id: 'nickel-iron-50',
    name: '50 % nickel–iron alloy',
    relativePermeability: 20000,
    saturationFluxDensity: 1.5,
    source: 'handbook values for 50 % Ni–Fe alloys (from memory, approximate)',
  },
  {
    id: 'mnzn-ferrite',
    name: 'Manganese–zinc power ferrite',
    relativePermeability: 2000,
    saturationFluxDensity: 0.45,
    source: 'typical MnZn power ferrite at 25 °C (from memory)',
  },
].map((m) => Object.freeze(m)));

/** Look up a core material by id; undefined when unknown. */
export function coreMaterial(id: string): CoreMaterial | undefined {
  return CORE_MATERIALS.find((m) => m.id === id);
}
