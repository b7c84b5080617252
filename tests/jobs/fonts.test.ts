import * as fontkit from 'fontkit';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CAUTIONS } from '../../jobs/travelers/render';
import { FONT_FILES, fontRuns, sfntFromWoff, uncovered } from '../../jobs/travelers/fonts';

describe('shipped fonts for PDFs', () => {
  it('unwraps each WOFF into a font fontkit reads with the same glyphs and metrics (W3C WOFF 1.0)', () => {
    for (const file of Object.values(FONT_FILES)) {
      const woff = fontkit.create(readFileSync(file)) as fontkit.Font;
      const sfnt = fontkit.create(sfntFromWoff(readFileSync(file))) as fontkit.Font;
      expect(sfnt.numGlyphs).toBe(woff.numGlyphs);
      expect(sfnt.unitsPerEm).toBe(woff.unitsPerEm);
      expect(sfnt.postscriptName).toBe(woff.postscriptName);
      const probe = 'Resistance 42 °C ±';
      expect(sfnt.layout(probe).advanceWidth).toBe(woff.layout(probe).advanceWidth);
    }
  });

  it('refuses a file that is not WOFF', () => {
    expect(() => sfntFromWoff(Buffer.from('not a font at all, certainly not one'))).toThrow(/not a WOFF/);
  });

  it('draws Greek and symbols with the fallback; the traveler’s cautions need no missing glyph', () => {
    const runs = fontRuns('63.5 Ω ± 10 %, 12 µH, α', 'Barlow');
    expect(runs.find((r) => r.text.includes('Ω'))?.font).toBe('Noto-Greek');
    expect(runs.find((r) => r.text.includes('α'))?.font).toBe('Noto-Greek');
    expect(runs.find((r) => r.text.includes('±'))?.font).toBe('Barlow');
    // Subscript digits and the warning triangle are in none of the shipped subsets.
    expect(uncovered('R₂₀ ▲')).toEqual(['₂', '₀', '▲']);
    for (const c of CAUTIONS) expect(uncovered(c)).toEqual([]);
  });
});
