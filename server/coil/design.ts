/**
 * designCoil, sweepWireSizes and solveCoil: from a requirement to a build sheet.
 */
import {
  CONDUCTORS,
  CURRENT_DENSITY_LIMIT,
  DEFAULT_HEAT_TRANSFER_COEFFICIENT,
  DEFAULT_HOT_SPOT_ALLOWANCE,
  DEFAULT_RANDOM_FILL_FACTOR,
  FERROMAGNETIC_SUSCEPTIBILITY_RULE,
  PULL_CAUTION,
  RUNAWAY_LIMIT,
  conductorAssumptions,
} from './constants';
import { circuitPoint, circuitReluctance, solenoidCentreField, wheelerInductance } from './magnetics';
import { steadyTemperature } from './thermal';
import { validateSpec, validateTarget } from './validate';
import { makeWire, standardSizes } from './wire';
import type {
  Assumption,
  BuildSheet,
  CoilSpec,
  CoilTarget,
  CoilWarning,
  MagnetWire,
  SolveResult,
  WireSize,
} from './types';

/** Slack for floating-point rounding when counting whole turns and layers. */
const EPS = 1e-9;
const SQRT3_2 = Math.sqrt(3) / 2;

/** Winding geometry of one wire on one bobbin. */
interface Geometry {
  turns: number;
  turnsPerLayer: number;
  layers: number;
  builtDiameter: number;
  /** False when not even one turn in one layer fits the bobbin. */
  winds: boolean;
}

/** Turns in `layers` orthocyclic layers: odd layers hold tpl turns, even layers tpl − 1. */
function orthoTurns(layers: number, tpl: number): number {
  const odd = Math.ceil(layers / 2);
  return odd * tpl + (layers - odd) * (tpl - 1);
}

/**
 * Winding geometry.
 * - layer: turns per layer ⌊ℓ / d⌋, layers ⌊(D − Dᵢ) / (2d)⌋, built diameter Dᵢ + 2·layers·d.
 * - orthocyclic: each turn nests in the groove of the layer below, so layers after the first
 *   add √3/2·d of radial build and alternate layers hold one turn fewer.
 * - random: turns = fill factor × window area / bare wire area; a fixed turn count needs a
 *   depth of N·a / (fill × ℓ).
 * With a fixed turn count the layers and built diameter follow; the build may exceed the
 * bobbin (reported by the caller as does-not-fit).
 */
function windingGeometry(spec: CoilSpec, wire: MagnetWire): Geometry {
  const d = wire.overallDiameter;
  const di = spec.bobbin.innerDiameter;
  const depth = (spec.bobbin.outerDiameter - di) / 2;
  const length = spec.bobbin.length;
  const tpl = Math.floor(length / d + EPS);
  const fixed = spec.turns;
  const none: Geometry = { turns: 0, turnsPerLayer: Math.max(tpl, 0), layers: 0, builtDiameter: di, winds: false };
  if (tpl < 1) return none;

  if (spec.pattern === 'layer') {
    const maxLayers = Math.floor(depth / d + EPS);
    if (maxLayers < 1) return none;
    const layers = fixed !== undefined ? Math.ceil(fixed / tpl) : maxLayers;
    const turns = fixed !== undefined ? fixed : tpl * layers;
    return { turns, turnsPerLayer: tpl, layers, builtDiameter: di + 2 * layers * d, winds: true };
  }

  if (spec.pattern === 'orthocyclic') {
    if (depth + EPS * d < d) return none;
    const pitch = SQRT3_2 * d;
    const maxLayers = Math.floor((depth - d) / pitch + EPS) + 1;
    let layers: number;
    let turns: number;
    if (fixed !== undefined) {
      turns = fixed;
      if (tpl === 1) {
        layers = 2 * fixed - 1; // even layers hold no turn
      } else {
        const pair = 2 * tpl - 1;
        const pairs = Math.floor(fixed / pair);
        const rest = fixed - pairs * pair;
        layers = 2 * pairs + (rest === 0 ? 0 : rest <= tpl ? 1 : 2);
      }
    } else {
      layers = maxLayers;
      turns = orthoTurns(layers, tpl);
    }
    return { turns, turnsPerLayer: tpl, layers, builtDiameter: di + 2 * (d + (layers - 1) * pitch), winds: true };
  }

  // random
  if (depth + EPS * d < d) return none;
  const fill = spec.fillFactor ?? DEFAULT_RANDOM_FILL_FACTOR;
  let turns: number;
  let built: number;
  if (fixed !== undefined) {
    turns = fixed;
    built = di + (2 * fixed * wire.area) / (fill * length);
  } else {
    turns = Math.floor((fill * length * depth) / wire.area + EPS);
    if (turns < 1) return none;
    built = di + (2 * turns * wire.area) / (fill * length);
  }
  return { turns, turnsPerLayer: tpl, layers: Math.ceil(turns / tpl), builtDiameter: built, winds: true };
}

