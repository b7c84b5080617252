import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orders, shipments, workOrderEvents, workOrders } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { listRoutes } from '../helpers/routes';
import { customerAgent, newCompany } from '../helpers/orders';
import { binary, HIPOT, packedWorkOrders, pdfText, shipmentBody, testInstruments, testStation, type PackedWo } from '../helpers/shipments';
import { eng } from '../../jobs/travelers/render';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let shipping: Agent;
let foreman: Agent;
let office: Agent;
let admin: Agent;
let companyA: { id: number; name: string };
let companyB: { id: number; name: string };
/** a1, a2: one order of 50 units (status test); a3: own order (concurrency); a4: own order (one transaction). */
let a1: PackedWo, a2: PackedWo, a3: PackedWo, a4: PackedWo, b1: PackedWo, testing: PackedWo;
let instruments: Awaited<ReturnType<typeof testInstruments>>;
const LOT = `SHIP-LOT-${process.pid}`;

const db = () => t.deps.db;
const woRow = async (id: number) => (await db().select().from(workOrders).where(eq(workOrders.id, id)))[0];
const orderOf = async (woId: number) => (await db().select({ status: orders.status, id: orders.id }).from(orders).innerJoin(workOrders, eq(workOrders.orderId, orders.id)).where(eq(workOrders.id, woId)))[0];
const ship = (body: Record<string, unknown>, agent = shipping) => agent.post('/api/shipments').set(csrf).send(body);

beforeAll(async () => {
  shipping = await t.signIn('shipping');
  foreman = await t.signIn('foreman');
  office = await t.signIn('office');
  admin = await t.signIn('admin');
  companyA = await newCompany(office, [
    { name: 'Ada Goods-In', email: `goods-in-${process.pid}@buyer-a.example`, phone: '', notifyShipping: true },
    { name: 'Bo Orders', email: `orders-${process.pid}@buyer-a.example`, phone: '', notifyOrders: true },
  ]);
  companyB = await newCompany(office);
  const station = await testStation(admin);
  instruments = await testInstruments(admin);
  const ids = instruments.map((i) => i.id);
  [a1, a2] = await packedWorkOrders(t, foreman, companyA.id, 2, LOT, station.id, ids);
  [a3] = await packedWorkOrders(t, foreman, companyA.id, 1, `${LOT}-3`, station.id, ids);
  [a4] = await packedWorkOrders(t, foreman, companyA.id, 1, `${LOT}-4`, station.id, ids);
  [b1] = await packedWorkOrders(t, foreman, companyB.id, 1, `${LOT}-B`, station.id, ids);
  [testing] = await packedWorkOrders(t, foreman, companyA.id, 1, `${LOT}-T`, station.id, ids, { stopAt: 'testing' });
}, 120_000);

describe('the ready-to-ship list', () => {
  it('lists packed work orders by customer and order, with shippable serials and who signed inspection', async () => {
    const res = await shipping.get('/api/shipping/ready');
    expect(res.status).toBe(200);
    const a = res.body.customers.find((c: { id: number }) => c.id === companyA.id);
    const wos = a.orders.flatMap((o: { workOrders: unknown[] }) => o.workOrders);
    const w1 = wos.find((w: { id: number }) => w.id === a1.id);
    expect(w1).toMatchObject({ ready: true, reasons: [], quantity: 25, inspectedBy: { name: expect.any(String) } });
    expect(w1.serials).toEqual(a1.serials);
    // A work order still in testing is not in packing: not listed.
    expect(wos.find((w: { id: number }) => w.id === testing.id)).toBeUndefined();
  });
});

