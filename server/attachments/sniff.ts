import { fileTypeFromBuffer } from 'file-type';
import { ATTACHMENT_TYPES, type AttachmentContentType } from '../../src/contracts/orders';

export type Sniffed = { ok: true; contentType: AttachmentContentType } | { ok: false; what: string };

const ALLOWED_BY_SIGNATURE = new Set<string>(['application/pdf', 'image/png', 'image/jpeg']);

/** Names for what file-type finds, where its own would puzzle an office user. */
const DESCRIBE: Record<string, string> = {
  exe: 'a Windows program (EXE)',
  elf: 'a Linux program (ELF)',
  macho: 'a macOS program (Mach-O)',
  zip: 'a ZIP archive',
  gz: 'a gzip archive',
  '7z': 'a 7-Zip archive',
  rar: 'a RAR archive',
  docx: 'a Word document',
  xlsx: 'an Excel workbook',
  gif: 'a GIF image',
  tif: 'a TIFF image',
  webp: 'a WebP image',
};

// A text DXF opens with group code 0 and "SECTION", possibly after 999 comment groups;
// whitespace around codes and values and CRLF line ends are allowed.
const DXF_TEXT = /^\uFEFF?\s*(?:999[ \t]*\r?\n[^\r\n]*\r?\n\s*)*0[ \t]*\r?\n[ \t]*SECTION[ \t]*\r?\n/;
const DXF_BINARY = 'AutoCAD Binary DXF';
// ISO 10303-21 (STEP physical file) begins with this keyword.
const STEP_TEXT = /^\uFEFF?\s*ISO-10303-21;/;

/** Decides what a file is from its bytes alone (the name is never consulted). */
export async function sniffContent(buf: Buffer): Promise<Sniffed> {
  if (buf.length === 0) return { ok: false, what: 'an empty file' };
  const found = await fileTypeFromBuffer(buf);
  if (found) {
    if (ALLOWED_BY_SIGNATURE.has(found.mime)) return { ok: true, contentType: found.mime as AttachmentContentType };
    return { ok: false, what: DESCRIBE[found.ext] ?? `a ${found.ext.toUpperCase()} file (${found.mime})` };
  }
  const head = buf.subarray(0, 4096).toString('latin1');
  if (head.startsWith(DXF_BINARY)) return { ok: true, contentType: 'image/vnd.dxf' };
  if (DXF_TEXT.test(head)) return { ok: true, contentType: 'image/vnd.dxf' };
  if (STEP_TEXT.test(head)) return { ok: true, contentType: 'model/step' };
  // eslint-disable-next-line no-control-regex
  const printable = !/[\x00-\x08\x0E-\x1F]/.test(head);
  return { ok: false, what: printable ? 'a text file that is neither DXF nor STEP' : 'a file of unknown kind' };
}

export const ALLOWED_KINDS = Object.values(ATTACHMENT_TYPES).join(', ');