/** The constants and rules behind a spec's build sheets, with sources (frozen, shared by a sweep). */
function specAssumptions(spec: CoilSpec): readonly Assumption[] {
  const list: Assumption[] = [...conductorAssumptions(spec.conductor)];
  list.push(
    spec.heatTransferCoefficient !== undefined
      ? { name: 'heat-transfer coefficient h', value: spec.heatTransferCoefficient, unit: 'W/(m²·K)', source: 'given in the spec' }
      : {
          name: 'heat-transfer coefficient h',
          value: DEFAULT_HEAT_TRANSFER_COEFFICIENT,
          unit: 'W/(m²·K)',
          source: 'still-air convection plus radiation (common practice, no published source)',
        },
    spec.hotSpotAllowance !== undefined
      ? { name: 'hot-spot allowance', value: spec.hotSpotAllowance, unit: 'K', source: 'given in the spec' }
      : {
          name: 'hot-spot allowance',
          value: DEFAULT_HOT_SPOT_ALLOWANCE,
          unit: 'K',
          source: 'common practice, no published source (IEC 60034-1 limits sit about 10 K under class B, from memory)',
        },
    { name: 'thermal class limit', value: spec.insulationClass, unit: '°C', source: 'IEC 60085' },
    {
      name: 'runaway limit',
      value: RUNAWAY_LIMIT,
      unit: '°C',
      source: 'no usable steady state above this temperature (engine rule)',
    },
  );
  if (spec.pattern === 'random') {
    list.push(
      spec.fillFactor !== undefined
        ? { name: 'random-winding fill factor', value: spec.fillFactor, unit: '', source: 'given in the spec' }
        : {
            name: 'random-winding fill factor',
            value: DEFAULT_RANDOM_FILL_FACTOR,
            unit: '',
            source: 'bare copper over window (common practice, no published source)',
          },
    );
  }
  if (spec.magneticCircuit) {
    list.push(
      {
        name: 'magnetic circuit',
        value: 'ℛ = n·g/(μ0 A) + l/(μ0 μr A), B = NI/(ℛA) capped at saturation, L = N²/ℛ',
        unit: '',
        source: 'magnetic circuit (Hopkinson) law; iron and gap of equal area, no leakage or fringing',
      },
      {
        name: 'pull',
        value: 'F = n · B² A / (2 μ0)',
        unit: 'N',
        source: 'Maxwell stress on the gap faces',
      },
      {
        name: 'ferromagnetic susceptibility (rule of thumb)',
        value: FERROMAGNETIC_SUSCEPTIBILITY_RULE,
        unit: '',
        source: 'common practice, no published source',
      },
      { name: 'pull caution', value: PULL_CAUTION, unit: '', source: 'shop safety rule' },
    );
  }
  return Object.freeze(list);
}

const fmt = (x: number, digits = 1) => x.toFixed(digits);

