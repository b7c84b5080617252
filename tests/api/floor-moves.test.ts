import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { csrf, testApp } from '../helpers/app';
import { customerAgent, newCompany } from '../helpers/orders';
import { floorUser, move, moveOk, newStation, passAllUnits, receiveFloorWire, releasedWorkOrders, type Wo } from '../helpers/floor';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let foreman: Agent;
let admin: Agent;
let office: Agent;
let company: { id: number };
let ann: Awaited<ReturnType<typeof floorUser>>;
let ben: Awaited<ReturnType<typeof floorUser>>;
let winder: { id: number; name: string };
const LOT = `FLOOR-MOVES-${process.pid}`;

let pool: Wo[] = [];
/** A fresh work order in `ready` for each test. */
const fresh = () => {
  const w = pool.shift();
  if (!w) throw new Error('out of work orders: release more in beforeAll');
  return w;
};
const assign = (ids: number[], body: Record<string, unknown>) => foreman.post('/api/work-orders/assign').set(csrf).send({ ids, ...body });
const eventCount = async (id: number) => Number((await t.deps.db.execute<{ n: string }>(sql`select count(*) as n from work_order_events where work_order_id = ${id}`)).rows[0].n);

/** Walks a work order with the foreman to a stage (forward one at a time, winding recorded). */
async function walkTo(id: number, to: string) {
  const order = ['ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection', 'packing'];
  for (const stage of order.slice(1, order.indexOf(to) + 1)) {
    const extra = stage === 'terminating' ? { turnsCounter: 1200, spoolLot: LOT, stationId: winder.id } : {};
    await moveOk(foreman, id, stage, extra);
    // The packing gate needs every unit's test passed (test records): record them on reaching testing.
    if (stage === 'testing') await passAllUnits(foreman, id);
  }
}

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  admin = await t.signIn('admin');
  office = await t.signIn('office');
  company = await newCompany(office, [{ name: 'Floor Buyer', email: 'floor-buyer@example.test' }]);
  await receiveFloorWire(office, LOT);
  pool = await releasedWorkOrders(t, company.id, 24);
  ann = await floorUser(t, 'Ann Test-Floor');
  ben = await floorUser(t, 'Ben Test-Floor');
  winder = await newStation(admin);
});

