import { count, eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_TOLERANCE_PERCENT, ORDER_STATUSES, createOrderRequest } from '../../src/contracts/orders';
import { attachments, customerContacts, customers, notifications, orderEvents, orderLines, orders } from '../../server/db/schema';
import { ORDER_TRANSITIONS, createOrder, moveOrder } from '../../server/orders/service';
import { toSessionUser } from '../../server/users/service';
import { findUserByEmail } from '../../server/users/repository';
import { DEMO_CUSTOMER_COMPANY } from '../../server/seed/demo';
import { csrf, testApp } from '../helpers/app';
import { customerAgent, inDays, line, newCompany, newOrder, plunger12V, solenoid24V, uniquePo } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let company: { id: number; name: string };

beforeAll(async () => {
  office = await t.signIn('office');
  company = await newCompany(office, [
    { name: 'Order Desk', email: 'orders@example.test', notifyOrders: true },
    { name: 'Goods In', email: 'goods@example.test', notifyShipping: true },
  ]);
});

const db = () => t.deps.db;
const countWhere = async (table: typeof orders | typeof orderEvents | typeof notifications, where: ReturnType<typeof eq>) =>
  (await db().select({ n: count() }).from(table).where(where))[0].n;

describe('entering an order', () => {
  it('creates an order with two lines in one go (201), numbered SO-<year>-<sequence>', async () => {
    const purchaseOrder = uniquePo();
    const res = await office
      .post('/api/orders')
      .set(csrf)
      .send({
        customerId: company.id,
        purchaseOrder,
        orderDate: inDays(0),
        dueDate: inDays(21),
        notes: 'internal note',
        lines: [
          line({ customerPartNumber: 'CP-1', terminationNotes: 'Spade terminals' }),
          { quantity: 4, title: 'Plunger magnet 12 V', requirement: plunger12V(), tolerancePercent: 5 },
        ],
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const o = res.body.order;
    expect(o.number).toMatch(new RegExp(`^SO-${inDays(0).slice(0, 4)}-\\d{5}$`));
    expect(o).toMatchObject({ purchaseOrder, status: 'entered', customer: { id: company.id, name: company.name }, lineCount: 2, unitCount: 14, late: false });
    expect(o.lines.map((l: { lineNo: number }) => l.lineNo)).toEqual([1, 2]);
    expect(o.lines[0]).toMatchObject({ quantity: 10, customerPartNumber: 'CP-1', terminationNotes: 'Spade terminals', buildSheet: null });
    // ±10 % resistance tolerance when none is stated: common practice, no published source.
    expect(DEFAULT_TOLERANCE_PERCENT).toBe(10);
    expect(o.lines[0].tolerancePercent).toBe(10);
    expect(o.lines[1].tolerancePercent).toBe(5);
    expect(o.lines[1].requirement).toEqual({ ...plunger12V(), fit: 'bobbin' });
    expect(o.events).toHaveLength(1);
    expect(o.events[0]).toMatchObject({ kind: 'created', actor: { name: expect.any(String) } });
    expect(o.can).toEqual({ edit: true, editLines: true, acknowledge: true, cancel: true, attach: true });
    const read = await (await t.signIn('foreman')).get(`/api/orders/${o.id}`);
    expect(read.status).toBe(200);
    expect(read.body.order.lines).toHaveLength(2);
  });

  it('numbers are unique and never reused, even after a refused order', async () => {
    const a = await newOrder(office, company.id);
    const bad = await office.post('/api/orders').set(csrf).send({ customerId: company.id, purchaseOrder: a.purchaseOrder, dueDate: inDays(9), lines: [line()] });
    expect(bad.status).toBe(409);
    const b = await newOrder(office, company.id);
    const seq = (n: string) => Number(n.split('-')[2]);
    expect(seq(b.number)).toBeGreaterThan(seq(a.number));
  });

  it('names each bad field (400 validation)', async () => {
    const res = await office.post('/api/orders').set(csrf).send({ purchaseOrder: '', dueDate: '2026-02-30', lines: [] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['customerId', 'dueDate', 'lines', 'purchaseOrder']);
    expect(res.body.error.fields.dueDate).toMatch(/no such date/i);
  });

  it('a bad second line → 400 naming lines.1.…, and nothing is written', async () => {
    const purchaseOrder = uniquePo();
    const before = (await db().select({ n: count() }).from(orderEvents))[0].n;
    const badBobbin = { ...solenoid24V(), bobbin: { innerDiameter: 0.02, outerDiameter: -1, length: 0.03 } };
    const res = await office
      .post('/api/orders')
      .set(csrf)
      .send({ customerId: company.id, purchaseOrder, dueDate: inDays(10), lines: [line(), line({ requirement: badBobbin, quantity: 0 })] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      'lines.1.requirement.bobbin.outerDiameter': 'outer diameter must be a positive number',
      'lines.1.quantity': 'Quantity must be at least 1',
    });
    expect(await db().query.orders.findFirst({ where: eq(orders.purchaseOrder, purchaseOrder) })).toBeUndefined();
    expect((await db().select({ n: count() }).from(orderEvents))[0].n).toBe(before);
  });

  it('the service writes the order, its lines and its audit row in ONE transaction (a line the database refuses rolls all back)', async () => {
    const purchaseOrder = uniquePo();
    const actor = toSessionUser((await findUserByEmail(db(), 'office@spoolwright.test'))!);
    const input = createOrderRequest.parse({ customerId: company.id, purchaseOrder, dueDate: inDays(10), lines: [line(), line()] });
    // Past the contract (which would refuse it): a title too long for its column fails the second insert.
    input.lines[1].title = 'x'.repeat(500);
    const eventsBefore = (await db().select({ n: count() }).from(orderEvents))[0].n;
    const linesBefore = (await db().select({ n: count() }).from(orderLines))[0].n;
    await expect(createOrder(db(), input, actor)).rejects.toThrow();
    expect(await db().query.orders.findFirst({ where: eq(orders.purchaseOrder, purchaseOrder) })).toBeUndefined();
    expect((await db().select({ n: count() }).from(orderEvents))[0].n).toBe(eventsBefore);
    expect((await db().select({ n: count() }).from(orderLines))[0].n).toBe(linesBefore);
  });

  it('checks the requirement: a pull target needs a magnetic circuit; dates in order; the customer exists', async () => {
    const { magneticCircuit: _, ...noCircuit } = plunger12V();
    const res = await office
      .post('/api/orders')
      .set(csrf)
      .send({ customerId: company.id, purchaseOrder: uniquePo(), orderDate: inDays(5), dueDate: inDays(1), lines: [line({ requirement: noCircuit })] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['lines.0.requirement.magneticCircuit']).toMatch(/magnetic circuit/);
    expect(res.body.error.fields.dueDate).toMatch(/before the order date/);
    const wrongTarget = await office
      .post('/api/orders')
      .set(csrf)
      .send({ customerId: company.id, purchaseOrder: uniquePo(), dueDate: inDays(3), lines: [line({ requirement: { ...solenoid24V(), target: { kind: 'torque' } } })] });
    expect(wrongTarget.body.error.fields['lines.0.requirement.target.kind']).toMatch(/ampereTurns.*pull.*field/);
    const noCustomer = await office.post('/api/orders').set(csrf).send({ customerId: 999999, purchaseOrder: uniquePo(), dueDate: inDays(3), lines: [line()] });
    expect(noCustomer.status).toBe(400);
    expect(noCustomer.body.error.fields.customerId).toMatch(/no such customer/i);
  });
});

describe('hostile input', () => {
  it('gets 400 with fields, never a 500: NUL characters, ids and dates the database cannot hold, wrong shapes', async () => {
    const cases: [string, () => Promise<{ status: number; body: { error?: { fields?: Record<string, string> } } }>, string][] = [
      ['NUL in a company name', () => office.post('/api/customers').set(csrf).send({ name: 'Nul\u0000Co' }), 'name'],
      ['NUL in a line title', () => office.post('/api/orders').set(csrf).send({ customerId: company.id, purchaseOrder: uniquePo(), dueDate: inDays(3), lines: [line({ title: 'a\u0000b' })] }), 'lines.0.title'],
      ['NUL in a search', () => office.get('/api/orders?q=%00'), 'q'],
      ['NUL in a customer search', () => office.get('/api/customers?q=%00'), 'q'],
      ['an id beyond integer', () => office.post('/api/orders').set(csrf).send({ customerId: 3e9, purchaseOrder: uniquePo(), dueDate: inDays(3), lines: [line()] }), 'customerId'],
      ['year 0', () => office.post('/api/orders').set(csrf).send({ customerId: company.id, purchaseOrder: uniquePo(), orderDate: '0000-01-01', dueDate: '0000-02-01', lines: [line()] }), 'dueDate'],
      ['a list for a body', () => office.post('/api/orders').set(csrf).send([]), '_'],
      ['a repeated query parameter', () => office.get('/api/orders?status=entered&status=closed'), 'status'],
      ['a string for a number', () => office.post('/api/orders').set(csrf).send({ customerId: company.id, purchaseOrder: uniquePo(), dueDate: inDays(3), lines: [line({ quantity: '5' })] }), 'lines.0.quantity'],
    ];
    for (const [what, send, field] of cases) {
      const res = await send();
      expect(res.status, what).toBe(400);
      expect(res.body.error?.fields?.[field], what).toBeTruthy();
    }
  });
});

describe('purchase-order numbers', () => {
  it('are unique per customer regardless of case (409 fields.purchaseOrder); the same PO at another customer is fine', async () => {
    const po = uniquePo('Abc');
    await newOrder(office, company.id, { purchaseOrder: po });
    const dup = await office.post('/api/orders').set(csrf).send({ customerId: company.id, purchaseOrder: po.toLowerCase(), dueDate: inDays(9), lines: [line()] });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('conflict');
    expect(dup.body.error.fields.purchaseOrder).toBeTruthy();
    const other = await newCompany(office);
    await newOrder(office, other.id, { purchaseOrder: po });
  });

  it('a change to a PO the customer already used is refused too', async () => {
    const a = await newOrder(office, company.id);
    const b = await newOrder(office, company.id);
    const res = await office.patch(`/api/orders/${b.id}`).set(csrf).send({ purchaseOrder: String(a.purchaseOrder).toUpperCase() });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.purchaseOrder).toBeTruthy();
  });
});

describe('changing an order', () => {
  it('records what changed (field → [old, new]) with who and when', async () => {
    const o = await newOrder(office, company.id, { notes: 'first' });
    const due = inDays(40);
    const res = await office.patch(`/api/orders/${o.id}`).set(csrf).send({ dueDate: due, notes: 'second' });
    expect(res.status).toBe(200);
    const ev = res.body.order.events[0];
    expect(ev).toMatchObject({ kind: 'updated', actor: { name: expect.any(String) }, changes: { dueDate: [o.dueDate, due], notes: ['first', 'second'] } });
    expect(new Date(ev.at).getTime()).toBeGreaterThan(Date.now() - 60_000);
  });

  it('replaces lines while entered: keeps, changes, adds and removes, renumbering 1…n', async () => {
    const o = await newOrder(office, company.id, { lines: [line({ title: 'A' }), line({ title: 'B' }), line({ title: 'C' })] });
    const [a, b] = o.lines;
    const res = await office
      .patch(`/api/orders/${o.id}`)
      .set(csrf)
      .send({ lines: [line({ id: b.id, title: 'B', quantity: 99 }), line({ title: 'D' }), line({ id: a.id, title: 'A' })] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const lines = res.body.order.lines as { id: number; lineNo: number; title: string; quantity: number }[];
    expect(lines.map((l) => [l.lineNo, l.title])).toEqual([
      [1, 'B'],
      [2, 'D'],
      [3, 'A'],
    ]);
    expect(lines[0].id).toBe(b.id);
    expect(lines[0].quantity).toBe(99);
    const changes = res.body.order.events[0].changes;
    expect(changes['lines.1.quantity']).toEqual([10, 99]);
    expect(changes['lines.3']).toEqual([{ title: 'C', quantity: 10 }, null]);
    expect(changes['lines.2']).toEqual([null, { title: 'D', quantity: 10 }]);
  });

  it('refuses a line id from another order (400 lines.0.id) and leaves the lines as they were', async () => {
    const o = await newOrder(office, company.id);
    const other = await newOrder(office, company.id);
    const res = await office.patch(`/api/orders/${o.id}`).set(csrf).send({ lines: [line({ id: other.lines[0].id })] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['lines.0.id']).toMatch(/no such line/i);
    const rows = await db().select().from(orderLines).where(eq(orderLines.orderId, o.id));
    expect(rows.map((r) => r.id)).toEqual([o.lines[0].id]);
  });

  it('lines are fixed once acknowledged (422), other fields still change; cancelled orders refuse every edit (422)', async () => {
    const o = await newOrder(office, company.id);
    expect((await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf)).status).toBe(200);
    const lines = await office.patch(`/api/orders/${o.id}`).set(csrf).send({ lines: [line()] });
    expect(lines.status).toBe(422);
    expect(lines.body.error.code).toBe('rule');
    expect(lines.body.error.fields.lines).toMatch(/acknowledged/);
    expect((await office.patch(`/api/orders/${o.id}`).set(csrf).send({ dueDate: inDays(50) })).status).toBe(200);
    expect((await office.post(`/api/orders/${o.id}/cancel`).set(csrf).send({ reason: 'Customer withdrew' })).status).toBe(200);
    const edit = await office.patch(`/api/orders/${o.id}`).set(csrf).send({ notes: 'too late' });
    expect(edit.status).toBe(422);
    expect(edit.body.error.fields.status).toMatch(/cancelled/);
  });

  it('an empty change, an unknown order and a bad id are refused', async () => {
    const o = await newOrder(office, company.id);
    expect((await office.patch(`/api/orders/${o.id}`).set(csrf).send({})).status).toBe(400);
    expect((await office.patch('/api/orders/999999').set(csrf).send({ notes: 'x' })).status).toBe(404);
    expect((await office.get('/api/orders/abc')).status).toBe(404);
  });
});

describe('acknowledging', () => {
  it('records who and when and writes exactly one outbox row in the same transaction', async () => {
    const o = await newOrder(office, company.id);
    const res = await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    expect(res.status).toBe(200);
    expect(res.body.order).toMatchObject({ status: 'acknowledged', acknowledgedAt: expect.any(String), acknowledgedBy: { name: expect.any(String) } });
    expect(res.body.notification).toMatchObject({ status: 'pending', recipients: [{ name: 'Order Desk', email: 'orders@example.test' }] });
    const rows = await db().select().from(notifications).where(eq(notifications.orderId, o.id));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      kind: 'order_acknowledged',
      status: 'pending',
      attempts: 0,
      lastError: null,
      sentAt: null,
      messageId: null,
      payload: { orderNumber: o.number, purchaseOrder: o.purchaseOrder, lines: [{ lineNo: 1, quantity: 10 }] },
    });
    // Same transaction: PostgreSQL stamps each row with the id of the transaction that wrote it (xmin).
    const xmin = async (table: string, where: string) =>
      (await t.deps.pool.query(`select xmin::text as x from ${table} where ${where}`)).rows.map((r) => r.x as string);
    const [orderTx] = await xmin('orders', `id = ${o.id}`);
    expect(await xmin('notifications', `order_id = ${o.id}`)).toEqual([orderTx]);
    expect(await xmin('order_events', `order_id = ${o.id} and kind = 'acknowledged'`)).toEqual([orderTx]);
  });

  it('a refused acknowledge (422) writes no outbox row', async () => {
    const o = await newOrder(office, company.id);
    await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    const again = await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    expect(again.status).toBe(422);
    expect(again.body.error.fields.status).toMatch(/acknowledged/);
    expect(await countWhere(notifications, eq(notifications.orderId, o.id))).toBe(1);
    const c = await newOrder(office, company.id);
    await office.post(`/api/orders/${c.id}/cancel`).set(csrf).send({ reason: 'Wrong customer' });
    expect((await office.post(`/api/orders/${c.id}/acknowledge`).set(csrf)).status).toBe(422);
    expect(await countWhere(notifications, eq(notifications.orderId, c.id))).toBe(0);
  });

  it('two acknowledges at once: one succeeds, the other is refused, and there is one outbox row', async () => {
    const o = await newOrder(office, company.id);
    const admin = await t.signIn('admin');
    const results = await Promise.all([office.post(`/api/orders/${o.id}/acknowledge`).set(csrf), admin.post(`/api/orders/${o.id}/acknowledge`).set(csrf)]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 422]);
    expect(await countWhere(notifications, eq(notifications.orderId, o.id))).toBe(1);
  });

  it('falls back to the first contact with an address when nobody asked for order notices', async () => {
    const co = await newCompany(office, [{ name: 'Phone Only', phone: '1' }, { name: 'First Mail', email: 'first@example.test' }, { name: 'Second', email: 's@example.test' }]);
    const o = await newOrder(office, co.id);
    const res = await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    expect(res.body.notification.recipients).toEqual([{ name: 'First Mail', email: 'first@example.test' }]);
  });

  it('with no contact to write to, the order is still acknowledged and the row says why (skipped)', async () => {
    const co = await newCompany(office, []);
    const o = await newOrder(office, co.id);
    const res = await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    expect(res.status).toBe(200);
    expect(res.body.order.status).toBe('acknowledged');
    const [row] = await db().select().from(notifications).where(eq(notifications.orderId, o.id));
    expect(row).toMatchObject({ status: 'skipped', recipients: [], reason: expect.stringMatching(/no contact/i) });
  });
});

describe('status moves', () => {
  it('follow the one table', async () => {
    expect(Object.keys(ORDER_TRANSITIONS).sort()).toEqual([...ORDER_STATUSES].sort());
    expect(ORDER_TRANSITIONS.closed).toEqual([]);
    expect(ORDER_TRANSITIONS.cancelled).toEqual([]);
    const o = await newOrder(office, company.id);
    await expect(moveOrder(db(), o.id, 'shipped', null)).rejects.toMatchObject({ status: 422, code: 'rule' });
    await office.post(`/api/orders/${o.id}/acknowledge`).set(csrf);
    for (const s of ['in_production', 'partly_shipped', 'shipped', 'closed'] as const) await moveOrder(db(), o.id, s, null);
    await expect(moveOrder(db(), o.id, 'cancelled', null)).rejects.toMatchObject({ status: 422 });
    const closed = await office.post(`/api/orders/${o.id}/cancel`).set(csrf).send({ reason: 'x' });
    expect(closed.status).toBe(422);
    expect(closed.body.error.fields.status).toMatch(/final/);
    const detail = (await office.get(`/api/orders/${o.id}`)).body.order;
    expect(detail.events.map((e: { changes: { status?: unknown[] } }) => e.changes.status?.[1]).reverse()).toEqual([
      'entered',
      'acknowledged',
      'in_production',
      'partly_shipped',
      'shipped',
      'closed',
    ]);
    expect(detail.can).toEqual({ edit: false, editLines: false, acknowledge: false, cancel: false, attach: false });
  });

  it('cancelling needs a reason, records it, and happens once', async () => {
    const o = await newOrder(office, company.id);
    const noReason = await office.post(`/api/orders/${o.id}/cancel`).set(csrf).send({});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toBeTruthy();
    const res = await office.post(`/api/orders/${o.id}/cancel`).set(csrf).send({ reason: 'Customer changed the design' });
    expect(res.status).toBe(200);
    expect(res.body.order).toMatchObject({ status: 'cancelled', cancelReason: 'Customer changed the design', cancelledAt: expect.any(String) });
    expect(res.body.order.events[0]).toMatchObject({ kind: 'cancelled', note: 'Customer changed the design', changes: { status: ['entered', 'cancelled'] } });
    expect((await office.post(`/api/orders/${o.id}/cancel`).set(csrf).send({ reason: 'again' })).status).toBe(422);
  });
});

describe('the orders list', () => {
  it('filters by status, customer and due window; late=true lists only late orders', async () => {
    const co = await newCompany(office);
    const late = await newOrder(office, co.id, { orderDate: inDays(-30), dueDate: inDays(-2) });
    const soon = await newOrder(office, co.id, { dueDate: inDays(5) });
    const shippedLate = await newOrder(office, co.id, { orderDate: inDays(-30), dueDate: inDays(-3) });
    await office.post(`/api/orders/${shippedLate.id}/acknowledge`).set(csrf);
    for (const s of ['in_production', 'shipped'] as const) await moveOrder(db(), shippedLate.id, s, null);

    const engineer = await t.signIn('engineer');
    const mine = (await engineer.get(`/api/orders?customerId=${co.id}`)).body.orders as { id: number; late: boolean; lineCount: number }[];
    expect(mine.map((o) => o.id).sort()).toEqual([late.id, soon.id, shippedLate.id].sort());
    expect(mine.find((o) => o.id === late.id)).toMatchObject({ late: true, lineCount: 1 });
    expect(mine.find((o) => o.id === shippedLate.id)!.late).toBe(false); // shipped: never late

    const lateOnes = (await engineer.get('/api/orders?late=true')).body.orders as { id: number; late: boolean; dueDate: string; status: string }[];
    expect(lateOnes.map((o) => o.id)).toContain(late.id);
    expect(lateOnes.map((o) => o.id)).not.toContain(shippedLate.id);
    for (const o of lateOnes) {
      expect(o.late).toBe(true);
      expect(o.dueDate < inDays(0)).toBe(true);
      expect(['shipped', 'closed', 'cancelled']).not.toContain(o.status);
    }
    const window = (await engineer.get(`/api/orders?customerId=${co.id}&dueFrom=${inDays(0)}&dueTo=${inDays(10)}`)).body.orders;
    expect(window.map((o: { id: number }) => o.id)).toEqual([soon.id]);
    const byStatus = (await engineer.get(`/api/orders?customerId=${co.id}&status=shipped,entered`)).body.orders;
    expect(byStatus.map((o: { id: number }) => o.id).sort()).toEqual([late.id, soon.id, shippedLate.id].sort());
    const onlyShipped = (await engineer.get(`/api/orders?customerId=${co.id}&status=shipped`)).body.orders;
    expect(onlyShipped.map((o: { id: number }) => o.id)).toEqual([shippedLate.id]);
  });

  it('refuses bad filters with fields (400)', async () => {
    const res = await office.get('/api/orders?status=lost&late=maybe&dueFrom=2026-13-01');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['dueFrom', 'late', 'status.0']);
  });
});

describe('company isolation for the customer role', () => {
  it('a customer user sees only its own company, without internal notes or staff names', async () => {
    const mine = await newCompany(office, [{ name: 'Buyer', email: 'buyer@example.test', notifyOrders: true }]);
    const own = await newOrder(office, mine.id, { notes: 'INTERNAL: squeeze the price' });
    await office.post(`/api/orders/${own.id}/acknowledge`).set(csrf);
    await office.patch(`/api/orders/${own.id}`).set(csrf).send({ notes: 'INTERNAL: second note', dueDate: inDays(45) });
    const others = await newOrder(office, company.id);
    const buyer = await customerAgent(t, mine.id);

    const list = await buyer.get('/api/orders');
    expect(list.status).toBe(200);
    expect(list.body.orders.map((o: { id: number }) => o.id)).toEqual([own.id]);
    expect((await buyer.get(`/api/orders?customerId=${company.id}`)).body.orders).toEqual([]);

    const detail = await buyer.get(`/api/orders/${own.id}`);
    expect(detail.status).toBe(200);
    const body = JSON.stringify(detail.body);
    expect(body).not.toMatch(/INTERNAL/);
    const staffNames = ['Tobias Quennell', 'Imogen Varley'];
    for (const n of staffNames) expect(body).not.toContain(n);
    expect(detail.body.order.notes).toBeUndefined();
    expect(detail.body.order.acknowledgedBy).toBeUndefined();
    for (const e of detail.body.order.events) expect(e.actor).toBeUndefined();
    expect(detail.body.order.events.find((e: { kind: string }) => e.kind === 'updated').changes).toEqual({ dueDate: [expect.any(String), inDays(45)] });

    expect((await buyer.get(`/api/orders/${others.id}`)).status).toBe(404);
    for (const [method, path, body] of [
      ['patch', `/api/orders/${own.id}`, { notes: 'x' }],
      ['post', '/api/orders', {}],
      ['post', `/api/orders/${own.id}/acknowledge`, {}],
      ['post', `/api/orders/${own.id}/cancel`, { reason: 'x' }],
    ] as const) {
      expect((await buyer[method](path).set(csrf).send(body)).status).toBe(403);
    }
  });
});

describe('the demo seed', () => {
  it('has eight invented companies with 1–3 contacts, and at least 30 orders over every status and weeks before and after today', async () => {
    const companies = await db()
      .select({ id: customers.id, name: customers.name, n: sql<number>`(select count(*)::int from ${customerContacts} c where c.customer_id = "customers"."id")` })
      .from(customers)
      .where(inArray(customers.name, [DEMO_CUSTOMER_COMPANY, 'Quillon Dosing Works', 'Varnholt Door Controls', 'Kestrimar Packaging Machines', 'Ulvenfold Rail Equipment', 'Corvane Medical Devices', 'Brassoway Vending Systems', 'Nimbrell Laboratory Automation']));
    expect(companies).toHaveLength(8);
    for (const c of companies) expect(c.n).toBeGreaterThanOrEqual(1), expect(c.n).toBeLessThanOrEqual(3);
    const seeded = await db().select().from(orders).where(inArray(orders.customerId, companies.map((c) => c.id)));
    expect(seeded.length).toBeGreaterThanOrEqual(30);
    expect(new Set(seeded.map((o) => o.status))).toEqual(new Set(ORDER_STATUSES));
    expect(seeded.some((o) => o.dueDate < inDays(-7))).toBe(true);
    expect(seeded.some((o) => o.dueDate > inDays(7))).toBe(true);
    const lines = await db().select({ orderId: orderLines.orderId }).from(orderLines).where(inArray(orderLines.orderId, seeded.map((o) => o.id)));
    expect(lines.length).toBeGreaterThanOrEqual(2 * seeded.length * 0.8);
    const files = await db().select().from(attachments).where(inArray(attachments.orderId, seeded.map((o) => o.id)));
    expect(files.length).toBeGreaterThanOrEqual(3);
    for (const f of files) expect((await t.deps.storage.getBuffer(f.storageKey)).length).toBe(f.size);
  });

  it("the demo customer user sees its company's orders", async () => {
    const buyer = await t.signIn('customer');
    const res = await buyer.get('/api/orders');
    expect(res.status).toBe(200);
    expect(res.body.orders.length).toBeGreaterThan(0);
    expect(new Set(res.body.orders.map((o: { customer: { name: string } }) => o.customer.name))).toEqual(new Set([DEMO_CUSTOMER_COMPANY]));
  });
});
