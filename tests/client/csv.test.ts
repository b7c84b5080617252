// @vitest-environment node
/**
 * toCsv against RFC 4180 ("Common Format and MIME Type for Comma-Separated Values (CSV) Files"),
 * section 2, rule by rule; and a small RFC 4180 reader written here from the grammar in §2 (ABNF)
 * that must read back exactly what was written.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvField, toCsv } from '../../src/lib/csv';

/** A reader following RFC 4180 §2's ABNF: file = record *(CRLF record) [CRLF]. */
function parseRfc4180(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let i = 0;
  const field = (): string => {
    if (text[i] === '"') {
      let out = '';
      i++;
      for (;;) {
        if (i >= text.length) throw new Error('unterminated quoted field');
        if (text[i] === '"') {
          if (text[i + 1] === '"') {
            out += '"';
            i += 2;
          } else {
            i++;
            return out;
          }
        } else out += text[i++];
      }
    }
    let start = i;
    while (i < text.length && text[i] !== ',' && text[i] !== '\r' && text[i] !== '\n') {
      if (text[i] === '"') throw new Error(`bare quote at ${i}`);
      i++;
    }
    return text.slice(start, i);
  };
  while (i < text.length) {
    record.push(field());
    if (text[i] === ',') {
      i++;
      continue;
    }
    if (text.startsWith('\r\n', i)) {
      records.push(record);
      record = [];
      i += 2;
      continue;
    }
    if (i >= text.length) break;
    throw new Error(`unexpected ${JSON.stringify(text[i])} at ${i}`);
  }
  if (record.length) records.push(record);
  return records;
}

describe('toCsv (RFC 4180 §2)', () => {
  it('§2.1–2.2: each record on its own line, ended by CRLF, the last one too', () => {
    expect(toCsv(['a', 'b'], [['1', '2']])).toBe('a,b\r\n1,2\r\n');
  });

  it('§2.3: the header is the first record, same format as the others', () => {
    expect(toCsv(['Name', 'Role'], []).split('\r\n')[0]).toBe('Name,Role');
  });

  it('§2.4: every record has as many fields as the header (short rows padded)', () => {
    expect(toCsv(['a', 'b', 'c'], [['x']])).toBe('a,b,c\r\nx,,\r\n');
    expect(() => toCsv(['a'], [['x', 'y']])).toThrow(/header has 1/);
  });

  it('§2.5: plain fields are not quoted', () => {
    expect(csvField('winding')).toBe('winding');
  });

  it('§2.6: fields with commas, quotes, CR or LF are enclosed in double quotes', () => {
    expect(csvField('Quennell, Tobias')).toBe('"Quennell, Tobias"');
    expect(csvField('line one\nline two')).toBe('"line one\nline two"');
    expect(csvField('cr\rhere')).toBe('"cr\rhere"');
    expect(csvField('crlf\r\nhere')).toBe('"crlf\r\nhere"');
  });

  it('§2.7: a double quote inside a field is doubled', () => {
    expect(csvField('12" bobbin')).toBe('"12"" bobbin"');
    expect(csvField('"')).toBe('""""');
  });

  it('writes numbers, booleans, dates and empties plainly', () => {
    expect(toCsv(['n', 'b', 'd', 'e', 'u'], [[3.5, true, new Date('2026-01-02T03:04:05Z'), null, undefined]])).toBe(
      'n,b,d,e,u\r\n3.5,true,2026-01-02T03:04:05.000Z,,\r\n',
    );
  });

  it('keeps symbols intact (Ω, µ, ±, ², °)', () => {
    expect(toCsv(['v'], [['12.4 Ω ±5 %, 20 °C, 0.2 mm², 3 µH']])).toBe('v\r\n"12.4 Ω ±5 %, 20 °C, 0.2 mm², 3 µH"\r\n');
  });

  it('beyond the RFC: text that a spreadsheet would run as a formula is defused', () => {
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('+1')).toBe("'+1");
    expect(csvField('@sum')).toBe("'@sum");
    expect(csvField(-5)).toBe('-5'); // a number stays a number
    expect(csvField('=1', { guardFormulas: false })).toBe('=1');
  });

  it('an RFC 4180 reader gets back exactly the cells written (any text)', () => {
    const cell = fc.string({ unit: fc.constantFrom('a', 'Z', ' ', ',', '"', '\r', '\n', 'Ω', '°', '1', ';') });
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { maxLength: 6 }), (rows) => {
        const text = toCsv(['h1', 'h2', 'h3'], rows, { guardFormulas: false });
        expect(text.endsWith('\r\n')).toBe(true);
        expect(parseRfc4180(text)).toEqual([['h1', 'h2', 'h3'], ...rows]);
      }),
      { numRuns: 300 },
    );
  });
});