describe('shipment rules', () => {
  it('refuses work orders that are not ready with 422, naming which and why; nothing is written', async () => {
    const before = await woRow(a1.id);
    const res = await ship(shipmentBody([a1.id, testing.id]));
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.fields.workOrderIds).toContain(testing.number);
    const why = res.body.error.current.workOrders.find((w: { workOrderId: number }) => w.workOrderId === testing.id);
    expect(why.reasons.join(' ')).toMatch(/testing, not packing/);
    expect(why.reasons.join(' ')).toMatch(/25 unit\(s\) without a passed test/);
    expect(why.reasons.join(' ')).toMatch(/Inspection is not signed/);
    expect(res.body.error.current.workOrders.some((w: { workOrderId: number }) => w.workOrderId === a1.id)).toBe(false);
    expect((await woRow(a1.id)).version).toBe(before.version);
  });

  it('refuses work orders of two customers in one shipment with 422 naming the other customer’s', async () => {
    const res = await ship(shipmentBody([a1.id, b1.id]));
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.fields.workOrderIds).toContain(b1.number);
    expect(res.body.error.message).toContain(companyB.name);
  });

  it('refuses an unknown serial, a ship date too far ahead, and a shipping role only', async () => {
    const res = await ship(shipmentBody([a1.id], { partial: [{ workOrderId: a1.id, serials: ['NOT-A-SERIAL'] }] }));
    expect(res.status).toBe(422);
    expect(res.body.error.fields.workOrderIds).toMatch(/NOT-A-SERIAL/);
    const later = await ship(shipmentBody([a1.id], { shipDate: '2999-01-01' }));
    expect(later.status).toBe(422);
    expect(later.body.error.fields.shipDate).toBeTruthy();
    expect((await ship(shipmentBody([a1.id]), office)).status).toBe(403);
  });

  it('ships partial serials, then the rest; the order goes partly shipped, then shipped', async () => {
    const first = a1.serials.slice(0, 10);
    const before = await woRow(a1.id);
    const res = await ship(shipmentBody([a1.id], { partial: [{ workOrderId: a1.id, serials: first }] }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.number).toMatch(/^SH-\d{4}-\d{5}$/);
    expect(res.body.items).toEqual([expect.objectContaining({ workOrderId: a1.id, quantity: 10, serials: first })]);
    expect(res.body.notification).toMatchObject({ status: 'pending', recipients: 1 });
    let w = await woRow(a1.id);
    expect(w.stage).toBe('packing');
    expect(w.version).toBe(before.version + 1);
    expect((await orderOf(a1.id)).status).toBe('partly_shipped');
    // The work order's history says part of it left, though its stage stays packing.
    const partEvents = await db().select().from(workOrderEvents).where(sql`${workOrderEvents.workOrderId} = ${a1.id} and ${workOrderEvents.kind} = 'shipment'`);
    expect(partEvents).toHaveLength(1);
    expect(partEvents[0]).toMatchObject({ fromStage: 'packing', toStage: 'packing', note: `10 unit(s) shipped in ${res.body.number}; the rest stay in packing` });

    // The same serial again: shipped already.
    const again = await ship(shipmentBody([a1.id], { partial: [{ workOrderId: a1.id, serials: [first[0]] }] }));
    expect(again.status).toBe(422);
    expect(again.body.error.fields.workOrderIds).toContain(`Serial ${first[0]} shipped already`);

    // The ready list now offers the 15 left.
    const ready = await shipping.get('/api/shipping/ready');
    const left = ready.body.customers.flatMap((c: { orders: { workOrders: { id: number }[] }[] }) => c.orders.flatMap((o) => o.workOrders)).find((x: { id: number }) => x.id === a1.id);
    expect(left.quantity).toBe(15);
    expect(left.serials).toEqual(a1.serials.slice(10));

    // The rest of a1: a1 moves to shipped with the floor's kind of event; a2 still open → partly shipped.
    const rest = await ship(shipmentBody([a1.id]));
    expect(rest.status, JSON.stringify(rest.body)).toBe(201);
    expect(rest.body.items[0].serials).toEqual(a1.serials.slice(10));
    w = await woRow(a1.id);
    expect(w.stage).toBe('shipped');
    const [ev] = await db().select().from(workOrderEvents).where(sql`${workOrderEvents.workOrderId} = ${a1.id} and ${workOrderEvents.toStage} = 'shipped'`);
    expect(ev).toMatchObject({ kind: 'move', fromStage: 'packing', note: rest.body.number, userId: expect.any(Number) });
    expect((await orderOf(a1.id)).status).toBe('partly_shipped');

    // a2 completes the order's only line (50 units): shipped, with the audit row naming the shipment.
    const last = await ship(shipmentBody([a2.id]));
    expect(last.status, JSON.stringify(last.body)).toBe(201);
    const order = await orderOf(a2.id);
    expect(order.status).toBe('shipped');
    const detail = await office.get(`/api/orders/${order.id}`);
    expect(detail.body.order.events.some((e: { kind: string; note?: string; changes: { status?: unknown[] } }) => e.kind === 'status_changed' && e.note === `Shipment ${last.body.number}` && e.changes.status?.[1] === 'shipped')).toBe(true);

    const list = await office.get('/api/shipments').query({ q: last.body.trackingNumber });
    expect(list.status).toBe(200);
    expect(list.body.shipments.map((s: { id: number }) => s.id)).toEqual([last.body.id]);
  });

  it('two shipments of the same work order at once: one 201, one refused, nothing half-written', async () => {
    const before = await woRow(a3.id);
    const [x, y] = await Promise.all([ship(shipmentBody([a3.id])), ship(shipmentBody([a3.id]))]);
    expect([x.status, y.status].sort()).toEqual([201, 422]);
    const loser = x.status === 201 ? y : x;
    expect(loser.body.error.fields.workOrderIds).toContain(a3.number);
    const items = await db().execute<{ n: number }>(sql`select count(*)::int as n from shipment_items where work_order_id = ${a3.id}`);
    expect(items.rows[0].n).toBe(1);
    const moves = await db().select().from(workOrderEvents).where(sql`${workOrderEvents.workOrderId} = ${a3.id} and ${workOrderEvents.toStage} = 'shipped'`);
    expect(moves).toHaveLength(1);
    expect((await woRow(a3.id)).version).toBe(before.version + 1);
  });

  it('writes everything in one transaction: a failing outbox insert leaves no shipment, no move, no status change', async () => {
    const before = await woRow(a4.id);
    const orderBefore = await orderOf(a4.id);
    const tracking = `BOOM-${process.pid}-${Date.now()}`;
    // A real failure at the last step of the transaction: the database refuses this one outbox row.
    await db().execute(sql.raw(`create or replace function test_refuse_notice() returns trigger language plpgsql as $$
      begin if new.payload->>'trackingNumber' = '${tracking}' then raise exception 'refused by test'; end if; return new; end $$`));
    await db().execute(sql`create trigger test_refuse_notice before insert on notifications for each row execute function test_refuse_notice()`);
    try {
      const res = await ship(shipmentBody([a4.id], { trackingNumber: tracking }));
      expect(res.status).toBe(500);
    } finally {
      await db().execute(sql`drop trigger test_refuse_notice on notifications`);
      await db().execute(sql`drop function test_refuse_notice()`);
    }
    expect(await db().select().from(shipments).where(eq(shipments.trackingNumber, tracking))).toHaveLength(0);
    const after = await woRow(a4.id);
    expect(after).toMatchObject({ stage: 'packing', version: before.version });
    expect((await orderOf(a4.id)).status).toBe(orderBefore.status);
    const items = await db().execute<{ n: number }>(sql`select count(*)::int as n from shipment_items where work_order_id = ${a4.id}`);
    expect(items.rows[0].n).toBe(0);
    const events = await db().execute<{ n: number }>(sql`select count(*)::int as n from order_events where order_id = ${orderBefore.id} and note like 'Shipment %'`);
    expect(events.rows[0].n).toBe(0);
    // And it ships fine afterwards.
    expect((await ship(shipmentBody([a4.id]))).status).toBe(201);
  });
});

