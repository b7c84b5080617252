/**
 * The drafting form's values and the CoilSpec they stand for. The form holds text in the user's
 * units (mm or in, °C or °F, % for the duty cycle); `toSpec` turns it into the SI CoilSpec the
 * engine takes, and the contract's schema judges it (through lib/forms' throughContract, so each
 * message keeps the spec's path: `bobbin.length`, `wire.gauge` …).
 */
import {
  AWG_GAUGE_MAX,
  AWG_GAUGE_MIN,
  CoilSpecSchema,
  METRIC_NOMINAL_DIAMETERS_MM,
  type CoilSpec,
} from '../../contracts/coil';
import type { UnitPreferences } from '../../contracts/auth';
import { throughContract } from '../../lib/forms';
import { fromCelsius, fromMetres, fromSquareMetres, toCelsius, toMetres, toSquareMetres, formatNumber } from '../../lib/units';

export type WireSizeValue = CoilSpec['wire'];

export type DraftValues = {
  conductor: CoilSpec['conductor'];
  standard: 'AWG' | 'metric';
  gauge: string;
  /** Metric nominal diameter, mm (the size's name; IEC 60317-0-1 lists them in mm). */
  diameterMm: string;
  insulationGrade: '1' | '2' | '3';
  pattern: CoilSpec['pattern'];
  /** Random winding only: turns per overall-diameter² of window; blank = the engine's default (0.9). */
  packing: string;
  bobbinInner: string;
  bobbinOuter: string;
  bobbinLength: string;
  leadLength: string;
  driveKind: 'voltage' | 'current';
  volts: string;
  amps: string;
  /** Per cent. */
  dutyPercent: string;
  ambient: string;
  /** Highest ambient; blank = the rated ambient. */
  ambientMax: string;
  /** Low and high end of the supply, % of rated; blank = the engine's 85 / 110. */
  supplyLowPct: string;
  supplyHighPct: string;
  /** On/off cycle period, s; blank = duty as average power. */
  cycleTime: string;
  /** '' = not stated (the engine assumes a diode). */
  suppressionKind: '' | NonNullable<CoilSpec['suppression']>['kind'];
  /** Zener or TVS clamp voltage, V (a diode's forward drop when the kind is diode; blank = 0.7 V). */
  clampVoltage: string;
  insulationClass: string;
  /** Blank: fill the bobbin. */
  turns: string;
  useCircuit: boolean;
  mu: string;
  saturation: string;
  ironPath: string;
  airGap: string;
  gapCount: string;
  area: string;
  /** The iron's B–H curve, [H A/m, B T] (from the core library), or null for the linear μr model. */
  bhCurve: [number, number][] | null;
};

/** Spec fields the form does not show; carried through unchanged from where the form started. */
export type SpecExtras = Pick<CoilSpec, 'overallDiameter' | 'heatTransferCoefficient' | 'hotSpotAllowance' | 'fillFactor'>;

export const AWG_GAUGES = Array.from({ length: AWG_GAUGE_MAX - AWG_GAUGE_MIN + 1 }, (_, i) => AWG_GAUGE_MIN + i);
export const METRIC_DIAMETERS_MM = METRIC_NOMINAL_DIAMETERS_MM;

/** A number as typed: '' and junk are NaN, which the contract refuses with its own message. */
function num(text: string): number {
  const t = text.trim().replace(',', '.');
  if (t === '') return Number.NaN;
  return Number(t);
}

/** A value in the user's units for a text field: enough decimals to round-trip, no trailing zeros. */
function text(value: number, digits: number): string {
  if (!Number.isFinite(value)) return '';
  return String(Number(value.toFixed(digits)));
}

const lengthDigits = (p: UnitPreferences) => (p.lengthUnit === 'mm' ? 4 : 5);

