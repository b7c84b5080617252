import * as fontkit from 'fontkit';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { inflateSync } from 'node:zlib';

/**
 * The fonts shipped with the app, for PDFs: Barlow for text, Noto Sans (latin and greek) as the
 * fallback for the symbols Barlow lacks (Ω, µ, ±, Greek letters …).
 */
const require = createRequire(import.meta.url);
const barlowDir = path.join(path.dirname(require.resolve('@fontsource/barlow/package.json')), 'files');
const notoDir = path.join(path.dirname(require.resolve('@fontsource/noto-sans/package.json')), 'files');

export const FONT_FILES = {
  Barlow: path.join(barlowDir, 'barlow-latin-400-normal.woff'),
  'Barlow-SemiBold': path.join(barlowDir, 'barlow-latin-600-normal.woff'),
  'Barlow-Bold': path.join(barlowDir, 'barlow-latin-700-normal.woff'),
  'Noto-Latin': path.join(notoDir, 'noto-sans-latin-400-normal.woff'),
  'Noto-Greek': path.join(notoDir, 'noto-sans-greek-400-normal.woff'),
  'Noto-Latin-Bold': path.join(notoDir, 'noto-sans-latin-700-normal.woff'),
  'Noto-Greek-Bold': path.join(notoDir, 'noto-sans-greek-700-normal.woff'),
} as const;
export type FontName = keyof typeof FONT_FILES;

/**
 * The code points a shipped subset file really holds: the `unicode-range` @fontsource declares
 * for it in its CSS (a subset's character map can list more than it draws).
 */
function declaredRanges(file: string): [number, number][] {
  const css = readFileSync(path.join(path.dirname(path.dirname(file)), path.basename(file).includes('-700-') ? '700.css' : path.basename(file).includes('-600-') ? '600.css' : '400.css'), 'utf8');
  const block = css.split('@font-face').find((b) => b.includes(path.basename(file)));
  const m = block?.match(/unicode-range:\s*([^;]+);/);
  if (!m) throw new Error(`No unicode-range for ${path.basename(file)}`);
  return m[1].split(',').map((part) => {
    const [a, b] = part.trim().replace(/^U\+/i, '').split('-');
    return [parseInt(a, 16), parseInt(b ?? a, 16)] as [number, number];
  });
}

type Face = { covers(cp: number): boolean };
const faces = new Map<FontName, Face>();
function face(name: FontName): Face {
  let f = faces.get(name);
  if (!f) {
    const font = fontkit.openSync(FONT_FILES[name]) as unknown as { hasGlyphForCodePoint(cp: number): boolean };
    const ranges = declaredRanges(FONT_FILES[name]);
    f = { covers: (cp) => ranges.some(([a, b]) => cp >= a && cp <= b) && font.hasGlyphForCodePoint(cp) };
    faces.set(name, f);
  }
  return f;
}

/** Characters none of the shipped fonts can draw (they would print as empty boxes). */
export function uncovered(text: string, primary: FontName = 'Barlow'): string[] {
  const bold = primary !== 'Barlow';
  const chain: FontName[] = [primary, bold ? 'Noto-Latin-Bold' : 'Noto-Latin', bold ? 'Noto-Greek-Bold' : 'Noto-Greek'];
  return [...new Set([...text].filter((ch) => ch.codePointAt(0)! > 0x20 && !chain.some((f) => face(f).covers(ch.codePointAt(0)!))))];
}

/**
 * Splits text into runs, each in the first font that has its characters: the Barlow weight asked
 * for, then Noto Sans latin, then Noto Sans greek.
 */
export function fontRuns(text: string, primary: FontName): { font: FontName; text: string }[] {
  const bold = primary !== 'Barlow';
  const chain: FontName[] = [primary, bold ? 'Noto-Latin-Bold' : 'Noto-Latin', bold ? 'Noto-Greek-Bold' : 'Noto-Greek'];
  const runs: { font: FontName; text: string }[] = [];
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    const font = cp <= 0x20 ? (runs.at(-1)?.font ?? primary) : (chain.find((f) => face(f).covers(cp)) ?? primary);
    const last = runs.at(-1);
    if (last && last.font === font) last.text += ch;
    else runs.push({ font, text: ch });
  }
  return runs;
}

/**
 * A WOFF 1.0 file unwrapped into the plain TrueType/OpenType font it carries (W3C WOFF File
 * Format 1.0, sections 3–5: a header, a table directory, each table zlib-compressed when that
 * made it smaller). Done once per process, so each PDF embeds fonts without inflating them again.
 */
export function sfntFromWoff(woff: Buffer): Buffer {
  if (woff.readUInt32BE(0) !== 0x774f4646) throw new Error('not a WOFF file');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const e = 44 + i * 20;
    const tag = woff.readUInt32BE(e);
    const offset = woff.readUInt32BE(e + 4);
    const compLength = woff.readUInt32BE(e + 8);
    const origLength = woff.readUInt32BE(e + 12);
    const checksum = woff.readUInt32BE(e + 16);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new Error('WOFF table length mismatch');
    tables.push({ tag, checksum, data });
  }
  tables.sort((a, b) => a.tag - b.tag);
  const pad4 = (n: number) => (n + 3) & ~3;
  const headerSize = 12 + 16 * numTables;
  const total = tables.reduce((n, t) => n + pad4(t.data.length), headerSize);
  const out = Buffer.alloc(total);
  const entrySelector = Math.floor(Math.log2(numTables));
  const searchRange = 2 ** entrySelector * 16;
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(searchRange, 6);
  out.writeUInt16BE(entrySelector, 8);
  out.writeUInt16BE(numTables * 16 - searchRange, 10);
  let offset = headerSize;
  tables.forEach((t, i) => {
    const r = 12 + i * 16;
    out.writeUInt32BE(t.tag, r);
    out.writeUInt32BE(t.checksum, r + 4);
    out.writeUInt32BE(offset, r + 8);
    out.writeUInt32BE(t.data.length, r + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return out;
}

const sfntCache = new Map<FontName, Buffer>();
/** The shipped fonts as plain font data, unwrapped once per process. */
export function fontData(name: FontName): Buffer {
  let b = sfntCache.get(name);
  if (!b) {
    b = sfntFromWoff(readFileSync(FONT_FILES[name]));
    sfntCache.set(name, b);
  }
  return b;
}
