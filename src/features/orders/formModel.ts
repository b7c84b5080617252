/**
 * The order form's values and their way to the API. The form names its fields like the request
 * (`lines.0.requirement.bobbin.innerDiameter`), so the contract's issues and the server's
 * `fields` land on the same inputs. Values are text as typed, in the user's units (mm or in,
 * °C or °F, duty in per cent); `toRequest` converts them to SI at the edge. A value shown
 * unchanged from a saved line keeps its exact SI number (no drift from rounding for display).
 */
import { AMBIENT_MAX_C, AMBIENT_MIN_C, THERMAL_CLASS_VALUES } from '../../contracts/coil';
import {
  createOrderRequest,
  DEFAULT_TOLERANCE_PERCENT,
  type CreateOrderRequest,
  type OrderDetail,
  type Requirement,
} from '../../contracts/orders';
import { parseNumber, throughContract } from '../../lib/forms';
import { todayIso, addDaysIso } from '../../lib/format';
import {
  formatNumber,
  fromCelsius,
  fromMetres,
  fromSquareMetres,
  temperatureSymbol,
  toCelsius,
  toMetres,
  toSquareMetres,
  type LengthUnit,
  type TemperatureUnit,
} from '../../lib/units';

export type Units = { lengthUnit: LengthUnit; temperatureUnit: TemperatureUnit };

export type RequirementForm = {
  drive: { kind: 'voltage' | 'current'; volts: string; amps: string };
  /** Per cent. */
  dutyCycle: string;
  ambient: string;
  insulationClass: string;
  fit: 'bobbin' | 'envelope';
  bobbin: { innerDiameter: string; outerDiameter: string; length: string };
  conductor: {
    material: '' | 'copper' | 'aluminium';
    wire: { standard: '' | 'AWG' | 'metric'; gauge: string; /** mm, the wire's trade name */ diameter: string };
    insulationGrade: '' | '1' | '2' | '3';
  };
  /** The coil works in an iron circuit (always so for a pull, or a field in the gap). */
  hasCircuit: boolean;
  magneticCircuit: { relativePermeability: string; saturationFluxDensity: string; ironPathLength: string; airGap: string; gapCount: string; area: string };
  /** Ω at 20 °C; empty when the customer names none. */
  resistance: string;
  target: { kind: 'ampereTurns' | 'pull' | 'field'; ampereTurns: string; force: string; fluxDensity: string; at: 'centre' | 'gap' };
};

export type LineForm = {
  id?: number;
  quantity: string;
  title: string;
  customerPartNumber: string;
  tolerancePercent: string;
  terminationNotes: string;
  leadNotes: string;
  requirement: RequirementForm;
};

export type OrderFormValues = {
  customerId: string;
  purchaseOrder: string;
  orderDate: string;
  dueDate: string;
  notes: string;
  lines: LineForm[];
};

export const needsCircuit = (t: RequirementForm['target']) => t.kind === 'pull' || (t.kind === 'field' && t.at === 'gap');

// ── numbers as shown and as typed ───────────────────────────────────────────

/** Decimals shown when a saved value is put back into an input. */
const LENGTH_INPUT_DIGITS: Record<LengthUnit, number> = { mm: 3, in: 4 };
const AREA_INPUT_DIGITS: Record<LengthUnit, number> = { mm: 2, in: 5 };

/** A number for an input: at most `digits` decimals, no trailing zeros, no grouping. */
export function inputNumber(n: number | undefined, digits = 6): string {
  if (n === undefined || !Number.isFinite(n)) return '';
  return String(Number(n.toFixed(digits)));
}

/** Text as typed → a number (shared with other forms: src/lib/forms.ts). */
export { parseNumber };

function makeConverters(units: Units) {
  const { lengthUnit: L, temperatureUnit: T } = units;
  const lengthText = (m: number | undefined) => (m === undefined ? '' : inputNumber(fromMetres(m, L), LENGTH_INPUT_DIGITS[L]));
  const areaText = (m2: number | undefined) => (m2 === undefined ? '' : inputNumber(fromSquareMetres(m2, L), AREA_INPUT_DIGITS[L]));
  const tempText = (c: number | undefined) => (c === undefined ? '' : inputNumber(fromCelsius(c, T), 2));
  /** Typed length → metres, or the saved metres when the text is what was shown for them. */
  const length = (s: string, saved?: number) => {
    if (saved !== undefined && s.trim() === lengthText(saved)) return saved;
    const n = parseNumber(s);
    return n === undefined || Number.isNaN(n) ? n : toMetres(n, L);
  };
  const area = (s: string, saved?: number) => {
    if (saved !== undefined && s.trim() === areaText(saved)) return saved;
    const n = parseNumber(s);
    return n === undefined || Number.isNaN(n) ? n : toSquareMetres(n, L);
  };
  const temperature = (s: string, saved?: number) => {
    if (saved !== undefined && s.trim() === tempText(saved)) return saved;
    const n = parseNumber(s);
    return n === undefined || Number.isNaN(n) ? n : toCelsius(n, T);
  };
  return { lengthText, areaText, tempText, length, area, temperature };
}

