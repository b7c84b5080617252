import * as fontkit from 'fontkit';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

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