/** Build sheet of one wire on an already validated spec. */
function designWith(spec: CoilSpec, wire: MagnetWire, assumptions: readonly Assumption[]): BuildSheet {
  const p = CONDUCTORS[spec.conductor];
  const geo = windingGeometry(spec, wire);
  const warnings: CoilWarning[] = [];
  const di = spec.bobbin.innerDiameter;
  const length = spec.bobbin.length;
  const ambient = spec.ambient;
  const duty = spec.dutyCycle;
  const h = spec.heatTransferCoefficient ?? DEFAULT_HEAT_TRANSFER_COEFFICIENT;
  const hotSpot = spec.hotSpotAllowance ?? DEFAULT_HOT_SPOT_ALLOWANCE;
  const windowArea = (length * (spec.bobbin.outerDiameter - di)) / 2;

  if (!geo.winds) {
    warnings.push({
      code: 'does-not-fit',
      message:
        `A ${fmt(wire.overallDiameter * 1e3, 3)} mm wire does not wind on this bobbin: ` +
        `not even one turn in one layer fits the ${fmt(length * 1e3, 2)} mm traverse and ` +
        `${fmt(((spec.bobbin.outerDiameter - di) / 2) * 1e3, 2)} mm depth.`,
    });
    return emptySheet(spec, wire, geo, warnings, assumptions);
  }

  const turns = geo.turns;
  const built = geo.builtDiameter;
  if (built > spec.bobbin.outerDiameter * (1 + EPS)) {
    warnings.push({
      code: 'does-not-fit',
      message:
        `${turns} turns build to ${fmt(built * 1e3, 2)} mm but the bobbin allows ` +
        `${fmt(spec.bobbin.outerDiameter * 1e3, 2)} mm: use a thinner wire, fewer turns or a larger bobbin.`,
    });
  }

  // Geometry and material.
  const meanTurnLength = (Math.PI * (di + built)) / 2;
  const wireLength = turns * meanTurnLength + (spec.leadLength ?? 0);
  const wireMass = wireLength * wire.massPerMetre;
  const fillFactor = (turns * wire.area) / windowArea;
  const resistance20 = wireLength * wire.resistancePerMetre20;
  // Outer cylinder plus both annular end faces.
  const surfaceArea = Math.PI * built * length + (Math.PI / 2) * (built * built - di * di);
  const conductance = h * surfaceArea;

  // Thermal equilibrium with resistance feedback.
  const alpha = p.alpha20;
  const driveValue = spec.drive.kind === 'voltage' ? spec.drive.volts : spec.drive.amps;
  const steady = steadyTemperature(spec.drive.kind, driveValue, resistance20, alpha, ambient, duty, conductance);
  const windingTemperature = steady.windingTemperature;
  const resistanceCold = resistance20 * (1 + alpha * (ambient - 20));
  const resistanceHot = resistance20 * (1 + alpha * (windingTemperature - 20));

  let voltage: number;
  let currentCold: number;
  let currentHot: number;
  if (spec.drive.kind === 'voltage') {
    voltage = spec.drive.volts;
    currentCold = voltage / resistanceCold;
    currentHot = voltage / resistanceHot;
  } else {
    currentCold = currentHot = spec.drive.amps;
    voltage = currentHot * resistanceHot;
  }
  const powerCold = currentCold * currentCold * resistanceCold;
  const powerHot = currentHot * currentHot * resistanceHot;
  const ampereTurnsCold = turns * currentCold;
  const ampereTurnsHot = turns * currentHot;
  const currentDensity = currentHot / wire.area;

  if (steady.runaway) {
    warnings.push({
      code: 'thermal-runaway',
      message:
        `No steady temperature below ${RUNAWAY_LIMIT} °C: the winding keeps heating until it burns. ` +
        `The hot figures on this sheet are at ${RUNAWAY_LIMIT} °C and are not a working point. Fire risk.`,
    });
  }
  if (windingTemperature + hotSpot > spec.insulationClass) {
    warnings.push({
      code: 'over-temperature',
      message:
        `The winding reaches ${fmt(windingTemperature)} °C, plus ${fmt(hotSpot)} K hot-spot allowance, ` +
        `above the ${spec.insulationClass} °C limit of its insulation class: the insulation will fail early ` +
        `and an overheated coil is a fire risk. Reduce the power or duty, or choose a higher class.`,
    });
  }
  const densityLimit = CURRENT_DENSITY_LIMIT / Math.sqrt(duty);
  if (currentDensity > densityLimit) {
    warnings.push({
      code: 'current-density',
      message:
        `Current density ${fmt(currentDensity / 1e6, 2)} A/mm² exceeds the ${fmt(densityLimit / 1e6, 2)} A/mm² ` +
        `rule of thumb for this duty (${fmt(CURRENT_DENSITY_LIMIT / 1e6)} A/mm² continuous, scaled by 1/√duty).`,
    });
  }

  // Magnetics.
  const a1 = di / 2;
  const a2 = built / 2;
  const centreField = solenoidCentreField(ampereTurnsHot, a1, a2, length);
  let inductance: number;
  let gapFluxDensity: number | undefined;
  let pullForce: number | undefined;
  const m = spec.magneticCircuit;
  if (m) {
    const pt = circuitPoint(
      ampereTurnsHot,
      m.relativePermeability,
      m.saturationFluxDensity,
      m.ironPathLength,
      m.airGap,
      m.gapCount,
      m.area,
    );
    gapFluxDensity = pt.fluxDensity;
    pullForce = pt.force;
    inductance = (turns * turns) / circuitReluctance(m.relativePermeability, m.ironPathLength, m.airGap, m.gapCount, m.area);
    if (pt.saturated) {
      warnings.push({
        code: 'saturation',
        message:
          `The iron saturates: ${fmt(ampereTurnsHot, 0)} ampere-turns would drive the circuit past ` +
          `${fmt(m.saturationFluxDensity, 2)} T, so flux and pull are capped there and the inductance is lower than shown. ` +
          `More ampere-turns will not add pull.`,
      });
    }
  } else {
    inductance = wheelerInductance(turns, (a1 + a2) / 2, length, a2 - a1, geo.layers === 1);
  }
  const timeConstant = inductance / resistanceHot;
  const thermalTimeConstant = (wireMass * p.specificHeat) / conductance;

  return {
    wire,
    turns,
    turnsPerLayer: geo.turnsPerLayer,
    layers: geo.layers,
    innerDiameter: di,
    outerDiameter: built,
    windingLength: length,
    meanTurnLength,
    wireLength,
    wireMass,
    fillFactor,
    resistance20,
    resistanceHot,
    ambient,
    windingTemperature,
    temperatureRise: windingTemperature - ambient,
    surfaceArea,
    voltage,
    currentCold,
    currentHot,
    powerCold,
    powerHot,
    ampereTurnsCold,
    ampereTurnsHot,
    currentDensity,
    centreField,
    gapFluxDensity,
    pullForce,
    inductance,
    timeConstant,
    thermalTimeConstant,
    thermalRunaway: steady.runaway,
    warnings,
    assumptions,
  };
}

