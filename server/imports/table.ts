import { parse as parseCsv } from 'csv-parse/sync';
import type { UnitPreferences } from '../../src/contracts/auth';
import { IMPORT_MAX_ROWS, type ImportColumn } from '../../src/contracts/imports';
import { lengthSymbol, massUnitFor, toCelsius, toKilograms, toMetres, unitsInText } from '../../src/lib/units';

/** A quantity column is read in the unit its header names and reported in the user's. */
export type Quantity = 'length' | 'temperature' | 'mass';

export type ColumnDef = {
  key: string;
  quantity?: Quantity;
  required?: boolean;
  meaning: string;
  /** An example value, in SI for quantities (shown converted). */
  example: string | number;
};

const SUFFIXES: Record<Quantity, readonly string[]> = { length: ['mm', 'in'], temperature: ['c', 'f'], mass: ['kg', 'lb'] };

function suffixFor(q: Quantity, prefs: UnitPreferences) {
  if (q === 'length') return lengthSymbol(prefs.lengthUnit);
  if (q === 'temperature') return prefs.temperatureUnit.toLowerCase();
  return massUnitFor(prefs.lengthUnit);
}

/** The header a column has for this user ("bobbin_length_mm" or "bobbin_length_in"). */
export const headerOf = (c: ColumnDef, prefs: UnitPreferences) => (c.quantity ? `${c.key}_${suffixFor(c.quantity, prefs)}` : c.key);

/** SI → the user's unit, for examples and sentences. */
export function fromSi(q: Quantity, si: number, prefs: UnitPreferences): number {
  if (q === 'length') return prefs.lengthUnit === 'mm' ? si * 1000 : si / 0.0254;
  if (q === 'temperature') return prefs.temperatureUnit === 'C' ? si : (si * 9) / 5 + 32;
  return massUnitFor(prefs.lengthUnit) === 'kg' ? si : si / 0.45359237;
}

/** A value in the unit named by a header suffix → SI (m, °C, kg). */
function toSi(q: Quantity, suffix: string, v: number): number {
  if (q === 'length') return toMetres(v, suffix === 'in' ? 'in' : 'mm');
  if (q === 'temperature') return toCelsius(v, suffix === 'f' ? 'F' : 'C');
  return toKilograms(v, suffix === 'lb' ? 'lb' : 'kg');
}

export function describeColumns(defs: readonly ColumnDef[], prefs: UnitPreferences): ImportColumn[] {
  return defs.map((c) => ({
    name: headerOf(c, prefs),
    required: Boolean(c.required),
    meaning: c.meaning,
    example: typeof c.example === 'number' && c.quantity ? String(Number(fromSi(c.quantity, c.example, prefs).toPrecision(4))) : String(c.example),
  }));
}

/** A limit of a quantity column, in the user's unit ("at most 482 °F"). */
export function limitInUnits(q: Quantity, si: number, prefs: UnitPreferences): string {
  const v = Number(fromSi(q, si, prefs).toPrecision(4));
  const unit = q === 'length' ? lengthSymbol(prefs.lengthUnit) : q === 'temperature' ? (prefs.temperatureUnit === 'C' ? '°C' : '°F') : massUnitFor(prefs.lengthUnit);
  return `${v} ${unit}`;
}

/** A server sentence in the user's units: °C, K and mm as units.ts restates them, and kg as lb for inch users. */
export function say(text: string, prefs: UnitPreferences): string {
  let out = unitsInText(text, prefs);
  if (massUnitFor(prefs.lengthUnit) === 'lb') {
    out = out.replace(/(-?\d+(?:\.\d+)?)\s?kg\b/g, (_, v: string) => `${Number((Number(v) / 0.45359237).toPrecision(4))} lb`);
  }
  return out;
}

export type Problem = { column: string | null; message: string };

/** One data row: its spreadsheet number and its cells by column key; problems found while reading it. */
export class Row {
  problems: Problem[] = [];
  constructor(
    public readonly line: number,
    private readonly cells: Map<string, { header: string; value: string; suffix?: string }>,
    private readonly defs: Map<string, ColumnDef>,
    private readonly prefs: UnitPreferences,
  ) {}

