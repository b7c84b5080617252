import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, approvedSheet, coilSpec, receiveSpool } from '../helpers/build-sheets';
import { customerAgent, newCompany, solenoid24V } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let office: Agent;
let engineer: Agent;
let company: { id: number };
let other: { id: number };
let order: Awaited<ReturnType<typeof acknowledgedOrder>>;
let released: { id: number; number: string; quantity: number }[];
let sheet: Awaited<ReturnType<typeof approvedSheet>>;

/** This file's wire: copper grade 3 AWG 34 (within class 155 on the test bobbin). */
const GAUGE = 34;

beforeAll(async () => {
  office = await t.signIn('office');
  engineer = await t.signIn('engineer');
  company = await newCompany(office, [{ name: 'Buyer', email: 'buyer@example.test', notifyOrders: true }]);
  other = await newCompany(office, [{ name: 'Other Buyer', email: 'other@example.test' }]);
  await receiveSpool(office, GAUGE, 800, '2020-01-01');
  order = await acknowledgedOrder(office, company.id, [30], { lines: [{ quantity: 30, title: 'Work-order test coil', requirement: solenoid24V(), tolerancePercent: 7 }] });
  sheet = await approvedSheet(engineer, order.lines[0].id, coilSpec(GAUGE));
  const res = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  released = res.body.workOrders;
});

describe('reading work orders', () => {
  it('lists them with filters for the line, the order and the stage', async () => {
    const foreman = await t.signIn('foreman');
    const byLine = await foreman.get(`/api/work-orders?lineId=${order.lines[0].id}`);
    expect(byLine.status).toBe(200);
    expect(byLine.body.workOrders.map((w: { number: string }) => w.number)).toEqual(released.map((w) => w.number));
    expect(byLine.body.workOrders[0]).toMatchObject({
      stage: 'ready',
      version: 1,
      priority: 0,
      assignee: null,
      station: null,
      order: { id: order.id, number: order.number, customer: { id: company.id } },
      line: { id: order.lines[0].id, lineNo: 1, title: 'Work-order test coil', tolerancePercent: 7 },
      buildSheetId: sheet.id,
    });
    const byOrder = await foreman.get(`/api/work-orders?orderId=${order.id}&stage=ready,on_hold`);
    expect(byOrder.body.workOrders).toHaveLength(2);
    const none = await foreman.get(`/api/work-orders?orderId=${order.id}&stage=winding`);
    expect(none.body.workOrders).toEqual([]);
    const bad = await foreman.get('/api/work-orders?stage=flying&orderId=abc');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['orderId', 'stage.0']);
  });

  it('shows one work order with its sheet essentials and its first event', async () => {
    const floor = await t.signIn('floor');
    const res = await floor.get(`/api/work-orders/${released[0].id}`);
    expect(res.status).toBe(200);
    const r20 = sheet.result.resistance20;
    expect(res.body).toMatchObject({
      id: released[0].id,
      number: released[0].number,
      quantity: 25,
      dueDate: order.dueDate,
      buildSheet: {
        id: sheet.id,
        version: 1,
        status: 'released',
        conductor: 'copper',
        wire: { standard: 'AWG', gauge: GAUGE },
        insulationGrade: 3,
        turns: sheet.result.turns,
        resistance20: r20,
        tolerancePercent: 7,
      },
      events: [{ fromStage: null, toStage: 'ready', note: 'Released from build sheet v1', user: { id: expect.any(Number) }, stationId: null }],
    });
    // The ±7 % window on R₂₀ (the line's tolerance).
    expect(res.body.buildSheet.resistance20Min).toBeCloseTo(r20 * 0.93, 9);
    expect(res.body.buildSheet.resistance20Max).toBeCloseTo(r20 * 1.07, 9);
    expect((await floor.get('/api/work-orders/999999999')).status).toBe(404);
  });

  it("shows a customer its own company's work orders without staff names or the design; another company's are 404", async () => {
    const buyer = await customerAgent(t, company.id);
    const list = await buyer.get('/api/work-orders');
    expect(list.status).toBe(200);
    expect(list.body.workOrders.length).toBeGreaterThanOrEqual(2);
    expect(list.body.workOrders.every((w: { order: { customer: { id: number } } }) => w.order.customer.id === company.id)).toBe(true);
    expect(list.body.workOrders[0]).not.toHaveProperty('assignee');
    const one = await buyer.get(`/api/work-orders/${released[0].id}`);
    expect(one.status).toBe(200);
    expect(one.body.buildSheet).toBeNull();
    expect(one.body.events[0]).not.toHaveProperty('user');
    expect(one.body.events[0]).not.toHaveProperty('note');

    const stranger = await customerAgent(t, other.id);
    expect((await stranger.get(`/api/work-orders/${released[0].id}`)).status).toBe(404);
    expect((await stranger.get(`/api/work-orders?orderId=${order.id}`)).body.workOrders).toEqual([]);
  });
});
