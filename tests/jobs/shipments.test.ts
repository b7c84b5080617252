import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailJobId } from '../../jobs/queues';
import { startWorkers } from '../../jobs/runtime';
import { LOCAL } from '../../server/config';
import { notifications, shipmentDocuments } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { mailForNotification, sleep, waitUntil } from '../helpers/mail';
import { newCompany } from '../helpers/orders';
import { packedWorkOrders, pdfText, shipmentBody, testInstruments, testStation, type PackedWo } from '../helpers/shipments';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let shipping: Agent;
let wo: PackedWo;
let shipmentId: number;
const contact = `goods-in-${process.pid}@mail-test.example`;

beforeAll(async () => {
  shipping = await t.signIn('shipping');
  const foreman = await t.signIn('foreman');
  const office = await t.signIn('office');
  const admin = await t.signIn('admin');
  const company = await newCompany(office, [
    { name: 'Orla Orders', email: `orders-${process.pid}@mail-test.example`, phone: '', notifyOrders: true },
    { name: 'Gus Goods-In', email: contact, phone: '', notifyShipping: true },
  ]);
  const station = await testStation(admin);
  const instruments = await testInstruments(admin);
  [wo] = await packedWorkOrders(t, foreman, company.id, 1, `MAIL-LOT-${process.pid}`, station.id, instruments.map((i) => i.id));
}, 60_000);

describe('the shipment notice', () => {
  it('arrives exactly once, with the tracking number, what shipped against the PO line, and the certificate attached', async () => {
    // Shipped while no worker runs: the documents job waits, and the mail processor draws the
    // certificate itself if it gets there first (the same idempotent function).
    const body = shipmentBody([wo.id], { partial: [{ workOrderId: wo.id, serials: wo.serials.slice(0, 20) }] });
    const res = await shipping.post('/api/shipments').set(csrf).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [row] = await t.deps.db.select().from(notifications).where(sql`${notifications.kind} = 'shipment_sent' and ${notifications.payload}->>'shipmentId' = ${String(res.body.id)}`);
    expect(row.payload.shipmentId).toBe(res.body.id);
    shipmentId = res.body.id;
    expect(row.recipients).toEqual([{ name: 'Gus Goods-In', email: contact }]);

    const tracking = String(body.trackingNumber);
    const mail = () => mailForNotification(row.id, tracking);
    // This row only, queued twice the way the dispatcher does it (the row id is the job id): the
    // suite's other pending rows are not this test's business. Two workers take the mail queue.
    await t.deps.queues.mail.add('send', { notificationId: row.id }, { jobId: mailJobId(row.id) });
    await t.deps.queues.mail.add('send', { notificationId: row.id }, { jobId: mailJobId(row.id) });
    const a = startWorkers(t.deps, { dispatch: false });
    const b = startWorkers(t.deps, { dispatch: false });
    try {
      await waitUntil(async () => (await mail()).length > 0);
      await sleep(1_000); // would a second copy follow?
    } finally {
      await Promise.all([a.close(), b.close()]);
    }
    const caught = await mail();
    expect(caught).toHaveLength(1);
    const m = caught[0];
    expect(m.to.map((x) => x.address)).toEqual([contact]);
    expect(m.subject).toContain(tracking);
    expect(m.text).toContain(`Tracking number: ${tracking}`);
    expect(m.text).toContain('Test Carrier, Next day');
    // What shipped against which PO line, and what remains open: 20 of the line's 25 now, 5 open.
    expect(m.text).toMatch(/In this shipment:\n  1\. Test-record coil.*: 20 \(20 serials\); 20 of 25 shipped so far, 5 still open/);
    expect(m.text).toContain(`/portal/orders/`);
    expect(m.html).toContain('/portal/orders/');
    expect((await t.deps.db.select().from(notifications).where(eq(notifications.id, row.id)))[0].status).toBe('sent');

    // The attachment: the certificate, whose text lists the shipped serials.
    expect(m.attachments?.map((x) => x.contentType)).toEqual(['application/pdf']);
    const file = m.attachments![0].fileName;
    expect(file).toBe(`${res.body.number}-certificate-of-conformance.pdf`);
    const viewer = `http://${LOCAL.mailViewer.host}:${LOCAL.mailViewer.port}`;
    // The catcher serves an attachment under the name it generated for it.
    const pdf = Buffer.from(await (await fetch(`${viewer}/email/${m.id}/attachment/${m.attachments![0].generatedFileName}`)).arrayBuffer());
    const text = pdfText(pdf).replace(/\s+/g, ' ');
    for (const s of wo.serials.slice(0, 20)) expect(text).toContain(s);
    expect(text).not.toContain(wo.serials[24]);
    // One certificate row (drawn once, whoever drew it), and the stored file is the one mailed.
    const docs = await t.deps.db.select().from(shipmentDocuments).where(eq(shipmentDocuments.shipmentId, res.body.id));
    expect(docs.filter((d) => d.kind === 'certificate')).toHaveLength(1);
    expect(docs.find((d) => d.kind === 'certificate')!.size).toBe(pdf.length);
  });

  it('a redraw replaces both documents through the documents queue', { timeout: 60_000 }, async () => {
    const id = shipmentId;
    const before = (await shipping.get(`/api/shipments/${id}`)).body.documents;
    const res = await shipping.post(`/api/shipments/${id}/documents`).set(csrf).send({});
    expect(res.status).toBe(202);
    expect(res.body.jobId).toMatch(/^documents\.shipment-docs-\d+-redraw-\d+$/);
    const again = await shipping.post(`/api/shipments/${id}/documents`).set(csrf).send({});
    expect(again.body.jobId).toBe(res.body.jobId);
    const w = startWorkers(t.deps, { dispatch: false });
    try {
      // Behind any documents jobs the suite's other shipments left on the queue.
      await waitUntil(async () => (await shipping.get(`/api/jobs/${res.body.jobId}`)).body.state === 'completed', 50_000);
    } finally {
      await w.close();
    }
    const after = (await shipping.get(`/api/shipments/${id}`)).body.documents;
    for (const kind of ['packing_list', 'certificate']) {
      const x = before.find((d: { kind: string }) => d.kind === kind);
      const y = after.find((d: { kind: string }) => d.kind === kind);
      expect(y.state).toBe('ready');
      if (x.state === 'ready') expect(y.createdAt > x.createdAt).toBe(true);
    }
  });
});