  /** The header this row's file uses for a column (or the user's form of it when the file lacks it). */
  header(key: string) {
    const def = this.defs.get(key);
    return this.cells.get(key)?.header ?? (def ? headerOf(def, this.prefs) : key);
  }
  text(key: string): string {
    return this.cells.get(key)?.value ?? '';
  }
  has(key: string) {
    return this.text(key) !== '';
  }
  /** The quantity a column holds, if any. */
  quantityOf(key: string): Quantity | undefined {
    return this.defs.get(key)?.quantity;
  }
  problem(key: string | null, message: string) {
    this.problems.push({ column: key === null ? null : this.header(key), message });
  }
  /** A number (a quantity converted to SI from the header's unit); undefined when empty, NaN after a problem. */
  num(key: string, what: string): number | undefined {
    const raw = this.text(key);
    if (raw === '') return undefined;
    const v = Number(raw.replace(/\s/g, ''));
    if (!Number.isFinite(v)) {
      this.problem(key, `${what}: "${raw}" is not a number`);
      return Number.NaN;
    }
    const def = this.defs.get(key);
    const cell = this.cells.get(key);
    return def?.quantity && cell?.suffix ? toSi(def.quantity, cell.suffix, v) : v;
  }
  /** yes/no, true/false, 1/0, x/empty. */
  flag(key: string): boolean {
    const raw = this.text(key).toLowerCase();
    if (raw === '' || ['no', 'n', 'false', '0'].includes(raw)) return false;
    if (['yes', 'y', 'true', '1', 'x'].includes(raw)) return true;
    this.problem(key, `"${this.text(key)}": write yes or no`);
    return false;
  }
}

export type Table = { rows: Row[]; fileProblems: string[] };

function decode(buf: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buf);
  } catch {
    // A spreadsheet saved in the Windows code page rather than UTF-8.
    return new TextDecoder('windows-1252').decode(buf);
  }
}

const normalise = (h: string) => h.trim().toLowerCase().replace(/[\s\-]+/g, '_');

/**
 * Reads a CSV file (comma or semicolon separated, UTF-8 with or without BOM, or Windows-1252)
 * against the columns of an import: unknown and missing required columns are file problems;
 * quantity columns accept either unit (`…_mm` or `…_in`).
 */
export function readTable(buf: Buffer, defs: readonly ColumnDef[], prefs: UnitPreferences): Table {
  const text = decode(buf).replace(/^\uFEFF/, '');
  const firstLine = text.split(/\r?\n/, 1)[0] ?? '';
  const delimiter = firstLine.includes(';') && !firstLine.includes(',') ? ';' : ',';
  let records: string[][];
  try {
    records = parseCsv(text, { delimiter, relax_column_count: true, skip_empty_lines: true, trim: false });
  } catch (e) {
    return { rows: [], fileProblems: [`The file is not readable as CSV: ${(e as Error).message}`] };
  }
  if (records.length === 0) return { rows: [], fileProblems: ['The file is empty: it needs the header row of the template'] };

  const byKey = new Map(defs.map((d) => [d.key, d]));
  const header = records[0].map((h) => h.trim());
  const columns: ({ key: string; suffix?: string } | null)[] = [];
  const fileProblems: string[] = [];
  const seen = new Set<string>();
  for (const h of header) {
    const n = normalise(h);
    let found: { key: string; suffix?: string } | null = null;
    for (const d of defs) {
      if (!d.quantity && n === d.key) found = { key: d.key };
      if (d.quantity) for (const s of SUFFIXES[d.quantity]) if (n === `${d.key}_${s}`) found = { key: d.key, suffix: s };
    }
    if (n === '') found = null;
    else if (!found) fileProblems.push(`Unknown column "${h}" (the template's columns: ${defs.map((d) => headerOf(d, prefs)).join(', ')})`);
    else if (seen.has(found.key)) {
      fileProblems.push(`Column "${h}" appears twice`);
      found = null;
    } else seen.add(found.key);
    columns.push(found);
  }
  for (const d of defs) if (d.required && !seen.has(d.key)) fileProblems.push(`Missing column "${headerOf(d, prefs)}"`);

  const data = records.slice(1);
  if (data.length > IMPORT_MAX_ROWS) return { rows: [], fileProblems: [...fileProblems, `At most ${IMPORT_MAX_ROWS} rows in one import (this file has ${data.length})`] };
  const rows: Row[] = [];
  data.forEach((cells, i) => {
    if (cells.every((c) => c.trim() === '')) return;
    const map = new Map<string, { header: string; value: string; suffix?: string }>();
    columns.forEach((col, j) => {
      if (!col) return;
      // A cell our own CSV export guarded against formulas ('=…) reads back without the apostrophe.
      const value = (cells[j] ?? '').trim().replace(/^'(?=[=+\-@])/, '');
      map.set(col.key, { header: header[j], value, suffix: col.suffix });
    });
    rows.push(new Row(i + 2, map, byKey, prefs));
  });
  return { rows, fileProblems };
}
