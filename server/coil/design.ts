/**
 * designCoil, sweepWireSizes and solveCoil: from a requirement to a build sheet.
 */
import {
  BUILD_SPREAD,
  CONDUCTORS,
  CURRENT_DENSITY_LIMIT,
  DEFAULT_HEAT_TRANSFER_COEFFICIENT,
  DEFAULT_RANDOM_PACKING,
  DEFAULT_SUPPLY_TOLERANCE,
  DIODE_FORWARD_DROP,
  FERROMAGNETIC_SUSCEPTIBILITY_RULE,
  HEXAGONAL_PACKING,
  HOT_SPOT_SOURCE,
  IMPLANT_FIELD_LIMIT,
  PULL_CAUTION,
  RUNAWAY_LIMIT,
  SUPPLY_TOLERANCE_SOURCE,
  conductorAssumptions,
  hotSpotAllowance,
} from './constants';
import { circuitInductance, solenoidCentreField, solveCircuit, wheelerInductance, type CircuitSolution } from './magnetics';
import { heatingLaw, heatingTime, periodicPeakRise, steadyTemperature } from './thermal';
import { validateSpec, validateTarget } from './validate';
import { makeWire, standardSizes } from './wire';
import type {
  Assumption,
  BuildSheet,
  CoilCaution,
  CoilSpec,
  CoilTarget,
  CoilWarning,
  Corner,
  DutyResult,
  MagnetWire,
  ResistanceBand,
  SolveResult,
  SwitchOffResult,
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
  /** Axial length the turns occupy, m. */
  windingLength: number;
  /** False when not even one turn in one layer fits the bobbin. */
  winds: boolean;
}

/** Turns in `layers` orthocyclic layers: odd layers hold tpl turns, even layers tpl − 1. */
function orthoTurns(layers: number, tpl: number): number {
  const odd = Math.ceil(layers / 2);
  return odd * tpl + (layers - odd) * (tpl - 1);
}

/** The random-winding packing of a spec and wire: turns per overall-diameter² of window. */
function packingOf(spec: CoilSpec, wire: MagnetWire): number {
  if (spec.packingFactor !== undefined) return spec.packingFactor;
  if (spec.fillFactor !== undefined) {
    return Math.min(HEXAGONAL_PACKING, (spec.fillFactor * wire.overallDiameter * wire.overallDiameter) / wire.area);
  }
  return DEFAULT_RANDOM_PACKING;
}

/**
 * Winding geometry. d is the overall (insulated) diameter throughout.
 * - layer: turns per layer ⌊ℓ / d⌋, layers ⌊(D − Dᵢ) / (2d)⌋, built diameter Dᵢ + 2·layers·d.
 * - orthocyclic: each turn nests in the groove of the layer below, so layers after the first
 *   add √3/2·d of radial build and alternate layers hold one turn fewer.
 * - random: turns = packing × window area / d² (never more than orthocyclic winding gets into the
 *   same window); a fixed turn count needs a depth of N·d² / (packing × ℓ).
 * A fixed turn count shorter than one layer lies in one layer and occupies N·d of the traverse.
 * With a fixed turn count the layers and built diameter follow; the build may exceed the bobbin
 * (reported by the caller as does-not-fit).
 */