/** A sheet for a wire that does not wind at all: no turns, nothing flows. */
function emptySheet(
  spec: CoilSpec,
  wire: MagnetWire,
  geo: Geometry,
  warnings: CoilWarning[],
  assumptions: readonly Assumption[],
): BuildSheet {
  const di = spec.bobbin.innerDiameter;
  const length = spec.bobbin.length;
  const lead = spec.leadLength ?? 0;
  const wireLength = lead;
  const resistance20 = wireLength * wire.resistancePerMetre20;
  return {
    wire,
    turns: 0,
    turnsPerLayer: geo.turnsPerLayer,
    layers: 0,
    innerDiameter: di,
    outerDiameter: di,
    windingLength: length,
    meanTurnLength: Math.PI * di,
    wireLength,
    wireMass: wireLength * wire.massPerMetre,
    fillFactor: 0,
    resistance20,
    resistanceHot: resistance20 * (1 + CONDUCTORS[spec.conductor].alpha20 * (spec.ambient - 20)),
    ambient: spec.ambient,
    windingTemperature: spec.ambient,
    temperatureRise: 0,
    surfaceArea: 0,
    voltage: spec.drive.kind === 'voltage' ? spec.drive.volts : 0,
    currentCold: 0,
    currentHot: 0,
    powerCold: 0,
    powerHot: 0,
    ampereTurnsCold: 0,
    ampereTurnsHot: 0,
    currentDensity: 0,
    centreField: 0,
    gapFluxDensity: spec.magneticCircuit ? 0 : undefined,
    pullForce: spec.magneticCircuit ? 0 : undefined,
    inductance: 0,
    timeConstant: 0,
    thermalTimeConstant: 0,
    thermalRunaway: false,
    warnings,
    assumptions,
  };
}

function sameSize(a: WireSize, b: WireSize): boolean {
  if (a.standard === 'AWG') return b.standard === 'AWG' && a.gauge === b.gauge;
  return b.standard === 'metric' && Math.abs(a.diameter - b.diameter) <= a.diameter * 1e-6;
}

