import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { SHOP_DEFAULTS } from '../../server/settings/service';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { csrf, testApp } from '../helpers/app';
import { inDays, newCompany } from '../helpers/orders';
import { floorUser, moveOk, openFloorFeed, newStation, receiveFloorWire, releasedWorkOrders, type Wo } from '../helpers/floor';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let foreman: Agent;
let admin: Agent;
let office: Agent;
let company: { id: number; name: string };
let soon: Wo[];
let later: Wo[];
const LOT = `FLOOR-BOARD-${process.pid}`;

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  admin = await t.signIn('admin');
  office = await t.signIn('office');
  company = await newCompany(office, []);
  await receiveFloorWire(office, LOT);
  soon = await releasedWorkOrders(t, company.id, 2, 3, 'Board coil soon');
  later = await releasedWorkOrders(t, company.id, 2, 40, 'Board coil later');
});

describe('stations', () => {
  it('the admin adds and changes stations; the rules of a station hold', async () => {
    const s = await newStation(admin, { name: `Bench ${process.pid}-${Date.now()}`, kind: 'bench', spindleRpm: null, setupSeconds: 120 });
    expect(s).toMatchObject({ kind: 'bench', spindleRpm: null, setupSeconds: 120, active: true });
    const dup = await admin.post('/api/stations').set(csrf).send({ name: s.name.toUpperCase(), kind: 'bench' });
    expect(dup.status).toBe(409);
    const noSpindle = await admin.post('/api/stations').set(csrf).send({ name: `W-${Date.now()}`, kind: 'winder' });
    expect(noSpindle.status).toBe(422);
    expect(noSpindle.body.error.fields).toHaveProperty('spindleRpm');
    const range = await admin.patch(`/api/stations/${s.id}`).set(csrf).send({ wireDiameterMin: 0.5e-3, wireDiameterMax: 0.2e-3 });
    expect(range.status).toBe(422);
    expect(range.body.error.fields).toHaveProperty('wireDiameterMax');
    const bad = await admin.post('/api/stations').set(csrf).send({ name: '', kind: 'lathe', spindleRpm: -1 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['kind', 'name', 'spindleRpm']);
    const off = await admin.patch(`/api/stations/${s.id}`).set(csrf).send({ active: false });
    expect(off.body.station.active).toBe(false);
    expect((await admin.patch('/api/stations/999999999').set(csrf).send({ active: true })).status).toBe(404);
    const active = await foreman.get('/api/stations?active=true');
    expect(active.status).toBe(200);
    expect(active.body.stations.map((x: { id: number }) => x.id)).not.toContain(s.id);
  });
});

describe('the board', () => {
  it('lists cards with filters by person, station, customer, due window and lateness', async () => {
    const ann = await floorUser(t, 'Board Ann');
    const st = await newStation(admin);
    const a = await foreman.post('/api/work-orders/assign').set(csrf).send({ ids: [soon[0].id], assigneeId: ann.id, stationId: st.id });
    expect(a.status, JSON.stringify(a.body)).toBe(200);
    const byPerson = await foreman.get(`/api/work-orders?assignee=${ann.id}`);
    expect(byPerson.body.workOrders.map((c: { id: number }) => c.id)).toEqual([soon[0].id]);
    const card = byPerson.body.workOrders[0];
    expect(card).toMatchObject({
      number: soon[0].number,
      quantity: 25,
      priority: 0,
      stage: 'ready',
      assignee: { id: ann.id, name: 'Board Ann' },
      station: { id: st.id, name: st.name },
      order: { customer: { id: company.id, name: company.name } },
      line: { title: 'Board coil soon' },
      late: false,
      enteredStageAt: expect.any(String),
      estimatedHours: expect.any(Number),
    });
    expect(card.allowedMoves).toContain('winding');
    expect(card.allowedMoves).not.toContain('shipped');
    const byStation = await foreman.get(`/api/work-orders?station=${st.id}`);
    expect(byStation.body.workOrders.map((c: { id: number }) => c.id)).toEqual([soon[0].id]);
    const mine = await foreman.get(`/api/work-orders?customer=${company.id}&assignee=none`);
    expect(mine.body.workOrders.map((c: { id: number }) => c.id).sort()).toEqual([soon[1].id, ...later.map((w) => w.id)].sort());
    const window = await foreman.get(`/api/work-orders?customer=${company.id}&dueFrom=${inDays(30)}&dueTo=${inDays(50)}`);
    expect(window.body.workOrders.map((c: { id: number }) => c.id).sort()).toEqual(later.map((w) => w.id).sort());
    const notLate = await foreman.get(`/api/work-orders?customer=${company.id}&late=false`);
    expect(notLate.body.workOrders).toHaveLength(4);
    const late = await foreman.get(`/api/work-orders?customer=${company.id}&late=true`);
    expect(late.body.workOrders).toEqual([]);
    const bad = await foreman.get('/api/work-orders?assignee=someone&late=maybe&dueFrom=2026-13-45');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['assignee', 'dueFrom', 'late']);
  });
});

