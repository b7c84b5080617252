import { createHash } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import PDFDocument from 'pdfkit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ATTACHMENT_MAX_BYTES } from '../../src/contracts/orders';
import { attachments } from '../../server/db/schema';
import { makePng } from '../../server/seed/orders';
import { csrf, testApp } from '../helpers/app';
import { customerAgent, newCompany, newOrder } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let company: { id: number };
let order: Awaited<ReturnType<typeof newOrder>>;

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

function pdf(): Promise<Buffer> {
  return new Promise((resolve) => {
    const doc = new PDFDocument({ size: 'A7' });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.text('Test drawing');
    doc.end();
  });
}

/** A JPEG's opening: SOI and a JFIF APP0 segment (enough for content sniffing). */
const JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0', 'latin1'), Buffer.from([1, 1, 0, 0, 1, 0, 1, 0, 0]), Buffer.from([0xff, 0xd9])]);
const DXF_TEXT = Buffer.from('  0\r\nSECTION\r\n  2\r\nHEADER\r\n  9\r\n$ACADVER\r\n  1\r\nAC1015\r\n  0\r\nENDSEC\r\n  0\r\nEOF\r\n');
const DXF_COMMENTED = Buffer.from('999\nmade by a test\n0\nSECTION\n2\nENTITIES\n0\nENDSEC\n0\nEOF\n');
const DXF_BINARY = Buffer.concat([Buffer.from('AutoCAD Binary DXF\r\n\x1a\0', 'latin1'), Buffer.alloc(64, 1)]);
const STEP = Buffer.from("ISO-10303-21;\nHEADER;\nFILE_DESCRIPTION(('test bobbin'),'2;1');\nENDSEC;\nDATA;\nENDSEC;\nEND-ISO-10303-21;\n");
/** ELF and PE/MZ executable headers (the magic numbers of the two formats). */
const ELF = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(120)]);
const MZ = Buffer.concat([Buffer.from('MZ', 'latin1'), Buffer.alloc(254)]);

function upload(agent: Agent, orderId: number, body: Buffer, filename: string, lineId?: number) {
  const req = agent.post(`/api/orders/${orderId}/attachments`).set(csrf);
  if (lineId !== undefined) req.field('lineId', String(lineId));
  return req.attach('file', body, filename);
}

