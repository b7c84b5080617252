/**
 * The shop's look on paper, shared by every PDF drawn with pdfkit (shipping documents; the
 * traveler keeps its own page layout but the same colours and fonts): Barlow embedded with Noto
 * fallback per character, a graphite header band with the copper rule, section titles, key-value
 * blocks, ruled tables that break across pages, the cautions box and a footer on every page.
 */
import PDFDocument from 'pdfkit';
import { FONT_FILES, fontData, fontRuns, type FontName } from '../travelers/fonts';

export const INK = '#1e2126';
export const MUTED = '#5b6169';
export const RULE = '#c9cdd2';
export const ACCENT = '#b8632f';
export const BAND = '#23272d';

type WriteOpts = { font?: FontName; size?: number; color?: string; x?: number; y?: number; width?: number; align?: 'left' | 'right' | 'center' };

export function createCanvas(opts: { paper: 'A4' | 'LETTER'; title: string; author: string; subject?: string }) {
  const doc = new PDFDocument({
    size: opts.paper === 'LETTER' ? 'LETTER' : 'A4',
    margins: { top: 36, bottom: 40, left: 40, right: 40 },
    info: { Title: opts.title, Author: opts.author, Subject: opts.subject ?? '', Creator: 'Spoolwright' },
    bufferPages: true,
  });
  for (const name of Object.keys(FONT_FILES) as FontName[]) doc.registerFont(name, fontData(name));
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;

  /** Text with per-character font fallback, at (x, y) or flowing from the current position. */
  const write = (text: string, o: WriteOpts = {}) => {
    const runs = fontRuns(text, o.font ?? 'Barlow');
    doc.fontSize(o.size ?? 9).fillColor(o.color ?? INK);
    runs.forEach((run, i) => {
      doc.font(run.font);
      const more = i < runs.length - 1;
      if (i === 0 && o.x !== undefined) doc.text(run.text, o.x, o.y, { width: o.width, align: o.align, continued: more, lineBreak: o.width !== undefined });
      else doc.text(run.text, { continued: more, width: o.width, align: o.align });
    });
  };

  /** A small warning triangle, drawn (no font has to carry it). */
  const mark = (x: number, y: number) => {
    doc.save().polygon([x + 4, y + 1.5], [x + 8.5, y + 9], [x - 0.5, y + 9]).fill(ACCENT).restore();
  };

  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const ensureSpace = (h: number) => {
    if (doc.y + h > bottom()) {
      doc.addPage();
      doc.y = doc.page.margins.top;
    }
  };

  /** A section heading, kept on the same page as the first rows under it. */
  const sectionTitle = (title: string, keepWith = 60) => {
    ensureSpace(20 + keepWith);
    doc.moveDown(0.6);
    const y = doc.y;
    doc.rect(left, y, 3, 12).fill(ACCENT);
    write(title, { font: 'Barlow-Bold', size: 10, x: left + 8, y: y + 0.5, color: INK });
    doc.y = y + 17;
  };

  /** The header band: shop name, the document's kind, its big number, and an image at the right (a barcode). */
  const header = (kind: string, number: string, image?: Buffer) => {
    const top = doc.page.margins.top;
    doc.rect(left, top, width, 74).fill(BAND);
    doc.rect(left, top + 74, width, 3).fill(ACCENT);
    write(opts.author, { font: 'Barlow-SemiBold', size: 11, color: '#ffffff', x: left + 12, y: top + 10 });
    write(kind, { font: 'Barlow-SemiBold', size: 8, color: '#c8ccd1', x: left + 12, y: top + 28 });
    write(number, { font: 'Barlow-Bold', size: 24, color: '#ffffff', x: left + 12, y: top + 40 });
    if (image) {
      const w = 200;
      doc.rect(left + width - w - 8, top + 8, w, 58).fill('#ffffff');
      doc.image(image, left + width - w - 4, top + 12, { fit: [w - 8, 50], align: 'center', valign: 'center' });
    }
    doc.y = top + 86;
  };

  /** Labelled values in columns. */
  const kv = (pairs: [string, string][], cols: number) => {
    const colW = width / cols;
    let rowY = doc.y;
    for (let i = 0; i < pairs.length; i += cols) {
      let rowH = 28;
      pairs.slice(i, i + cols).forEach(([k, v], c) => {
        const x = left + c * colW;
        write(k, { size: 7.5, color: MUTED, x, y: rowY, width: colW - 8 });
        write(v, { font: 'Barlow-SemiBold', size: 10, x, y: rowY + 10, width: colW - 8 });
        rowH = Math.max(rowH, doc.y - rowY + 4);
      });
      rowY += rowH;
    }
    doc.y = rowY;
  };

  /**
   * A ruled table: headers, then rows of cells (text), column widths summing to the page width.
   * Rows grow with their text; a row that does not fit starts a new page with the headers again.
   */
  const table = (headers: string[], widths: number[], rows: string[][], o: { size?: number; bold?: number[] } = {}) => {
    const size = o.size ?? 8.5;
    const head = () => {
      let x = left;
      const y = doc.y;
      doc.font('Barlow').fontSize(7.5);
      const h = Math.max(...headers.map((t, i) => doc.heightOfString(t, { width: widths[i] - 6 })));
      headers.forEach((t, i) => {
        write(t, { size: 7.5, color: MUTED, x: x + 3, y, width: widths[i] - 6 });
        x += widths[i];
      });
      doc.y = y + h + 3;
    };
    ensureSpace(40);
    head();
    for (const row of rows) {
      const heights = row.map((cell, i) => {
        doc.font(o.bold?.includes(i) ? 'Barlow-SemiBold' : 'Barlow').fontSize(size);
        return doc.heightOfString(cell || ' ', { width: widths[i] - 6 });
      });
      const h = Math.max(...heights) + 6;
      if (doc.y + h > bottom()) {
        doc.addPage();
        doc.y = doc.page.margins.top;
        head();
      }
      const y = doc.y;
      doc.moveTo(left, y).lineTo(left + width, y).lineWidth(0.5).strokeColor(RULE).stroke();
      let x = left;
      row.forEach((cell, i) => {
        write(cell, { font: o.bold?.includes(i) ? 'Barlow-SemiBold' : 'Barlow', size, x: x + 3, y: y + 3, width: widths[i] - 6 });
        x += widths[i];
      });
      doc.y = y + h;
    }
    doc.moveTo(left, doc.y).lineTo(left + width, doc.y).lineWidth(0.5).strokeColor(RULE).stroke();
    doc.y += 4;
  };

  /** A paragraph across the page. */
  const paragraph = (text: string, o: WriteOpts = {}) => {
    ensureSpace(24);
    write(text, { size: 9, x: left, y: doc.y, width, ...o });
    doc.y += 2;
  };

  /** The cautions, boxed in the accent colour. */
  const cautions = (lines: string[], title = 'Cautions') => {
    ensureSpace(40 + lines.length * 22);
    doc.moveDown(0.5);
    const boxY = doc.y;
    write(title, { font: 'Barlow-Bold', size: 9, color: '#8a3b12', x: left + 10, y: boxY + 8 });
    doc.y = boxY + 22;
    for (const c of lines) {
      mark(left + 10, doc.y);
      write(c, { size: 8.5, x: left + 22, y: doc.y, width: width - 32 });
    }
    const boxH = doc.y - boxY + 6;
    doc.rect(left, boxY, width, boxH).lineWidth(1.2).strokeColor(ACCENT).stroke();
    doc.y = boxY + boxH + 6;
  };

  /** Writes the footer on every page and finishes the document. */
  const finish = (footer: (page: number, pages: number) => string) => {
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      const y = doc.page.height - doc.page.margins.bottom + 14;
      const oldBottom = doc.page.margins.bottom;
      doc.page.margins.bottom = 0;
      write(footer(i + 1, range.count), { size: 7, color: MUTED, x: left, y, width, align: 'center' });
      doc.page.margins.bottom = oldBottom;
    }
    doc.end();
    return done;
  };

  return { doc, left, width, write, mark, ensureSpace, sectionTitle, header, kv, table, paragraph, cautions, finish };
}
export type Canvas = ReturnType<typeof createCanvas>;