function windingGeometry(spec: CoilSpec, wire: MagnetWire): Geometry {
  const d = wire.overallDiameter;
  const di = spec.bobbin.innerDiameter;
  const depth = (spec.bobbin.outerDiameter - di) / 2;
  const length = spec.bobbin.length;
  const tpl = Math.floor(length / d + EPS);
  const fixed = spec.turns;
  const none: Geometry = { turns: 0, turnsPerLayer: Math.max(tpl, 0), layers: 0, builtDiameter: di, windingLength: length, winds: false };
  if (tpl < 1) return none;
  if (depth + EPS * d < d) return none;
  // Less than one layer: one layer, N·d long, whatever the pattern.
  if (fixed !== undefined && fixed < tpl) {
    return { turns: fixed, turnsPerLayer: tpl, layers: 1, builtDiameter: di + 2 * d, windingLength: fixed * d, winds: true };
  }

  if (spec.pattern === 'layer') {
    const maxLayers = Math.floor(depth / d + EPS);
    const layers = fixed !== undefined ? Math.ceil(fixed / tpl) : maxLayers;
    const turns = fixed !== undefined ? fixed : tpl * layers;
    return { turns, turnsPerLayer: tpl, layers, builtDiameter: di + 2 * layers * d, windingLength: length, winds: true };
  }

  const pitch = SQRT3_2 * d;
  const orthoMaxLayers = Math.floor((depth - d) / pitch + EPS) + 1;
  const orthoBuilt = (layers: number) => di + 2 * (d + (layers - 1) * pitch);

  if (spec.pattern === 'orthocyclic') {
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
      layers = orthoMaxLayers;
      turns = orthoTurns(layers, tpl);
    }
    return { turns, turnsPerLayer: tpl, layers, builtDiameter: orthoBuilt(layers), windingLength: length, winds: true };
  }

  // random
  const p = packingOf(spec, wire);
  const d2 = d * d;
  if (fixed !== undefined) {
    const needed = Math.max(d, (fixed * d2) / (p * length));
    return { turns: fixed, turnsPerLayer: tpl, layers: Math.ceil(fixed / tpl), builtDiameter: di + 2 * needed, windingLength: length, winds: true };
  }
  const byPacking = Math.floor((p * length * depth) / d2 + EPS);
  const orthoMax = orthoTurns(orthoMaxLayers, tpl);
  if (byPacking >= orthoMax) {
    // Small windows: whole layers leave gaps the packing figure does not see; orthocyclic is the ceiling.
    return { turns: orthoMax, turnsPerLayer: tpl, layers: orthoMaxLayers, builtDiameter: orthoBuilt(orthoMaxLayers), windingLength: length, winds: true };
  }
  if (byPacking < 1) return none;
  const built = di + 2 * Math.max(d, (byPacking * d2) / (p * length));
  return { turns: byPacking, turnsPerLayer: tpl, layers: Math.ceil(byPacking / tpl), builtDiameter: built, windingLength: length, winds: true };
}

/** Supply band, highest ambient and suppression of a spec with the engine's defaults. */
function operating(spec: CoilSpec) {
  const tol = spec.supplyTolerance ?? DEFAULT_SUPPLY_TOLERANCE;
  return {
    low: tol.low,
    high: tol.high,
    ambientMax: spec.ambientMax ?? spec.ambient,
    suppression: spec.suppression ?? { kind: 'diode' as const },
    suppressionAssumed: spec.suppression === undefined,
  };
}

