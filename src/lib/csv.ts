/**
 * CSV text by RFC 4180 ("Common Format and MIME Type for CSV Files"):
 *  - records end with CRLF (§2.1, §2.2);
 *  - a field holding a comma, a double quote, CR or LF is enclosed in double quotes (§2.6);
 *  - a double quote inside a quoted field is written as two double quotes (§2.7);
 *  - every record has the same number of fields (§2.4).
 * Beyond the RFC: a text cell that starts with = + - @ TAB or CR is prefixed with an apostrophe so
 * a spreadsheet does not run it as a formula (set `guardFormulas: false` to turn this off).
 */
export type CsvCell = string | number | boolean | Date | null | undefined;

export type CsvOptions = { guardFormulas?: boolean };

const NEEDS_QUOTES = /[",\r\n]/;
const FORMULA_START = /^[=+\-@\t\r]/;

export function csvField(value: CsvCell, opts: CsvOptions = {}): string {
  let text: string;
  if (value === null || value === undefined) text = '';
  else if (value instanceof Date) text = Number.isNaN(value.getTime()) ? '' : value.toISOString();
  else if (typeof value === 'number') text = Number.isFinite(value) ? String(value) : '';
  else if (typeof value === 'boolean') text = value ? 'true' : 'false';
  else {
    text = value;
    if ((opts.guardFormulas ?? true) && FORMULA_START.test(text)) text = `'${text}`;
  }
  return NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A header row and data rows → CSV text. Short rows are padded so every record has the header's width. */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[], opts: CsvOptions = {}): string {
  const width = header.length;
  const lines = [header.map((h) => csvField(h, { guardFormulas: false }))];
  for (const row of rows) {
    if (row.length > width) throw new Error(`A CSV row has ${row.length} fields; the header has ${width}`);
    const cells: string[] = [];
    for (let i = 0; i < width; i++) cells.push(csvField(row[i], opts));
    lines.push(cells);
  }
  return lines.map((cells) => cells.join(',')).join('\r\n') + '\r\n';
}

/** Offers CSV text to the browser as a file download. */
export function downloadCsv(filename: string, csv: string) {
  // A byte-order mark so spreadsheet programs read the file as UTF-8 (°, Ω, names with accents).
  const blob = new Blob(['\ufeff', csv], { type: 'text/csv;charset=utf-8' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename.endsWith('.csv') ? filename : `${filename}.csv`;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1_000);
}