/** The spool's overall diameter applies to the spec's own size only, not to the other sizes of a sweep. */
function wireFor(spec: CoilSpec, size: WireSize): MagnetWire {
  const override = spec.overallDiameter !== undefined && sameSize(size, spec.wire) ? spec.overallDiameter : undefined;
  return makeWire(size, spec.conductor, spec.insulationGrade, override);
}

/**
 * Build sheet for a coil spec: winding, resistance, steady temperature with resistance
 * feedback, currents and powers cold (at ambient) and hot (at the steady temperature),
 * field, pull and inductance. Throws CoilSpecError for an invalid spec.
 */
export function designCoil(spec: CoilSpec): BuildSheet {
  validateSpec(spec);
  return designWith(spec, wireFor(spec, spec.wire), specAssumptions(spec));
}

/**
 * Build sheets of every standard size of spec.wire.standard that physically winds on the
 * bobbin (at least one turn per layer and one layer), thickest first.
 */
export function sweepWireSizes(spec: CoilSpec): BuildSheet[] {
  validateSpec(spec);
  const assumptions = specAssumptions(spec);
  const sizes = standardSizes(spec.wire.standard);
  const out: BuildSheet[] = [];
  for (let i = 0; i < sizes.length; i++) {
    const wire = wireFor(spec, sizes[i]);
    const sheet = designWith(spec, wire, assumptions);
    if (sheet.turns > 0) out.push(sheet);
  }
  return out;
}

const BLOCKING = new Set(['does-not-fit', 'over-temperature', 'thermal-runaway']);

/** Why a sheet fails the target at its hot operating point, in words (empty when it meets it). */
function targetShortfalls(sheet: BuildSheet, target: CoilTarget): string[] {
  const reasons: string[] = [];
  if (target.ampereTurns !== undefined && sheet.ampereTurnsHot < target.ampereTurns) {
    reasons.push(
      `gives ${fmt(sheet.ampereTurnsHot, 0)} ampere-turns at operating temperature, short of the ${fmt(target.ampereTurns, 0)} needed`,
    );
  }
  if (target.gapFluxDensity !== undefined && (sheet.gapFluxDensity ?? 0) < target.gapFluxDensity) {
    reasons.push(
      `gives ${fmt(sheet.gapFluxDensity ?? 0, 3)} T in the gap at operating temperature, short of the ${fmt(target.gapFluxDensity, 3)} T needed`,
    );
  }
  if (target.pullForce !== undefined && (sheet.pullForce ?? 0) < target.pullForce) {
    reasons.push(`pulls ${fmt(sheet.pullForce ?? 0)} N at operating temperature, short of the ${fmt(target.pullForce)} N needed`);
  }
  return reasons;
}

/**
 * Sweep every standard size of spec.wire.standard, keep those that fit, stay within the
 * insulation class without runaway, and meet the target at the hot operating point; rank
 * them by lowest hot power, then least wire mass. Every other size is listed with its
 * reasons in words. The target is validated too (pull and gap targets need a magnetic circuit).
 */
export function solveCoil(spec: CoilSpec, target: CoilTarget): SolveResult {
  validateSpec(spec);
  validateTarget(target, spec);
  const assumptions = specAssumptions(spec);
  const sizes = standardSizes(spec.wire.standard);
  const candidates: BuildSheet[] = [];
  const rejected: { wire: MagnetWire; reasons: string[] }[] = [];
  for (let i = 0; i < sizes.length; i++) {
    const wire = wireFor(spec, sizes[i]);
    const sheet = designWith(spec, wire, assumptions);
    const reasons: string[] = [];
    for (const w of sheet.warnings) if (BLOCKING.has(w.code)) reasons.push(w.message);
    if (sheet.turns > 0) {
      const short = targetShortfalls(sheet, target);
      if (short.length > 0) {
        reasons.push(...short);
        for (const w of sheet.warnings) if (w.code === 'saturation') reasons.push(w.message);
      }
    }
    if (reasons.length > 0) rejected.push({ wire, reasons });
    else candidates.push(sheet);
  }
  candidates.sort((a, b) => a.powerHot - b.powerHot || a.wireMass - b.wireMass);
  return { best: candidates.length > 0 ? candidates[0] : null, candidates, rejected };
}