describe('the load view', () => {
  it('estimates winding as turns ÷ spindle speed + set-up, plus the shop standard times', async () => {
    const bob = await floorUser(t, 'Load Bob');
    const st = await newStation(admin, { spindleRpm: 1000, setupSeconds: 900 });
    // Due in 3 days (inside a 7-day window). A later stage counts only what is left (below).
    const target = soon[1];
    const res = await foreman.post('/api/work-orders/assign').set(csrf).send({ ids: [target.id], assigneeId: bob.id, stationId: st.id });
    expect(res.status).toBe(200);
    const detail = await foreman.get(`/api/work-orders/${target.id}`);
    const turns: number = detail.body.buildSheet.turns;
    const times = JSON.parse(SHOP_DEFAULTS.stageStandardTimes) as Record<string, { minutesPerUnit: number; minutesPerBatch: number }>;
    // By hand: 25 units × turns ÷ 1000 rev/min ÷ 60 + 900 s ÷ 3600; then every standard-timed stage from ready to packing.
    const winding = (25 * turns) / 1000 / 60 + 900 / 3600;
    const other = Object.values(times).reduce((h, x) => h + (x.minutesPerUnit * 25 + x.minutesPerBatch) / 60, 0);
    const load = await foreman.get('/api/floor/load?days=7');
    expect(load.status, JSON.stringify(load.body)).toBe(200);
    const person = load.body.people.find((p: { id: number }) => p.id === bob.id);
    const station = load.body.stations.find((s: { id: number }) => s.id === st.id);
    for (const row of [person, station]) {
      expect(row.workOrders).toBe(1);
      expect(row.windingHours).toBeCloseTo(winding, 2);
      expect(row.otherHours).toBeCloseTo(other, 2);
      expect(row.hours).toBeCloseTo(winding + other, 2);
      expect(row.byDay).toHaveLength(7);
      expect(row.byDay[3].hours).toBeCloseTo(winding + other, 2);
    }
    expect(detail.body.estimatedHours).toBeCloseTo(winding + other, 2);
    await moveOk(foreman, target.id, 'testing');
    const after = await foreman.get('/api/floor/load?days=7');
    const left = ['testing', 'inspection', 'packing'].reduce((h, s) => h + (times[s].minutesPerUnit * 25 + times[s].minutesPerBatch) / 60, 0);
    expect(after.body.people.find((p: { id: number }) => p.id === bob.id).hours).toBeCloseTo(left, 2);
    expect((await foreman.get('/api/floor/load?days=99')).status).toBe(400);
  });
});

describe('the live feed', () => {
  it('delivers a message over server-sent events after a move', async () => {
    const feed = await openFloorFeed(t);
    const { base, cookie, stream } = feed;
    expect(stream.status).toBe(200);
    expect(stream.headers.get('content-type')).toMatch(/text\/event-stream/);
    const readUntil = feed.readUntil;
    await readUntil(/event: ready/);
    const w = later[0];
    const moved = await fetch(`${base}/api/work-orders/${w.id}/move`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json', [CSRF_HEADER]: CSRF_VALUE },
      body: JSON.stringify({ to: 'winding', version: w.version }),
    });
    expect(moved.status).toBe(200);
    await readUntil(new RegExp(`"id":${w.id}[,}]`));
    const block = feed.text.split('\n\n').find((b) => b.includes(`"id":${w.id}`))!;
    expect(block).toMatch(/^event: work-order$/m);
    const data = JSON.parse(block.split('\n').find((l) => l.startsWith('data: '))!.slice(6));
    expect(data).toMatchObject({ kind: 'move', id: w.id, number: w.number, stage: 'winding', version: w.version + 1 });
    feed.close();
  });
});

describe('the demo floor (seeded by the global setup)', () => {
  it('has work in every floor stage, holds with reasons and five floor staff with their own queues', async () => {
    const board = await foreman.get('/api/work-orders');
    const cards = board.body.workOrders as { stage: string; holdReason?: string | null; assignee?: { id: number } | null; station: unknown }[];
    const count = (s: string) => cards.filter((c) => c.stage === s).length;
    for (const s of ['ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection', 'packing', 'on_hold', 'rework']) expect(count(s), s).toBeGreaterThanOrEqual(2);
    for (const s of ['winding', 'testing', 'packing']) expect(count(s), s).toBeGreaterThanOrEqual(3);
    for (const c of cards.filter((x) => x.stage === 'on_hold')) expect(c.holdReason).toBeTruthy();
    const wendell = await t.signIn({ email: 'wendell@spoolwright.test', password: DEMO_PASSWORD });
    const mine = await wendell.get('/api/floor/my-work');
    expect(mine.status).toBe(200);
    expect(mine.body.workOrders.length).toBeGreaterThan(0);
    const stationsRes = await foreman.get('/api/stations');
    expect(stationsRes.body.stations.length).toBeGreaterThanOrEqual(6);
  });
});