export function specToValues(spec: CoilSpec, p: UnitPreferences): DraftValues {
  const L = (m: number | undefined) => (m === undefined ? '' : text(fromMetres(m, p.lengthUnit), lengthDigits(p)));
  const m = spec.magneticCircuit;
  return {
    conductor: spec.conductor,
    standard: spec.wire.standard,
    gauge: spec.wire.standard === 'AWG' ? String(spec.wire.gauge) : '28',
    diameterMm: spec.wire.standard === 'metric' ? text(spec.wire.diameter * 1000, 4) : '0.315',
    insulationGrade: String(spec.insulationGrade) as DraftValues['insulationGrade'],
    pattern: spec.pattern,
    packing: spec.packingFactor === undefined ? '' : text(spec.packingFactor, 4),
    bobbinInner: L(spec.bobbin.innerDiameter),
    bobbinOuter: L(spec.bobbin.outerDiameter),
    bobbinLength: L(spec.bobbin.length),
    // Blank when the spec names no leads, so a saved spec shown again reads as unchanged.
    leadLength: L(spec.leadLength),
    driveKind: spec.drive.kind,
    volts: spec.drive.kind === 'voltage' ? text(spec.drive.volts, 4) : '',
    amps: spec.drive.kind === 'current' ? text(spec.drive.amps, 5) : '',
    dutyPercent: text(spec.dutyCycle * 100, 3),
    ambient: text(fromCelsius(spec.ambient, p.temperatureUnit), 2),
    ambientMax: spec.ambientMax === undefined ? '' : text(fromCelsius(spec.ambientMax, p.temperatureUnit), 2),
    supplyLowPct: spec.supplyTolerance ? text(spec.supplyTolerance.low * 100, 3) : '',
    supplyHighPct: spec.supplyTolerance ? text(spec.supplyTolerance.high * 100, 3) : '',
    cycleTime: spec.cycleTime === undefined ? '' : text(spec.cycleTime, 3),
    suppressionKind: spec.suppression?.kind ?? '',
    clampVoltage: spec.suppression?.clampVoltage === undefined ? '' : text(spec.suppression.clampVoltage, 3),
    insulationClass: String(spec.insulationClass),
    turns: spec.turns === undefined ? '' : String(spec.turns),
    useCircuit: m !== undefined,
    mu: m ? text(m.relativePermeability, 3) : '',
    saturation: m ? text(m.saturationFluxDensity, 4) : '',
    ironPath: m ? L(m.ironPathLength) : '',
    airGap: m ? L(m.airGap) : '',
    gapCount: m ? String(m.gapCount) : '',
    area: m ? text(fromSquareMetres(m.area, p.lengthUnit), p.lengthUnit === 'mm' ? 3 : 6) : '',
    bhCurve: m?.bhCurve ?? null,
  };
}

export function extrasOf(spec: CoilSpec): SpecExtras {
  const out: SpecExtras = {};
  if (spec.overallDiameter !== undefined) out.overallDiameter = spec.overallDiameter;
  if (spec.heatTransferCoefficient !== undefined) out.heatTransferCoefficient = spec.heatTransferCoefficient;
  if (spec.hotSpotAllowance !== undefined) out.hotSpotAllowance = spec.hotSpotAllowance;
  if (spec.fillFactor !== undefined) out.fillFactor = spec.fillFactor;
  return out;
}

/**
 * The exact SI value behind each text the form was filled with. A field the engineer has not
 * touched sends its exact value back, so showing a spec in inches (or °F) and saving it again
 * never changes it by the rounding of the text.
 */
export type Anchors = Partial<Record<keyof DraftValues, { text: string; si: number }>>;

export function anchorsOf(spec: CoilSpec, p: UnitPreferences): Anchors {
  const v = specToValues(spec, p);
  const m = spec.magneticCircuit;
  const pairs: [keyof DraftValues, number | undefined][] = [
    ['bobbinInner', spec.bobbin.innerDiameter],
    ['bobbinOuter', spec.bobbin.outerDiameter],
    ['bobbinLength', spec.bobbin.length],
    ['leadLength', spec.leadLength],
    ['packing', spec.packingFactor],
    ['ambientMax', spec.ambientMax],
    ['supplyLowPct', spec.supplyTolerance?.low],
    ['supplyHighPct', spec.supplyTolerance?.high],
    ['cycleTime', spec.cycleTime],
    ['clampVoltage', spec.suppression?.clampVoltage],
    ['volts', spec.drive.kind === 'voltage' ? spec.drive.volts : undefined],
    ['amps', spec.drive.kind === 'current' ? spec.drive.amps : undefined],
    ['dutyPercent', spec.dutyCycle],
    ['ambient', spec.ambient],
    ['mu', m?.relativePermeability],
    ['saturation', m?.saturationFluxDensity],
    ['ironPath', m?.ironPathLength],
    ['airGap', m?.airGap],
    ['area', m?.area],
  ];
  const out: Anchors = {};
  for (const [field, si] of pairs) if (si !== undefined) out[field] = { text: String(v[field]), si };
  return out;
}