// ── defaults and saved orders → form values ─────────────────────────────────

export function emptyLine(): LineForm {
  return {
    quantity: '',
    title: '',
    customerPartNumber: '',
    tolerancePercent: String(DEFAULT_TOLERANCE_PERCENT),
    terminationNotes: '',
    leadNotes: '',
    requirement: {
      drive: { kind: 'voltage', volts: '', amps: '' },
      dutyCycle: '100',
      ambient: '',
      insulationClass: '155',
      fit: 'bobbin',
      bobbin: { innerDiameter: '', outerDiameter: '', length: '' },
      conductor: { material: '', wire: { standard: '', gauge: '', diameter: '' }, insulationGrade: '' },
      hasCircuit: false,
      magneticCircuit: { relativePermeability: '', saturationFluxDensity: '', ironPathLength: '', airGap: '', gapCount: '1', area: '' },
      resistance: '',
      target: { kind: 'ampereTurns', ampereTurns: '', force: '', fluxDensity: '', at: 'centre' },
    },
  };
}

export function emptyOrder(customerId = ''): OrderFormValues {
  const today = todayIso();
  return { customerId, purchaseOrder: '', orderDate: today, dueDate: addDaysIso(today, 28), notes: '', lines: [emptyLine()] };
}

function requirementToForm(r: Requirement, units: Units): RequirementForm {
  const c = makeConverters(units);
  const base = emptyLine().requirement;
  const m = r.magneticCircuit;
  const w = r.conductor?.wire;
  return {
    drive: { kind: r.drive.kind, volts: r.drive.kind === 'voltage' ? inputNumber(r.drive.volts) : '', amps: r.drive.kind === 'current' ? inputNumber(r.drive.amps) : '' },
    dutyCycle: inputNumber(r.dutyCycle * 100, 4),
    ambient: c.tempText(r.ambient),
    insulationClass: String(r.insulationClass),
    fit: r.fit,
    bobbin: { innerDiameter: c.lengthText(r.bobbin.innerDiameter), outerDiameter: c.lengthText(r.bobbin.outerDiameter), length: c.lengthText(r.bobbin.length) },
    conductor: {
      material: r.conductor?.material ?? '',
      wire: {
        standard: w?.standard ?? '',
        gauge: w?.standard === 'AWG' ? String(w.gauge) : '',
        diameter: w?.standard === 'metric' ? inputNumber(w.diameter * 1000, 4) : '',
      },
      insulationGrade: r.conductor?.insulationGrade ? (String(r.conductor.insulationGrade) as '1' | '2' | '3') : '',
    },
    hasCircuit: Boolean(m),
    magneticCircuit: m
      ? {
          relativePermeability: inputNumber(m.relativePermeability),
          saturationFluxDensity: inputNumber(m.saturationFluxDensity),
          ironPathLength: c.lengthText(m.ironPathLength),
          airGap: c.lengthText(m.airGap),
          gapCount: String(m.gapCount),
          area: c.areaText(m.area),
        }
      : base.magneticCircuit,
    resistance: inputNumber(r.resistance),
    target: {
      ...base.target,
      kind: r.target.kind,
      ampereTurns: r.target.kind === 'ampereTurns' ? inputNumber(r.target.ampereTurns) : '',
      force: r.target.kind === 'pull' ? inputNumber(r.target.force) : '',
      fluxDensity: r.target.kind === 'field' ? inputNumber(r.target.fluxDensity) : '',
      at: r.target.kind === 'field' ? r.target.at : 'centre',
    },
  };
}

export function orderToForm(o: OrderDetail, units: Units): OrderFormValues {
  return {
    customerId: String(o.customer.id),
    purchaseOrder: o.purchaseOrder,
    orderDate: o.orderDate,
    dueDate: o.dueDate,
    notes: o.notes ?? '',
    lines: o.lines.map((l) => ({
      id: l.id,
      quantity: String(l.quantity),
      title: l.title,
      customerPartNumber: l.customerPartNumber,
      tolerancePercent: inputNumber(l.tolerancePercent),
      terminationNotes: l.terminationNotes,
      leadNotes: l.leadNotes,
      requirement: requirementToForm(l.requirement, units),
    })),
  };
}

// ── form values → the request (SI) ──────────────────────────────────────────

/** Saved requirements by line id, so unchanged values go back exactly as they were. */
export type SavedRequirements = ReadonlyMap<number, Requirement>;