describe('the move table: floor staff', () => {
  it('move unassigned work forward one stage; each move writes one event and bumps the version', async () => {
    const w = fresh();
    const before = await eventCount(w.id);
    const res = await ann.agent.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'winding', version: w.version, note: 'Starting' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ id: w.id, stage: 'winding', version: w.version + 1 });
    expect(await eventCount(w.id)).toBe(before + 1);
    expect(res.body.events.at(-1)).toMatchObject({ kind: 'move', fromStage: 'ready', toStage: 'winding', note: 'Starting', user: { id: ann.id, name: ann.name } });
  });

  it('may not skip a stage, move work assigned to someone else, or hold', async () => {
    const w = fresh();
    const skip = await move(ann.agent, w.id, 'terminating');
    expect(skip.status).toBe(422);
    expect(skip.body.error).toMatchObject({ code: 'rule', rule: 'floor_one_step' });
    expect((await assign([w.id], { assigneeId: ben.id })).status).toBe(200);
    const notMine = await move(ann.agent, w.id, 'winding');
    expect(notMine.body.error).toMatchObject({ code: 'rule', rule: 'floor_not_yours' });
    const hold = await move(ben.agent, w.id, 'on_hold', { note: 'No bobbins' });
    expect(hold.body.error).toMatchObject({ rule: 'floor_stages_only' });
    await moveOk(ben.agent, w.id, 'winding');
  });

  it('step back one stage only on their own work, with a note', async () => {
    const w = fresh();
    await moveOk(foreman, w.id, 'winding');
    const unassigned = await move(ann.agent, w.id, 'ready', { note: 'Wrong job' });
    expect(unassigned.body.error).toMatchObject({ rule: 'floor_back_own_only' });
    await assign([w.id], { assigneeId: ann.id });
    const noNote = await move(ann.agent, w.id, 'ready');
    expect(noNote.status).toBe(422);
    expect(noNote.body.error).toMatchObject({ rule: 'note_required', fields: { note: expect.any(String) } });
    const back = await moveOk(ann.agent, w.id, 'ready', { note: 'Scanned the wrong traveler' });
    const stages = back.events.filter((e: { kind: string }) => e.kind !== 'assign').map((e: { toStage: string }) => e.toStage);
    expect(stages).toEqual(['ready', 'winding', 'ready']);
    expect(back.events.filter((e: { kind: string }) => e.kind === 'move')).toHaveLength(2);
  });

  it('record turns, spool lot and station when finishing winding', async () => {
    const w = fresh();
    await assign([w.id], { assigneeId: ann.id });
    await moveOk(ann.agent, w.id, 'winding');
    const missing = await move(ann.agent, w.id, 'terminating');
    expect(missing.status).toBe(422);
    expect(missing.body.error.rule).toBe('winding_record');
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['spoolLot', 'stationId', 'turnsCounter']);
    const badLot = await move(ann.agent, w.id, 'terminating', { turnsCounter: 1210, spoolLot: 'NO-SUCH-LOT-x9', stationId: winder.id });
    expect(badLot.status).toBe(422);
    expect(badLot.body.error.fields).toHaveProperty('spoolLot');
    const badStation = await move(ann.agent, w.id, 'terminating', { turnsCounter: 1210, spoolLot: LOT, stationId: 999999 });
    expect(badStation.body.error).toMatchObject({ rule: 'station_unusable', fields: { stationId: expect.any(String) } });
    const bad = await move(ann.agent, w.id, 'terminating', { turnsCounter: -3, spoolLot: '' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['spoolLot', 'turnsCounter']);
    const done = await moveOk(ann.agent, w.id, 'terminating', { turnsCounter: 1210, spoolLot: LOT, stationId: winder.id });
    expect(done.events.at(-1)).toMatchObject({ fromStage: 'winding', toStage: 'terminating', turnsCounter: 1210, spoolLot: LOT, stationId: winder.id, station: { id: winder.id, name: winder.name } });
    const misplaced = await move(ann.agent, w.id, 'impregnating', { turnsCounter: 5 });
    expect(misplaced.body.error).toMatchObject({ rule: 'winding_data_misplaced', fields: { turnsCounter: expect.any(String) } });
  });
});

describe('the move table: foreman and admin', () => {
  it('move anything anywhere in the flow; backwards needs a note', async () => {
    const w = fresh();
    await moveOk(foreman, w.id, 'impregnating');
    const back = await move(foreman, w.id, 'ready');
    expect(back.body.error).toMatchObject({ rule: 'note_required', fields: { note: expect.any(String) } });
    await moveOk(admin, w.id, 'ready', { note: 'Bobbin batch recalled' });
    const same = await move(foreman, w.id, 'ready');
    expect(same.body.error).toMatchObject({ rule: 'same_stage' });
  });

  it('hold needs a reason; the board shows it; leaving a hold goes to a flow stage', async () => {
    const w = fresh();
    await moveOk(foreman, w.id, 'winding');
    const noReason = await move(foreman, w.id, 'on_hold', { note: '   ' });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error).toMatchObject({ rule: 'hold_needs_reason', fields: { note: expect.any(String) } });
    const held = await moveOk(foreman, w.id, 'on_hold', { note: 'Waiting for the customer to confirm lead length' });
    expect(held.holdReason).toBe('Waiting for the customer to confirm lead length');
    const board = await foreman.get(`/api/work-orders?stage=on_hold&customer=${company.id}`);
    expect(board.body.workOrders.find((c: { id: number }) => c.id === w.id)).toMatchObject({ holdReason: 'Waiting for the customer to confirm lead length' });
    const side = await move(foreman, w.id, 'rework', { note: 'x' });
    expect(side.body.error).toMatchObject({ rule: 'side_returns_to_flow' });
    const floorLeave = await move(ann.agent, w.id, 'winding');
    expect(floorLeave.body.error.rule).toBe('floor_stages_only');
    await moveOk(foreman, w.id, 'winding', { note: 'Confirmed by phone' });
  });

  it('rework needs a note and returns to a flow stage', async () => {
    const w = fresh();
    await walkTo(w.id, 'testing');
    expect((await move(foreman, w.id, 'rework')).body.error.rule).toBe('note_required');
    await moveOk(foreman, w.id, 'rework', { note: 'Two units open circuit' });
    await moveOk(foreman, w.id, 'winding', { note: 'Rewind the two' });
  });

  it('nobody moves a work order to shipped: only a shipment does', async () => {
    const w = fresh();
    await walkTo(w.id, 'packing');
    for (const agent of [foreman, admin]) {
      const res = await move(agent, w.id, 'shipped');
      expect(res.status).toBe(422);
      expect(res.body.error).toMatchObject({ code: 'rule', rule: 'shipped_by_shipment', message: expect.stringMatching(/shipment/) });
    }
  });
});