/** The request the values stand for (not yet checked). */
export function valuesToSpecInput(v: DraftValues, p: UnitPreferences, extras: SpecExtras, anchors: Anchors = {}): unknown {
  // Untouched fields give back their exact SI value; edited ones are converted from the text.
  const exact = (field: keyof DraftValues, convert: (t: string) => number) => {
    const a = anchors[field];
    return a && a.text === v[field] ? a.si : convert(String(v[field]));
  };
  const m = (t: string) => toMetres(num(t), p.lengthUnit);
  const L = (field: keyof DraftValues) => exact(field, m);
  const wire = v.standard === 'AWG' ? { standard: 'AWG', gauge: num(v.gauge) } : { standard: 'metric', diameter: num(v.diameterMm) / 1000 };
  const spec: Record<string, unknown> = {
    conductor: v.conductor,
    wire,
    insulationGrade: Number(v.insulationGrade),
    bobbin: { innerDiameter: L('bobbinInner'), outerDiameter: L('bobbinOuter'), length: L('bobbinLength') },
    pattern: v.pattern,
    drive: v.driveKind === 'voltage' ? { kind: 'voltage', volts: exact('volts', num) } : { kind: 'current', amps: exact('amps', num) },
    dutyCycle: exact('dutyPercent', (t) => num(t) / 100),
    ambient: exact('ambient', (t) => toCelsius(num(t), p.temperatureUnit)),
    insulationClass: Number(v.insulationClass),
  };
  // An overall diameter from a spool's data sheet belongs to one wire size only.
  if (extras.overallDiameter !== undefined) spec.overallDiameter = extras.overallDiameter;
  if (extras.heatTransferCoefficient !== undefined) spec.heatTransferCoefficient = extras.heatTransferCoefficient;
  if (extras.hotSpotAllowance !== undefined) spec.hotSpotAllowance = extras.hotSpotAllowance;
  if (v.pattern === 'random' && extras.fillFactor !== undefined) spec.fillFactor = extras.fillFactor;
  if (v.pattern === 'random' && v.packing.trim() !== '') spec.packingFactor = exact('packing', num);
  if (v.ambientMax.trim() !== '') spec.ambientMax = exact('ambientMax', (t) => toCelsius(num(t), p.temperatureUnit));
  if (v.supplyLowPct.trim() !== '' || v.supplyHighPct.trim() !== '') {
    spec.supplyTolerance = {
      low: v.supplyLowPct.trim() === '' ? 0.85 : exact('supplyLowPct', (t) => num(t) / 100),
      high: v.supplyHighPct.trim() === '' ? 1.1 : exact('supplyHighPct', (t) => num(t) / 100),
    };
  }
  if (v.cycleTime.trim() !== '') spec.cycleTime = exact('cycleTime', num);
  if (v.suppressionKind !== '') {
    spec.suppression = { kind: v.suppressionKind, ...(v.suppressionKind !== 'none' && v.clampVoltage.trim() !== '' && { clampVoltage: exact('clampVoltage', num) }) };
  }
  if (v.leadLength.trim() !== '') spec.leadLength = L('leadLength');
  if (v.turns.trim() !== '') spec.turns = num(v.turns);
  if (v.useCircuit) {
    spec.magneticCircuit = {
      relativePermeability: exact('mu', num),
      saturationFluxDensity: exact('saturation', num),
      ironPathLength: L('ironPath'),
      airGap: L('airGap'),
      gapCount: num(v.gapCount),
      area: exact('area', (t) => toSquareMetres(num(t), p.lengthUnit)),
      ...(v.bhCurve && { bhCurve: v.bhCurve }),
    };
  }
  return spec;
}