/** The constants and rules behind a spec's build sheets, with sources (frozen, shared by a sweep). */
function specAssumptions(spec: CoilSpec): readonly Assumption[] {
  const op = operating(spec);
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
      : { name: 'hot-spot allowance', value: hotSpotAllowance(spec.insulationClass), unit: 'K', source: HOT_SPOT_SOURCE },
    { name: 'thermal class limit', value: spec.insulationClass, unit: '°C', source: 'IEC 60085' },
    {
      name: 'supply band (low / high)',
      value: `${op.low} / ${op.high} of the rated ${spec.drive.kind === 'voltage' ? 'voltage' : 'current'}`,
      unit: '',
      source: spec.supplyTolerance ? 'given in the spec' : SUPPLY_TOLERANCE_SOURCE,
    },
    {
      name: 'highest ambient',
      value: op.ambientMax,
      unit: '°C',
      source: spec.ambientMax !== undefined ? 'given in the spec' : 'the rated ambient (the spec names no higher one)',
    },
    {
      name: 'operating corners',
      value:
        'low: supply × low with the winding at its steady temperature at rated supply and the highest ambient (pull-in); high: supply × high at its own steady temperature at the highest ambient (heating)',
      unit: '',
      source: 'worst-case design practice; over-temperature and runaway are judged at the high corner',
    },
    {
      name: 'intermittent duty',
      value:
        spec.cycleTime !== undefined
          ? 'the repeating on/off cycle integrated with the resistance feedback (closed form of C dθ/dt = P(θ) − hAθ)'
          : 'duty-averaged power (no cycle time given)',
      unit: '',
      source: "Newton's law of cooling, one thermal capacity",
    },
    {
      name: 'switch-off suppression',
      value: op.suppressionAssumed ? 'a diode across the coil (assumed: the spec names none)' : op.suppression.kind,
      unit: '',
      source: op.suppressionAssumed ? 'engine default; state the customer’s suppression' : 'given in the spec',
    },
    { name: 'diode forward drop', value: DIODE_FORWARD_DROP, unit: 'V', source: 'silicon rectifier (common practice, no published source)' },
    {
      name: 'build spread of R20',
      value: `±${BUILD_SPREAD[spec.pattern] * 100} % (${spec.pattern})`,
      unit: '',
      source: 'common practice, no published source; added to the wire standard’s resistance tolerance',
    },
    {
      name: 'runaway limit',
      value: RUNAWAY_LIMIT,
      unit: '°C',
      source: 'no usable steady state above this temperature (engine rule)',
    },
  );
  if (spec.pattern === 'random') {
    list.push(
      spec.packingFactor !== undefined
        ? { name: 'random-winding packing', value: spec.packingFactor, unit: 'turns per d²', source: 'given in the spec' }
        : spec.fillFactor !== undefined
          ? {
              name: 'random-winding packing',
              value: `from the spec's bare fill factor ${spec.fillFactor}: fill × d² / bare area, at most ${HEXAGONAL_PACKING.toFixed(3)}`,
              unit: 'turns per d²',
              source: 'given in the spec (older sheets)',
            }
          : {
              name: 'random-winding packing',
              value: DEFAULT_RANDOM_PACKING,
              unit: 'turns per d²',
              source: 'turns × overall diameter² over the window; about 78 % of close packing (common practice, no published source)',
            },
    );
  }
  if (spec.magneticCircuit) {
    const curve = spec.magneticCircuit.bhCurve !== undefined;
    list.push(
      {
        name: 'magnetic circuit',
        value: curve
          ? 'N·I = H(B)·l + n·g·B/μ0 on the B–H curve (straight lines between its points), L = N·B·A/I'
          : 'ℛ = n·g/(μ0 A) + l/(μ0 μr A), B = NI/(ℛA) capped at saturation, L = N·B·A/I',
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
const supplyText = (spec: CoilSpec, value: number) => (spec.drive.kind === 'voltage' ? `${fmt(value, 1)} V` : `${fmt(value, 3)} A`);

/** Build sheet of one wire on an already validated spec. */
function designWith(spec: CoilSpec, wire: MagnetWire, assumptions: readonly Assumption[]): BuildSheet {
  const p = CONDUCTORS[spec.conductor];
  const op = operating(spec);
  const geo = windingGeometry(spec, wire);
  const warnings: CoilWarning[] = [];
  const di = spec.bobbin.innerDiameter;
  const windowArea = (spec.bobbin.length * (spec.bobbin.outerDiameter - di)) / 2;
  const ambient = spec.ambient;
  const duty = spec.dutyCycle;
  const h = spec.heatTransferCoefficient ?? DEFAULT_HEAT_TRANSFER_COEFFICIENT;
  const hotSpot = spec.hotSpotAllowance ?? hotSpotAllowance(spec.insulationClass);

  if (!geo.winds) {
    warnings.push({
      code: 'does-not-fit',
      message:
        `A ${fmt(wire.overallDiameter * 1e3, 3)} mm wire does not wind on this bobbin: ` +
        `not even one turn in one layer fits the ${fmt(spec.bobbin.length * 1e3, 2)} mm traverse and ` +
        `${fmt(((spec.bobbin.outerDiameter - di) / 2) * 1e3, 2)} mm depth.`,
    });
    return emptySheet(spec, wire, geo, warnings, assumptions, hotSpot);
  }

  const turns = geo.turns;
  const built = geo.builtDiameter;
  const length = geo.windingLength;
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
  const conductorMass = wireLength * wire.conductorMassPerMetre;
  const fillFactor = (turns * wire.area) / windowArea;
  const packingFactor = (turns * wire.overallDiameter * wire.overallDiameter) / windowArea;
  const resistance20 = wireLength * wire.resistancePerMetre20;
  // Outer cylinder plus both annular end faces.
  const surfaceArea = Math.PI * built * length + (Math.PI / 2) * (built * built - di * di);
  const conductance = h * surfaceArea;
  const capacity = conductorMass * p.specificHeat;
  const alpha = p.alpha20;
  const R = (t: number) => resistance20 * (1 + alpha * (t - 20));
  const kind = spec.drive.kind;
  const rated = kind === 'voltage' ? spec.drive.volts : spec.drive.amps;
  const m = spec.magneticCircuit;

  /** Steady state with duty-averaged power at a drive value and ambient. */
  const steadyAt = (value: number, amb: number) => steadyTemperature(kind, value, resistance20, alpha, amb, duty, conductance);
  /** A corner: drive `value`, winding at `temperature`. */
  const corner = (value: number, amb: number, temperature: number, runaway: boolean): Corner & { point?: CircuitSolution } => {
    const resistance = R(temperature);
    const current = kind === 'voltage' ? value / resistance : value;
    const ampereTurns = turns * current;
    const c: Corner & { point?: CircuitSolution } = {
      supply: value,
      ambient: amb,
      windingTemperature: temperature,
      resistance,
      current,
      power: current * current * resistance,
      ampereTurns,
      runaway,
    };
    if (m) {
      const pt = solveCircuit(ampereTurns, m);
      c.gapFluxDensity = pt.fluxDensity;
      c.pullForce = pt.force;
      c.point = pt;
    }
    return c;
  };

  // Nominal: rated supply at the rated ambient (the sheet's main figures).
  const steady = steadyAt(rated, ambient);
  const nominalFull = corner(rated, ambient, steady.windingTemperature, steady.runaway);
  // Low: low supply, winding hot from the rated supply at the highest ambient. High: its own heat.
  const ratedHot = op.ambientMax === ambient ? steady : steadyAt(rated, op.ambientMax);
  const lowFull = corner(rated * op.low, op.ambientMax, ratedHot.windingTemperature, ratedHot.runaway);
  const highSteady = steadyAt(rated * op.high, op.ambientMax);
  const highFull = corner(rated * op.high, op.ambientMax, highSteady.windingTemperature, highSteady.runaway);
  const strip = ({ point: _p, ...c }: Corner & { point?: CircuitSolution }): Corner => c;
  const corners = { low: strip(lowFull), nominal: strip(nominalFull), high: strip(highFull) };

  const windingTemperature = steady.windingTemperature;
  const resistanceCold = R(ambient);
  const resistanceHot = nominalFull.resistance;
  let voltage: number;
  let currentCold: number;
  const currentHot = nominalFull.current;
  if (kind === 'voltage') {
    voltage = rated;
    currentCold = voltage / resistanceCold;
  } else {
    currentCold = rated;
    voltage = rated * resistanceHot;
  }
  const powerCold = currentCold * currentCold * resistanceCold;
  const powerHot = nominalFull.power;
  const ampereTurnsCold = turns * currentCold;
  const ampereTurnsHot = nominalFull.ampereTurns;
  const currentDensity = currentHot / wire.area;

  // Intermittent duty at the high corner, with the resistance feedback.
  const limitTemperature = spec.insulationClass - hotSpot;
  const highValue = rated * op.high;
  const rAtMax = R(op.ambientMax);
  const powerAtMax = kind === 'voltage' ? (highValue * highValue) / rAtMax : highValue * highValue * rAtMax;
  const heating = heatingLaw(kind, powerAtMax, alpha, op.ambientMax, capacity, conductance);
  const basis: DutyResult['basis'] = duty >= 1 ? 'continuous' : spec.cycleTime !== undefined ? 'periodic' : 'average';
  let peakTemperature = highFull.windingTemperature;
  let onTime: number | null = null;
  if (basis === 'periodic') {
    onTime = duty * spec.cycleTime!;
    const rise = periodicPeakRise(heating, onTime, spec.cycleTime! - onTime);
    peakTemperature = Math.min(RUNAWAY_LIMIT, op.ambientMax + rise);
  }
  const limitRise = limitTemperature - op.ambientMax;
  const toLimit = limitRise <= 0 ? 0 : heatingTime(heating, 0, limitRise);
  const dutyResult: DutyResult = {
    supply: highValue,
    ambient: op.ambientMax,
    basis,
    cycleTime: spec.cycleTime ?? null,
    onTime,
    peakTemperature,
    limitTemperature,
    maxOnTimeFromCold: Number.isFinite(toLimit) ? toLimit : null,
  };

  const highLabel = `the high corner (${supplyText(spec, highValue)}, ${fmt(op.ambientMax, 0)} °C ambient)`;
  if (steady.runaway || highSteady.runaway) {
    warnings.push({
      code: 'thermal-runaway',
      message:
        `No steady temperature below ${RUNAWAY_LIMIT} °C at ${steady.runaway ? `the rated supply (${supplyText(spec, rated)})` : highLabel}: ` +
        `the winding keeps heating until it burns. ` +
        (steady.runaway ? `The hot figures on this sheet are at ${RUNAWAY_LIMIT} °C and are not a working point. ` : '') +
        'Fire risk.',
    });
  }
  const hottest = Math.max(highFull.windingTemperature, peakTemperature);
  if (hottest + hotSpot > spec.insulationClass) {
    const peakNote = basis === 'periodic' && peakTemperature > highFull.windingTemperature ? ` (the peak of its ${fmt(spec.cycleTime!, 0)} s cycle)` : '';
    warnings.push({
      code: 'over-temperature',
      message:
        `At ${highLabel} the winding reaches ${fmt(hottest)} °C${peakNote}, plus ${fmt(hotSpot)} K hot-spot allowance, ` +
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
  let ironOperatingPoint: BuildSheet['ironOperatingPoint'];
  if (m) {
    const pt = nominalFull.point!;
    gapFluxDensity = pt.fluxDensity;
    pullForce = pt.force;
    inductance = circuitInductance(turns, currentHot, m, pt);
    ironOperatingPoint = { model: pt.model, fieldStrength: pt.fieldStrength, fluxDensity: pt.fluxDensity, saturated: pt.saturated };
    if (pt.saturated) {
      warnings.push({
        code: 'saturation',
        message:
          pt.model === 'curve'
            ? `The iron works past the knee of its B–H curve: ${fmt(pt.fluxDensity, 2)} T at ${fmt(ampereTurnsHot, 0)} ampere-turns against the knee at ` +
              `${fmt(m.saturationFluxDensity, 2)} T, so more ampere-turns add little flux or pull, only heat.`
            : `The iron saturates: ${fmt(ampereTurnsHot, 0)} ampere-turns would drive the circuit past ` +
              `${fmt(m.saturationFluxDensity, 2)} T, so flux and pull are capped there. More ampere-turns will not add pull.`,
      });
    }
  } else {
    inductance = wheelerInductance(turns, (a1 + a2) / 2, length, a2 - a1, geo.layers === 1);
  }
  const timeConstant = inductance / resistanceHot;
  const thermalTimeConstant = capacity / conductance;

  // Switch-off: the largest current (supply × high, winding at the rated ambient) into the clamp.
  const sup = op.suppression;
  const breakCurrent = kind === 'voltage' ? highValue / resistanceCold : highValue;
  const supplyVolts = kind === 'voltage' ? highValue : highValue * resistanceCold;
  let clamp: number | null = null;
  if (sup.kind === 'diode') clamp = sup.clampVoltage ?? DIODE_FORWARD_DROP;
  else if (sup.kind === 'diode-zener') clamp = (sup.clampVoltage ?? 0) + DIODE_FORWARD_DROP;
  else if (sup.kind === 'tvs') clamp = sup.clampVoltage ?? 0;
  const offTau = inductance / resistanceCold;
  const storedEnergy = 0.5 * inductance * breakCurrent * breakCurrent;
  const switchOff: SwitchOffResult = {
    kind: sup.kind,
    assumed: op.suppressionAssumed,
    current: breakCurrent,
    storedEnergy,
    clampVoltage: clamp,
    peakVoltage: clamp === null ? null : supplyVolts + clamp,
    timeConstant: offTau,
    decayTime:
      clamp === null
        ? null
        : offTau * Math.log((breakCurrent + clamp / resistanceCold) / (0.1 * breakCurrent + clamp / resistanceCold)),
  };
  if (sup.kind === 'none') {
    warnings.push({
      code: 'no-suppression',
      message:
        `No suppression across the coil: at switch-off its ${fmtEnergy(storedEnergy)} drive the voltage across the switch up until ` +
        'something arcs or breaks down — the spike is limited only by arcing or breakdown. Fit a diode, a diode with a Zener or a TVS across the coil.',
    });
  }

  const resistanceBand = bandOf(spec, wire, resistance20);
  const cautions = cautionsOf(spec, {
    storedEnergy,
    peakVoltage: switchOff.peakVoltage,
    hottest,
    field: Math.max(Math.abs(centreField), gapFluxDensity ?? 0),
    pull: pullForce,
  });

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
    conductorMass,
    fillFactor,
    packingFactor,
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
    thermalCapacity: capacity,
    conductance,
    driveKind: kind,
    dutyCycle: duty,
    thermalRunaway: steady.runaway,
    hotSpotAllowance: hotSpot,
    corners,
    duty: dutyResult,
    switchOff,
    resistanceBand,
    ironOperatingPoint,
    warnings,
    cautions,
    assumptions,
  };
}

function fmtEnergy(j: number): string {
  return j >= 1 ? `${fmt(j, 2)} J` : `${fmt(j * 1e3, 1)} mJ`;
}

/** The default R20 acceptance band: the wire standard's resistance tolerance plus the pattern's build spread. */
function bandOf(spec: CoilSpec, wire: MagnetWire, resistance20: number): ResistanceBand {
  const t = wire.resistanceTolerance;
  const build = BUILD_SPREAD[spec.pattern];
  return {
    min: resistance20 * (1 - t.minus - build),
    max: resistance20 * (1 + t.plus + build),
    basis: `${t.source}, plus ±${build * 100} % for a ${spec.pattern} build (common practice, no published source), added`,
    wireMinus: t.minus,
    wirePlus: t.plus,
    build,
  };
}

/** Touching a metal surface for a few seconds burns above about 60 °C (ISO 13732-1 contact burn thresholds, from memory). */
const HOT_TOUCH = 60;

/** The cautions a sheet carries, beside the numbers they concern. */
function cautionsOf(
  spec: CoilSpec,
  x: { storedEnergy: number; peakVoltage: number | null; hottest: number; field: number; pull: number | undefined },
): CoilCaution[] {
  const out: CoilCaution[] = [];
  out.push({
    code: 'switch-off',
    message:
      x.peakVoltage === null
        ? `Switching off releases ${fmtEnergy(x.storedEnergy)} with nothing to catch it: the spike can reach hundreds of volts and arcs at the contacts. Never open the circuit by hand at the terminals.`
        : `Switching off releases ${fmtEnergy(x.storedEnergy)}; with the stated suppression the switch sees up to ${fmt(x.peakVoltage, 0)} V. Without it the spike arcs at the contacts — never open the circuit by hand at the terminals.`,
  });
  out.push({
    code: 'stored-charge',
    message:
      'After a hi-pot or insulation-resistance test the winding holds a charge: discharge it through the tester or a discharge stick to earth before anyone touches the leads.',
  });
  if (x.hottest >= HOT_TOUCH) {
    out.push({
      code: 'hot-surface',
      message: `The winding reaches ${fmt(x.hottest, 0)} °C: its surface can burn skin. Let it cool or use gloves; keep it away from anything that burns.`,
    });
  }
  if (x.field >= IMPLANT_FIELD_LIMIT) {
    out.push({
      code: 'strong-field',
      message: `The field reaches ${x.field >= 0.1 ? `${fmt(x.field, 2)} T` : `${fmt(x.field * 1e3, 1)} mT`}: keep people with pacemakers or other active implants away (0.5 mT), and loose steel tools away — they can fly to the coil.`,
    });
  }
  const m = spec.magneticCircuit;
  if (m && m.airGap > 0 && m.gapCount > 0) {
    out.push({
      code: 'pinch',
      message: `The armature closes with up to ${fmt(x.pull ?? 0, 0)} N: keep fingers out of the gap while the coil can be energised.`,
    });
  }
  if (m) {
    out.push({
      code: 'lifting',
      message: `${PULL_CAUTION} Loss of power drops the load: a holding or lifting magnet needs the safeguards of the applicable lifting-device standard and local codes.`,
    });
  }
  return out;
}

/** A sheet for a wire that does not wind at all: no turns, nothing flows. */
function emptySheet(
  spec: CoilSpec,
  wire: MagnetWire,
  geo: Geometry,
  warnings: CoilWarning[],
  assumptions: readonly Assumption[],
  hotSpot: number,
): BuildSheet {
  const op = operating(spec);
  const di = spec.bobbin.innerDiameter;
  const length = spec.bobbin.length;
  const wireLength = spec.leadLength ?? 0;
  const resistance20 = wireLength * wire.resistancePerMetre20;
  const alpha = CONDUCTORS[spec.conductor].alpha20;
  const resistanceAmbient = resistance20 * (1 + alpha * (spec.ambient - 20));
  const rated = spec.drive.kind === 'voltage' ? spec.drive.volts : spec.drive.amps;
  const idle = (value: number, amb: number): Corner => ({
    supply: value,
    ambient: amb,
    windingTemperature: amb,
    resistance: resistance20 * (1 + alpha * (amb - 20)),
    current: 0,
    power: 0,
    ampereTurns: 0,
    ...(spec.magneticCircuit && { gapFluxDensity: 0, pullForce: 0 }),
    runaway: false,
  });
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
    conductorMass: wireLength * wire.conductorMassPerMetre,
    fillFactor: 0,
    packingFactor: 0,
    resistance20,
    resistanceHot: resistanceAmbient,
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
    thermalCapacity: 0,
    conductance: 0,
    driveKind: spec.drive.kind,
    dutyCycle: spec.dutyCycle,
    thermalRunaway: false,
    hotSpotAllowance: hotSpot,
    corners: { low: idle(rated * op.low, op.ambientMax), nominal: idle(rated, spec.ambient), high: idle(rated * op.high, op.ambientMax) },
    duty: {
      supply: rated * op.high,
      ambient: op.ambientMax,
      basis: spec.dutyCycle >= 1 ? 'continuous' : spec.cycleTime !== undefined ? 'periodic' : 'average',
      cycleTime: spec.cycleTime ?? null,
      onTime: spec.cycleTime !== undefined ? spec.dutyCycle * spec.cycleTime : null,
      peakTemperature: op.ambientMax,
      limitTemperature: spec.insulationClass - hotSpot,
      maxOnTimeFromCold: null,
    },
    switchOff: {
      kind: op.suppression.kind,
      assumed: op.suppressionAssumed,
      current: 0,
      storedEnergy: 0,
      clampVoltage: null,
      peakVoltage: null,
      timeConstant: 0,
      decayTime: null,
    },
    resistanceBand: bandOf(spec, wire, resistance20),
    warnings,
    cautions: [],
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
 * Build sheet for a coil spec: winding, resistance and its acceptance band, steady temperature
 * with resistance feedback, currents and powers cold (at ambient) and hot (at the steady
 * temperature), the low / nominal / high operating corners, intermittent duty, switch-off,
 * field, pull and inductance, warnings and cautions. Throws CoilSpecError for an invalid spec.
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

/** Why a sheet fails the target at its low corner, in words (empty when it meets it). */
function targetShortfalls(sheet: BuildSheet, target: CoilTarget, spec: CoilSpec): string[] {
  const reasons: string[] = [];
  const low = sheet.corners.low;
  const at = `at the low corner (${supplyText(spec, low.supply)}, winding ${fmt(low.windingTemperature, 0)} °C)`;
  if (target.ampereTurns !== undefined && low.ampereTurns < target.ampereTurns) {
    reasons.push(`gives ${fmt(low.ampereTurns, 0)} ampere-turns ${at}, short of the ${fmt(target.ampereTurns, 0)} needed`);
  }
  if (target.gapFluxDensity !== undefined && (low.gapFluxDensity ?? 0) < target.gapFluxDensity) {
    reasons.push(`gives ${fmt(low.gapFluxDensity ?? 0, 3)} T in the gap ${at}, short of the ${fmt(target.gapFluxDensity, 3)} T needed`);
  }
  if (target.pullForce !== undefined && (low.pullForce ?? 0) < target.pullForce) {
    reasons.push(`pulls ${fmt(low.pullForce ?? 0)} N ${at}, short of the ${fmt(target.pullForce)} N needed`);
  }
  return reasons;
}

/**
 * Sweep every standard size of spec.wire.standard, keep those that fit, stay within the
 * insulation class without runaway at the high corner, and meet the target at the low corner
 * (low supply, winding hot at the highest ambient); rank them by lowest nominal hot power, then
 * least wire mass. Every other size is listed with its reasons in words. The target is validated
 * too (pull and gap targets need a magnetic circuit).
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
      const short = targetShortfalls(sheet, target, spec);
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