describe('the certificate of conformance', () => {
  it('lists every serial with its stored test summary, the build sheet, wire lot, instruments and the signer', async () => {
    const created = await ship(shipmentBody([b1.id]));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    // Company B has no contact asking for shipping notices: the outbox row records it, skipped.
    expect(created.body.notification).toMatchObject({ status: 'skipped', recipients: 0 });
    const res = await shipping.get(`/api/shipments/${created.body.id}/documents/certificate`).buffer(true).parse(binary as never);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toContain(`${created.body.number}-certificate-of-conformance.pdf`);
    const text = pdfText(res.body as Buffer).replace(/\s+/g, ' ');
    const stored = await foreman.get(`/api/work-orders/${b1.id}/test-records`);
    expect(stored.status).toBe(200);
    for (const serial of b1.serials) expect(text).toContain(serial);
    // R20 measured and nominal as the stored records say them (same formatting as the document).
    const norm = (s: string) => s.replace(/\s+/g, ' ');
    for (const r of stored.body.records.slice(0, 5)) expect(text).toContain(norm(`${r.serial} ${eng(r.resistance20, 'Ω', 4)}`));
    expect(text).toContain(norm(`${eng(stored.body.records[0].nominalResistance20, 'Ω', 4)} ± 10.0 %`));
    expect(text).toContain(`${HIPOT.voltage.toLocaleString('en-US')} V 60 s`);
    expect(text).toContain('2.00 GΩ at 500 V: pass');
    for (const i of instruments) {
      expect(text).toContain(i.serial);
      expect(text).toContain(i.calibrationDue);
    }
    expect(text).toContain('build sheet v1');
    expect(text).toContain(`${LOT}-B`);
    expect(text).toContain('Signed for');
    expect(text).toContain('Dev Castellan'); // the demo shipping user
    expect(text).toMatch(/not a lifting rating/);
    // The document row: one per kind, with its checksum; the record shows it ready.
    const rec = await shipping.get(`/api/shipments/${created.body.id}`);
    const cert = rec.body.documents.find((d: { kind: string }) => d.kind === 'certificate');
    expect(cert).toMatchObject({ state: 'ready', sha256: expect.stringMatching(/^[0-9a-f]{64}$/), pages: expect.any(Number) });
    const pack = await shipping.get(`/api/shipments/${created.body.id}/documents/packing_list`).buffer(true).parse(binary as never);
    expect(pack.status).toBe(200);
    const packText = pdfText(pack.body as Buffer).replace(/\s+/g, ' ');
    expect(packText).toContain(created.body.trackingNumber);
    expect(packText).toContain('4.20 kg (9.26 lb)'); // 4.2 kg ÷ 0.45359237 kg/lb (NIST SP 811) = 9.259 lb
    expect(packText).toContain(`${b1.serials[0]} – 025`);
    expect((await shipping.get(`/api/shipments/${created.body.id}/documents/nonsense`)).status).toBe(404);
  });
});