function requirementToRequest(r: RequirementForm, units: Units, saved?: Requirement) {
  const c = makeConverters(units);
  const num = parseNumber;
  const withCircuit = r.hasCircuit || needsCircuit(r.target);
  const m = r.magneticCircuit;
  const sm = saved?.magneticCircuit;
  const material = r.conductor.material || undefined;
  const grade = r.conductor.insulationGrade ? Number(r.conductor.insulationGrade) : undefined;
  const std = r.conductor.wire.standard;
  const metricMm = num(r.conductor.wire.diameter);
  const wire =
    std === 'AWG'
      ? { standard: 'AWG' as const, gauge: num(r.conductor.wire.gauge) }
      : std === 'metric'
        ? { standard: 'metric' as const, diameter: metricMm === undefined || Number.isNaN(metricMm) ? metricMm : metricMm * 1e-3 }
        : undefined;
  const conductor = material || grade || wire ? { material, wire, insulationGrade: grade } : undefined;
  const t = r.target;
  const target =
    t.kind === 'ampereTurns'
      ? { kind: t.kind, ampereTurns: num(t.ampereTurns) }
      : t.kind === 'pull'
        ? { kind: t.kind, force: num(t.force) }
        : { kind: t.kind, fluxDensity: num(t.fluxDensity), at: t.at };
  const duty = num(r.dutyCycle);
  return {
    drive: r.drive.kind === 'voltage' ? { kind: 'voltage', volts: num(r.drive.volts) } : { kind: 'current', amps: num(r.drive.amps) },
    dutyCycle: duty === undefined || Number.isNaN(duty) ? duty : saved && r.dutyCycle.trim() === inputNumber(saved.dutyCycle * 100, 4) ? saved.dutyCycle : duty / 100,
    ambient: c.temperature(r.ambient, saved?.ambient),
    insulationClass: r.insulationClass === '' ? undefined : Number(r.insulationClass),
    fit: r.fit,
    bobbin: {
      innerDiameter: c.length(r.bobbin.innerDiameter, saved?.bobbin.innerDiameter),
      outerDiameter: c.length(r.bobbin.outerDiameter, saved?.bobbin.outerDiameter),
      length: c.length(r.bobbin.length, saved?.bobbin.length),
    },
    conductor,
    magneticCircuit: withCircuit
      ? {
          relativePermeability: num(m.relativePermeability),
          saturationFluxDensity: num(m.saturationFluxDensity),
          ironPathLength: c.length(m.ironPathLength, sm?.ironPathLength),
          airGap: c.length(m.airGap, sm?.airGap),
          gapCount: num(m.gapCount),
          area: c.area(m.area, sm?.area),
        }
      : undefined,
    resistance: num(r.resistance),
    target,
  };
}

export function toRequest(v: OrderFormValues, units: Units, saved: SavedRequirements = new Map()) {
  return {
    customerId: v.customerId ? Number(v.customerId) : undefined,
    purchaseOrder: v.purchaseOrder,
    orderDate: v.orderDate || undefined,
    dueDate: v.dueDate,
    notes: v.notes,
    lines: v.lines.map((l) => ({
      ...(l.id !== undefined && { id: l.id }),
      quantity: num0(l.quantity),
      title: l.title,
      customerPartNumber: l.customerPartNumber,
      tolerancePercent: parseNumber(l.tolerancePercent),
      terminationNotes: l.terminationNotes,
      leadNotes: l.leadNotes,
      requirement: requirementToRequest(l.requirement, units, l.id !== undefined ? saved.get(l.id) : undefined),
    })),
  };
}
const num0 = parseNumber;

// ── messages in the user's words and units ──────────────────────────────────

function rewrite(units: Units) {
  const T = units.temperatureUnit;
  const lo = formatNumber(fromCelsius(AMBIENT_MIN_C, T), 0);
  const hi = formatNumber(fromCelsius(AMBIENT_MAX_C, T), 0);
  return (issue: { path: PropertyKey[]; message: string; code: string }) => {
    const last = String(issue.path[issue.path.length - 1] ?? '');
    if (last === 'dutyCycle') return 'Duty cycle: above 0 % and at most 100 %';
    if (last === 'ambient') return `Ambient: a temperature from ${lo} to ${hi}\u00a0${temperatureSymbol(T)}`;
    if (last === 'insulationClass') return `Choose a thermal class (${THERMAL_CLASS_VALUES.join(', ')})`;
    if (last === 'insulationGrade') return 'Choose grade 1, 2 or 3';
    if (last === 'gapCount' && issue.code !== 'custom') return 'Gap count: a whole number, 0 or more';
    if (issue.code === 'invalid_type' && /^Invalid input/.test(issue.message)) return 'Enter a number';
    // The engine's messages start in lower case ("inner diameter must be …"); beside a field, a sentence.
    return issue.message.charAt(0).toUpperCase() + issue.message.slice(1);
  };
}

/** The form's schema: the values converted to SI, judged by the contract's createOrderRequest. */
export function orderFormSchema(units: Units, saved: SavedRequirements = new Map()) {
  return throughContract((v: OrderFormValues) => toRequest(v, units, saved), createOrderRequest, rewrite(units));
}

export type { CreateOrderRequest };