/** Restates the contract's messages for a person typing in their own units. */
function rewrite(issue: { path: PropertyKey[]; message: string; code: string }): string | undefined {
  if (issue.code === 'invalid_type') return 'Enter a number';
  return undefined;
}

/** Values → checked CoilSpec, or the issues at the spec's paths. */
export function draftSchema(p: UnitPreferences, extras: SpecExtras, anchors: Anchors = {}) {
  return throughContract((v: DraftValues) => valuesToSpecInput(v, p, extras, anchors), CoilSpecSchema, rewrite);
}

/** Form field name → the spec path its messages arrive at. */
export const FIELD_PATHS: Record<string, keyof DraftValues> = {
  conductor: 'conductor',
  'wire.gauge': 'gauge',
  'wire.diameter': 'diameterMm',
  wire: 'gauge',
  insulationGrade: 'insulationGrade',
  pattern: 'pattern',
  fillFactor: 'packing',
  packingFactor: 'packing',
  ambientMax: 'ambientMax',
  supplyTolerance: 'supplyLowPct',
  'supplyTolerance.low': 'supplyLowPct',
  'supplyTolerance.high': 'supplyHighPct',
  cycleTime: 'cycleTime',
  suppression: 'suppressionKind',
  'suppression.kind': 'suppressionKind',
  'suppression.clampVoltage': 'clampVoltage',
  'bobbin.innerDiameter': 'bobbinInner',
  'bobbin.outerDiameter': 'bobbinOuter',
  'bobbin.length': 'bobbinLength',
  leadLength: 'leadLength',
  'drive.volts': 'volts',
  'drive.amps': 'amps',
  dutyCycle: 'dutyPercent',
  ambient: 'ambient',
  insulationClass: 'insulationClass',
  turns: 'turns',
  'magneticCircuit.relativePermeability': 'mu',
  'magneticCircuit.saturationFluxDensity': 'saturation',
  'magneticCircuit.ironPathLength': 'ironPath',
  'magneticCircuit.airGap': 'airGap',
  'magneticCircuit.gapCount': 'gapCount',
  'magneticCircuit.area': 'area',
};

/** Issues (or a server's `fields`) keyed by spec path → messages keyed by form field. */
export function messagesByField(byPath: Record<string, string>): { fields: Partial<Record<keyof DraftValues, string>>; other: string[] } {
  const fields: Partial<Record<keyof DraftValues, string>> = {};
  const other: string[] = [];
  for (const [rawPath, message] of Object.entries(byPath)) {
    const path = rawPath.replace(/^spec\./, '');
    const field = FIELD_PATHS[path];
    if (field && !fields[field]) fields[field] = message;
    else if (!field) other.push(path && path !== '_' ? `${path}: ${message}` : message);
  }
  return { fields, other };
}

// ── Wire sizes in words ───────────────────────────────────────────────────────────────────

export function wireSizeLabel(size: WireSizeValue): string {
  return size.standard === 'AWG' ? `AWG ${size.gauge}` : `${formatNumber(size.diameter * 1000, size.diameter * 1000 < 0.1 ? 3 : size.diameter * 1000 < 1 ? 3 : 2)}\u00a0mm`;
}

export const sameWire = (a: WireSizeValue, b: WireSizeValue) =>
  a.standard === b.standard && (a.standard === 'AWG' ? a.gauge === (b as { gauge: number }).gauge : Math.abs(a.diameter - (b as { diameter: number }).diameter) < 1e-9);

/** A form change that puts this wire size in. */
export function wireValues(size: WireSizeValue): Partial<DraftValues> {
  return size.standard === 'AWG'
    ? { standard: 'AWG', gauge: String(size.gauge) }
    : { standard: 'metric', diameterMm: String(Number((size.diameter * 1000).toFixed(4))) };
}

/** JSON with sorted keys: two specs with the same content give the same text. */
export function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => a.localeCompare(b));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}