describe('the packing gate', () => {
  it('opens only from inspection (the signature), or back from a hold taken in packing', async () => {
    const w = fresh();
    await walkTo(w.id, 'testing');
    const jump = await move(foreman, w.id, 'packing');
    expect(jump.status).toBe(422);
    expect(jump.body.error).toMatchObject({ rule: 'packing_gate', message: expect.stringMatching(/inspection/) });
    await moveOk(foreman, w.id, 'inspection');
    await moveOk(foreman, w.id, 'packing');
    await moveOk(foreman, w.id, 'on_hold', { note: 'Customer asked to hold shipment' });
    await moveOk(foreman, w.id, 'packing', { note: 'Released by customer' });
  });

  it('refuses packing after rework until inspected again; floor staff sign inspection on their own move', async () => {
    const w = fresh();
    await walkTo(w.id, 'inspection');
    await moveOk(foreman, w.id, 'rework', { note: 'Lead sleeving missing' });
    expect((await move(foreman, w.id, 'packing')).body.error.rule).toBe('packing_gate');
    await moveOk(foreman, w.id, 'inspection', { note: 'Sleeving fitted' });
    await assign([w.id], { assigneeId: ann.id });
    await moveOk(ann.agent, w.id, 'packing');
    expect((await move(ann.agent, w.id, 'shipped')).body.error.rule).toBe('shipped_by_shipment');
  });
});

describe('optimistic locking', () => {
  it('answers a stale version with 409 and the work order as it is now', async () => {
    const w = fresh();
    await moveOk(foreman, w.id, 'winding');
    const res = await foreman.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'ready', version: w.version, note: 'x' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'conflict', current: { id: w.id, stage: 'winding', version: w.version + 1 } });
  });

  it('two moves with the same version at once: one 200, one 409, one new event', async () => {
    const w = fresh();
    const before = await eventCount(w.id);
    const [a, b] = await Promise.all([
      foreman.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'winding', version: w.version }),
      admin.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'on_hold', version: w.version, note: 'Hold it' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect(await eventCount(w.id)).toBe(before + 1);
    const now = await foreman.get(`/api/work-orders/${w.id}`);
    expect(now.body.version).toBe(w.version + 1);
  });

  it('bad input is 400 with fields; an unknown work order is 404', async () => {
    const w = fresh();
    const bad = await foreman.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'flying', version: 'one' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['to', 'version']);
    expect((await foreman.post('/api/work-orders/999999999/move').set(csrf).send({ to: 'winding', version: 1 })).status).toBe(404);
  });
});