describe('documents not drawn yet', () => {
  it('opening such a shipment asks the worker for them, and its customer still gets download links', async () => {
    // The demo's past shipments are recorded without their documents drawn.
    const [row] = (
      await db().execute<{ id: number; customer_id: number }>(
        sql`select s.id, s.customer_id from shipments s where not exists (select 1 from shipment_documents d where d.shipment_id = s.id) order by s.id limit 1`,
      )
    ).rows;
    expect(row, 'a shipment without documents').toBeTruthy();
    const jobId = `shipment-docs-${row.id}`;
    await t.deps.queues.documents.remove(jobId);
    const opened = await shipping.get(`/api/shipments/${row.id}`);
    expect(opened.status).toBe(200);
    expect(opened.body.documents.map((d: { state: string }) => d.state)).toEqual(['pending', 'pending']);
    expect(await t.deps.queues.documents.getJob(jobId)).toBeTruthy();
    const buyer = await customerAgent(t, Number(row.customer_id));
    const mine = await buyer.get(`/api/portal/shipments/${row.id}`);
    expect(mine.body.documents.map((d: { downloadUrl: string }) => d.downloadUrl)).toEqual([
      `/api/shipments/${row.id}/documents/packing_list`,
      `/api/shipments/${row.id}/documents/certificate`,
    ]);
    const pdf = await buyer.get(mine.body.documents[1].downloadUrl).buffer(true).parse(binary as never);
    expect(pdf.status).toBe(200);
    expect(String(pdf.headers['content-type'])).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });
});