async function download(agent: Agent, id: number) {
  return agent
    .get(`/api/attachments/${id}`)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

beforeAll(async () => {
  office = await t.signIn('office');
  company = await newCompany(office, [{ name: 'Drawings Desk', email: 'd@example.test' }]);
  order = await newOrder(office, company.id);
});

describe('attachments', () => {
  it('round-trips a PDF byte for byte through the object store (sha256 equal)', async () => {
    const body = await pdf();
    const res = await upload(office, order.id, body, 'Bobbin drawing rev B.pdf');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toEqual({ id: expect.any(Number), filename: 'Bobbin drawing rev B.pdf', contentType: 'application/pdf', size: body.length });
    const row = await t.deps.db.query.attachments.findFirst({ where: eq(attachments.id, res.body.id) });
    expect(row!.storageKey).toMatch(new RegExp(`^orders/${order.id}/[0-9a-f-]{36}$`));
    expect(row!.sha256).toBe(sha(body));
    expect(sha(await t.deps.storage.getBuffer(row!.storageKey))).toBe(sha(body));

    const got = await download(await t.signIn('engineer'), res.body.id);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('application/pdf');
    expect(got.headers['content-disposition']).toBe('attachment; filename="Bobbin drawing rev B.pdf"');
    expect(sha(got.body as Buffer)).toBe(sha(body));

    const detail = await office.get(`/api/orders/${order.id}`);
    expect(detail.body.order.attachments.find((a: { id: number }) => a.id === res.body.id)).toMatchObject({ sha256: sha(body), uploadedBy: { name: expect.any(String) } });
    expect(detail.body.order.events[0]).toMatchObject({ kind: 'attachment_added', changes: { attachment: [null, 'Bobbin drawing rev B.pdf'] } });
  });

  it('accepts PNG, JPEG, DXF (text with CRLF, with a comment, binary) and STEP by content, and attaches to a line', async () => {
    const cases: [Buffer, string, string][] = [
      [makePng(), 'photo.png', 'image/png'],
      [JPEG, 'scan.jpg', 'image/jpeg'],
      [DXF_TEXT, 'outline.dxf', 'image/vnd.dxf'],
      [DXF_COMMENTED, 'commented.dxf', 'image/vnd.dxf'],
      [DXF_BINARY, 'binary.dxf', 'image/vnd.dxf'],
      [STEP, 'bobbin.step', 'model/step'],
    ];
    for (const [body, name, type] of cases) {
      const res = await upload(office, order.id, body, name, order.lines[0].id);
      expect(res.status, `${name}: ${JSON.stringify(res.body)}`).toBe(201);
      expect(res.body.contentType).toBe(type);
      const got = await download(office, res.body.id);
      expect(sha(got.body as Buffer)).toBe(sha(body));
    }
    const detail = await office.get(`/api/orders/${order.id}`);
    expect(detail.body.order.attachments.filter((a: { lineId: number | null }) => a.lineId === order.lines[0].id)).toHaveLength(cases.length);
  });

  it('refuses a program renamed drawing.pdf (415 unsupported_media_type naming what it is)', async () => {
    const before = (await t.deps.db.select({ n: count() }).from(attachments))[0].n;
    const elf = await upload(office, order.id, ELF, 'drawing.pdf');
    expect(elf.status).toBe(415);
    expect(elf.body.error.code).toBe('unsupported_media_type');
    expect(elf.body.error.fields.file).toMatch(/ELF/);
    const exe = await upload(office, order.id, MZ, 'drawing.pdf');
    expect(exe.status).toBe(415);
    expect(exe.body.error.fields.file).toMatch(/Windows program/);
    const txt = await upload(office, order.id, Buffer.from('just some notes\n'), 'notes.dxf');
    expect(txt.status).toBe(415);
    expect(txt.body.error.fields.file).toMatch(/neither DXF nor STEP/);
    const empty = await upload(office, order.id, Buffer.alloc(0), 'empty.pdf');
    expect(empty.status).toBe(415);
    expect((await t.deps.db.select({ n: count() }).from(attachments))[0].n).toBe(before);
  });

  it('decision: a real PDF named .png is kept under its name and stored and served as application/pdf (content wins)', async () => {
    const body = await pdf();
    const res = await upload(office, order.id, body, 'drawing.png');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ filename: 'drawing.png', contentType: 'application/pdf' });
    const got = await download(office, res.body.id);
    expect(got.headers['content-type']).toBe('application/pdf');
    expect(got.headers['content-disposition']).toContain('drawing.png');
    const preview = await office.get(`/api/attachments/${res.body.id}?inline=1`).buffer(true);
    expect(preview.headers['content-disposition']).toMatch(/^inline; filename="?drawing\.png"?$/);
  });

  it('refuses 25 MB + 1 byte (413 with fields.file) and stores nothing; exactly 25 MB is accepted', async () => {
    const before = (await t.deps.db.select({ n: count() }).from(attachments))[0].n;
    const big = Buffer.alloc(ATTACHMENT_MAX_BYTES + 1, 0x20);
    big.write('%PDF-1.4\n', 0, 'latin1');
    const res = await upload(office, order.id, big, 'huge.pdf');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect(res.body.error.fields.file).toMatch(/25 MB/);
    expect((await t.deps.db.select({ n: count() }).from(attachments))[0].n).toBe(before);
    const fits = await upload(office, order.id, big.subarray(0, ATTACHMENT_MAX_BYTES), 'limit.pdf');
    expect(fits.status).toBe(201);
    expect(fits.body.size).toBe(25 * 1024 * 1024);
  });

  it('names the missing file, a foreign line and a wrong field (400); a cancelled order takes no files (422)', async () => {
    const none = await office.post(`/api/orders/${order.id}/attachments`).set(csrf).field('lineId', '');
    expect(none.status).toBe(400);
    expect(none.body.error.fields.file).toMatch(/choose a file/i);
    const other = await newOrder(office, company.id);
    const foreign = await upload(office, order.id, makePng(), 'x.png', other.lines[0].id);
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields.lineId).toMatch(/no such line/i);
    const wrongField = await office.post(`/api/orders/${order.id}/attachments`).set(csrf).attach('drawing', makePng(), 'x.png');
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.fields.drawing).toBeTruthy();
    await office.post(`/api/orders/${other.id}/cancel`).set(csrf).send({ reason: 'test' });
    const cancelled = await upload(office, other.id, makePng(), 'x.png');
    expect(cancelled.status).toBe(422);
    expect((await upload(office, 999999, makePng(), 'x.png')).status).toBe(404);
  });

  it('deletes an attachment: the row, then the object; the trail records it', async () => {
    const res = await upload(office, order.id, makePng(), 'to-delete.png');
    const row = await t.deps.db.query.attachments.findFirst({ where: eq(attachments.id, res.body.id) });
    const del = await office.delete(`/api/attachments/${res.body.id}`).set(csrf);
    expect(del.status).toBe(204);
    expect((await office.get(`/api/attachments/${res.body.id}`)).status).toBe(404);
    await expect(t.deps.storage.getBuffer(row!.storageKey)).rejects.toThrow();
    const detail = await office.get(`/api/orders/${order.id}`);
    expect(detail.body.order.events[0]).toMatchObject({ kind: 'attachment_removed', changes: { attachment: ['to-delete.png', null] } });
    expect((await office.delete(`/api/attachments/${res.body.id}`).set(csrf)).status).toBe(404);
  });

  it('customer role: own company downloads; another company gets 404 on every order and attachment route', async () => {
    const png = makePng();
    const own = await upload(office, order.id, png, 'own.png');
    const buyer = await customerAgent(t, company.id);
    const mine = await download(buyer, own.body.id);
    expect(mine.status).toBe(200);
    expect(sha(mine.body as Buffer)).toBe(sha(png));
    const detail = await buyer.get(`/api/orders/${order.id}`);
    expect(detail.body.order.attachments.length).toBeGreaterThan(0);
    for (const a of detail.body.order.attachments) expect(a.uploadedBy).toBeUndefined();

    const otherCompany = await newCompany(office);
    const stranger = await customerAgent(t, otherCompany.id);
    expect((await stranger.get(`/api/attachments/${own.body.id}`)).status).toBe(404);
    expect((await stranger.get(`/api/orders/${order.id}`)).status).toBe(404);
    expect((await stranger.get(`/api/customers/${company.id}`)).status).toBe(404);
    expect((await stranger.get('/api/orders')).body.orders).toEqual([]);
    // Writing routes are closed to the customer role altogether.
    expect((await upload(stranger, order.id, png, 'x.png')).status).toBe(403);
    expect((await stranger.delete(`/api/attachments/${own.body.id}`).set(csrf)).status).toBe(403);
  });

  it('keeps a UTF-8 file name and drops path parts', async () => {
    const res = await upload(office, order.id, makePng(), 'Spulenkörper Ø20.png');
    expect(res.body.filename).toBe('Spulenkörper Ø20.png');
    const got = await download(office, res.body.id);
    expect(got.headers['content-disposition']).toContain("filename*=UTF-8''Spulenk%C3%B6rper%20%C3%9820.png");
    const path = await upload(office, order.id, makePng(), '../../etc/passwd.png');
    expect(path.body.filename).toBe('passwd.png');
  });
});