describe('assignment', () => {
  it('assigns a batch to a person and a station, with one event each and a version bump', async () => {
    const ws = [fresh(), fresh(), fresh()];
    const res = await assign(
      ws.map((w) => w.id),
      { assigneeId: ann.id, stationId: winder.id, versions: ws.map((w) => w.version) },
    );
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.workOrders).toHaveLength(3);
    for (const c of res.body.workOrders) expect(c).toMatchObject({ assignee: { id: ann.id, name: ann.name }, station: { id: winder.id, name: winder.name }, version: 2 });
    const d = await foreman.get(`/api/work-orders/${ws[0].id}`);
    expect(d.body.events.at(-1)).toMatchObject({ kind: 'assign', fromStage: 'ready', toStage: 'ready', note: `Assigned to ${ann.name} at station ${winder.name}`, assignee: { id: ann.id } });
    const mine = await ann.agent.get('/api/floor/my-work');
    expect(mine.status).toBe(200);
    const ids = mine.body.workOrders.map((x: { id: number }) => x.id);
    for (const w of ws) expect(ids).toContain(w.id);
    expect(mine.body.workOrders[0].buildSheet).toMatchObject({ turns: expect.any(Number) });
  });

  it('is all or nothing: one unknown id, a non-floor assignee, an inactive station or a stale version changes nothing', async () => {
    const ws = [fresh(), fresh()];
    const ids = ws.map((w) => w.id);
    const unknown = await assign([...ids, 999999999], { assigneeId: ben.id });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields.ids).toMatch(/999999999/);
    const officeUser = (await t.deps.db.execute<{ id: number }>(sql`select id from users where email = 'office@spoolwright.test'`)).rows[0].id;
    const notFloor = await assign(ids, { assigneeId: officeUser });
    expect(notFloor.status).toBe(422);
    expect(notFloor.body.error.fields).toHaveProperty('assigneeId');
    const retired = await newStation(admin, { kind: 'bench', spindleRpm: null, active: false });
    const inactive = await assign(ids, { stationId: retired.id });
    expect(inactive.status).toBe(422);
    expect(inactive.body.error.fields).toHaveProperty('stationId');
    const stale = await assign(ids, { assigneeId: ben.id, versions: [ws[0].version, ws[1].version + 5] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.current).toHaveLength(2);
    const none = await assign(ids, {});
    expect(none.status).toBe(400);
    for (const w of ws) {
      const d = await foreman.get(`/api/work-orders/${w.id}`);
      expect(d.body).toMatchObject({ version: w.version, assignee: null, station: null });
      expect(d.body.events.filter((e: { kind: string }) => e.kind === 'assign')).toEqual([]);
    }
  });

  it('sets the priority with the version; a stale one is 409', async () => {
    const w = fresh();
    const res = await foreman.patch(`/api/work-orders/${w.id}`).set(csrf).send({ priority: 2, version: w.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ priority: 2, version: w.version + 1 });
    expect(res.body.events.at(-1)).toMatchObject({ kind: 'priority', note: 'Priority Normal → Urgent' });
    const stale = await foreman.patch(`/api/work-orders/${w.id}`).set(csrf).send({ priority: 1, version: w.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.current).toMatchObject({ priority: 2 });
    expect((await foreman.patch(`/api/work-orders/${w.id}`).set(csrf).send({ priority: 7, version: 1 })).status).toBe(400);
  });
});

describe('roles and the customer', () => {
  it('office, engineer and shipping may not move; a customer sees only its company, without staff data', async () => {
    const w = fresh();
    for (const role of ['office', 'engineer', 'shipping'] as const) {
      const res = await (await t.signIn(role)).post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'winding', version: w.version });
      expect(res.status).toBe(403);
    }
    const own = await customerAgent(t, company.id);
    const list = await own.get('/api/work-orders');
    expect(list.status).toBe(200);
    expect(list.body.workOrders.length).toBeGreaterThan(0);
    for (const c of list.body.workOrders) {
      expect(c.order.customer.id).toBe(company.id);
      expect(c).not.toHaveProperty('assignee');
      expect(c).not.toHaveProperty('allowedMoves');
      expect(c).not.toHaveProperty('holdReason');
    }
    const other = await newCompany(office, []);
    const stranger = await customerAgent(t, other.id);
    expect((await stranger.get(`/api/work-orders/${w.id}`)).status).toBe(404);
    expect((await stranger.get(`/api/work-orders?customer=${company.id}`)).body.workOrders).toEqual([]);
    expect((await stranger.post(`/api/work-orders/${w.id}/move`).set(csrf).send({ to: 'winding', version: w.version })).status).toBe(403);
    expect((await stranger.get('/api/floor/events')).status).toBe(403);
  });
});