describe('the customer view', () => {
  it('shows the customer its orders with progress words and its shipments with tracking', async () => {
    const buyer = await customerAgent(t, companyA.id);
    const list = await buyer.get('/api/portal/orders');
    expect(list.status).toBe(200);
    const shippedOrder = (await orderOf(a2.id)).id;
    const o = list.body.orders.find((x: { id: number }) => x.id === shippedOrder);
    expect(o).toMatchObject({ statusCode: 'shipped', status: 'Shipped', shipmentCount: 3 });
    expect(o.lines[0].progress).toEqual({ awaiting_engineering: 0, in_production: 0, tested: 0, shipped: 50 });
    expect(o.lines[0].summary).toBe('50 shipped');
    const inTesting = list.body.orders.find((x: { id: number }) => x.id === (testing as unknown as { orderId?: number }).orderId) ?? list.body.orders.find((x: { lines: { productionStages: string[] }[] }) => x.lines[0].productionStages.includes('testing'));
    expect(inTesting.lines[0]).toMatchObject({ progress: { in_production: 25 }, productionStages: ['testing'], summary: '25 in production (testing)' });
    // The schedule word, from the floor's own estimate: a shipped order is done; an open one is on
    // schedule with a year to go, and behind once its requested date has passed.
    expect(o.schedule).toBe('done');
    const scheduleAt = async (due: string) => {
      await db().update(orders).set({ dueDate: due }).where(eq(orders.id, inTesting.id));
      return (await buyer.get(`/api/portal/orders/${inTesting.id}`)).body.schedule;
    };
    const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
    const due = inTesting.dueDate;
    expect(await scheduleAt(day(365))).toBe('on_schedule');
    expect(await scheduleAt(day(-2))).toBe('behind');
    await scheduleAt(due);
    const detail = await buyer.get(`/api/portal/orders/${shippedOrder}`);
    expect(detail.status).toBe(200);
    expect(detail.body.shipments).toHaveLength(3);
    expect(detail.body.shipments[0]).toMatchObject({ carrier: 'Test Carrier', trackingNumber: expect.stringMatching(/^TRK-/) });
    const shipmentsRes = await buyer.get('/api/portal/shipments');
    expect(shipmentsRes.body.shipments.length).toBeGreaterThanOrEqual(4);
  });

  it('walks every customer-readable route as company A’s user against other companies’ ids: 404 or filtered, nothing internal', async () => {
    const outsider = await newCompany(office);
    const buyer = await customerAgent(t, outsider.id);
    // Other companies' records (company B's shipment; the rest from any other company).
    const bShipment = (await db().select().from(shipments).where(eq(shipments.customerId, companyB.id)))[0];
    const pick = async (q: string) => Number((await db().execute<{ id: number }>(sql.raw(q))).rows[0].id);
    const ids: Record<string, number> = {
      '/api/orders/:id': await pick(`select id from orders where customer_id <> ${outsider.id} limit 1`),
      '/api/portal/orders/:id': (await orderOf(b1.id)).id,
      '/api/customers/:id': companyB.id,
      '/api/work-orders/:id': b1.id,
      '/api/attachments/:id': await pick(`select a.id from attachments a join orders o on o.id = a.order_id where o.customer_id <> ${outsider.id} limit 1`),
      '/api/shipments/:id/documents/:kind': bShipment.id,
      '/api/portal/shipments/:id': bShipment.id,
    };
    const staff = (await db().execute<{ name: string }>(sql`select name from users where role <> 'customer'`)).rows.map((r) => r.name);
    const foreign = [companyA.name, companyB.name, a1.number, b1.number, bShipment.number, bShipment.trackingNumber];
    const routes = listRoutes(t.app).filter((r) => r.rule && 'roles' in r.rule && r.rule.roles.includes('customer') && r.method === 'GET' && r.path !== '/api/auth/me');
    expect(routes.map((r) => r.path)).toEqual(expect.arrayContaining(['/api/portal/orders', '/api/portal/shipments/:id', '/api/shipments/:id/documents/:kind', '/api/work-orders']));
    for (const r of routes) {
      if (r.path.includes(':')) {
        const id = ids[r.path];
        expect(id, `no id chosen for ${r.path}: add it to this walk`).toBeTruthy();
        const url = r.path.replace(':id', String(id)).replace(':kind', 'certificate');
        const res = await buyer.get(url);
        expect(res.status, `${url} → ${res.status}`).toBe(404);
      } else {
        const res = await buyer.get(r.path);
        expect(res.status, r.path).toBe(200);
        const body = JSON.stringify(res.body);
        for (const f of foreign) expect(body, `${r.path} leaks ${f}`).not.toContain(f);
      }
    }
    // Their own records carry nothing internal: no notes, no staff names.
    const own = await customerAgent(t, companyA.id);
    const orderId = (await orderOf(a2.id)).id;
    const portalShipment = (await own.get('/api/portal/shipments')).body.shipments[0];
    for (const url of ['/api/portal/orders', `/api/portal/orders/${orderId}`, '/api/portal/shipments', `/api/portal/shipments/${portalShipment.id}`, `/api/orders/${orderId}`, `/api/work-orders/${a2.id}`, '/api/work-orders']) {
      const res = await own.get(url);
      expect(res.status, url).toBe(200);
      const body = JSON.stringify(res.body);
      expect(body, url).not.toMatch(/"(notes|packingNote|createdBy|assignee|notification|inspectedBy|actor|user)":/);
      for (const name of staff) expect(body, `${url} names ${name}`).not.toContain(name);
    }
    // Their own document downloads.
    expect((await own.get(portalShipment.documents[0].downloadUrl ?? `/api/shipments/${portalShipment.id}/documents/packing_list`)).status).toBe(200);
  });
});
