/**
 * The board endpoint: columns with counts and hours, cards in the foreman's order, pages after a
 * cursor, search and filters, ETag / 304 and the cache emptied by a change (made in this process or
 * in another one, heard through the live feed), and the card the live feed carries. Speed is the
 * bench's business (npm run bench:floor), never asserted here.
 *
 * Hours are checked against a hand computation of the shop's estimate rule (common practice, no
 * published source; the rule is documented in src/contracts/floor.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { FLOOR_CHANNEL } from '../../server/floor/feed';
import { SHOP_DEFAULTS } from '../../server/settings/service';
import { csrf, testApp } from '../helpers/app';
import { newCompany } from '../helpers/orders';
import { floorUser, moveOk, openFloorFeed, receiveFloorWire, releasedWorkOrders, type Wo } from '../helpers/floor';

const t = testApp();
// Another connection set on the same database, standing in for another API process.
const other = testApp();
afterAll(async () => {
  await t.close();
  await other.close();
});

type Agent = Awaited<ReturnType<typeof t.signIn>>;
type Card = { id: number; number: string; stage: string; version: number; priority: number; dueDate: string; estimatedHours: number; allowedMoves: string[]; customer: { id: number; name: string } };
type Column = { stage: string; count: number; estimatedHours: number; cards: Card[]; nextCursor: string | null };

let foreman: Agent;
let company: { id: number; name: string };
let wos: Wo[];
const LOT = `BOARD-${process.pid}`;
const times = JSON.parse(SHOP_DEFAULTS.stageStandardTimes) as Record<string, { minutesPerUnit: number; minutesPerBatch: number }>;

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  const office = await t.signIn('office');
  company = await newCompany(office, []);
  await receiveFloorWire(office, LOT);
  wos = await releasedWorkOrders(t, company.id, 4, 20, `Board page coil ${process.pid}`);
  // Priorities: the third urgent, the fourth high, the others normal.
  for (const [i, priority] of [[2, 2], [3, 1]] as const) {
    const res = await foreman.patch(`/api/work-orders/${wos[i].id}`).set(csrf).send({ priority, version: wos[i].version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
});

const col = (body: { columns: Column[] }, stage: string) => body.columns.find((c) => c.stage === stage)!;

describe('GET /api/board', () => {
  it('answers every board column with its count and hours, and the cards in the foreman order', async () => {
    const res = await foreman.get(`/api/board?customer=${company.id}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.columns.map((c: Column) => c.stage)).toEqual(['ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection', 'packing', 'on_hold', 'rework']);
    const ready = col(res.body, 'ready');
    expect(ready.count).toBe(4);
    // Urgent, then high, then the two normal ones by id (same due date).
    expect(ready.cards.map((c) => c.id)).toEqual([wos[2].id, wos[3].id, wos[0].id, wos[1].id]);
    expect(ready.nextCursor).toBeNull();
    // By hand: no station, so the shop's default winder (25 units × turns ÷ rpm ÷ 60 + set-up ÷ 3600),
    // then every standard-timed stage from ready to packing, for each of the four work orders.
    const detail = await foreman.get(`/api/work-orders/${wos[0].id}`);
    const turns: number = detail.body.buildSheet.turns;
    const winding = (25 * turns) / Number(SHOP_DEFAULTS.defaultSpindleRpm) / 60 + Number(SHOP_DEFAULTS.defaultSetupSeconds) / 3600;
    const other = Object.values(times).reduce((h, x) => h + (x.minutesPerUnit * 25 + x.minutesPerBatch) / 60, 0);
    expect(ready.cards[0].estimatedHours).toBeCloseTo(winding + other, 2);
    expect(ready.estimatedHours).toBeCloseTo(4 * (winding + other), 1);
    expect(Object.keys(ready.cards[0]).sort()).toEqual(
      ['allowedMoves', 'assignee', 'atRisk', 'customer', 'dueDate', 'enteredStageAt', 'estimatedHours', 'holdReason', 'id', 'late', 'number', 'orderNumber', 'priority', 'quantity', 'stage', 'station', 'title', 'version'].sort(),
    );
    expect(ready.cards[0].allowedMoves).toContain('winding');
    expect(res.body.choices.customers).toContainEqual({ id: company.id, name: company.name });
    // Counts only.
    const totals = await foreman.get(`/api/board?customer=${company.id}&limit=0`);
    expect(col(totals.body, 'ready')).toMatchObject({ count: 4, cards: [], nextCursor: null });
  });

  it('pages a column with a cursor, every card once', async () => {
    const first = await foreman.get(`/api/board?customer=${company.id}&limit=3`);
    const ready = col(first.body, 'ready');
    expect(ready.cards).toHaveLength(3);
    expect(ready.nextCursor).toEqual(expect.any(String));
    const next = await foreman.get(`/api/board/columns/ready?customer=${company.id}&limit=3&cursor=${encodeURIComponent(ready.nextCursor!)}`);
    expect(next.status, JSON.stringify(next.body)).toBe(200);
    expect(next.body).toMatchObject({ stage: 'ready', count: 4, nextCursor: null });
    expect([...ready.cards, ...next.body.cards].map((c: Card) => c.id)).toEqual([wos[2].id, wos[3].id, wos[0].id, wos[1].id]);
  });

  it('refuses a bad cursor, stage or filter with 400 naming the field', async () => {
    const badCursor = await foreman.get('/api/board/columns/ready?cursor=nonsense');
    expect(badCursor.status).toBe(400);
    expect(badCursor.body.error.fields).toHaveProperty('cursor');
    const shipped = await foreman.get('/api/board/columns/shipped');
    expect(shipped.status).toBe(400);
    expect(shipped.body.error.fields).toHaveProperty('stage');
    const bad = await foreman.get('/api/board?limit=9999&late=maybe&station=x');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['late', 'limit', 'station']);
  });

  it('finds a work order by part of its number, and by customer or title, in any letter case', async () => {
    const tail = wos[1].number.slice(-5);
    const byNumber = await foreman.get(`/api/board?q=${tail}`);
    const found = byNumber.body.columns.flatMap((c: Column) => c.cards).map((c: Card) => c.number);
    expect(found).toContain(wos[1].number);
    expect(found.every((n: string) => n.includes(tail))).toBe(true);
    const byTitle = await foreman.get(`/api/board?q=${encodeURIComponent(`board PAGE coil ${process.pid}`)}`);
    expect(col(byTitle.body, 'ready').count).toBe(4);
    const byCustomer = await foreman.get(`/api/board?q=${encodeURIComponent(company.name.toUpperCase())}&limit=0`);
    expect(byCustomer.body.columns.reduce((n: number, c: Column) => n + c.count, 0)).toBe(4);
    const wild = await foreman.get(`/api/board?q=${encodeURIComponent('%_')}&customer=${company.id}&limit=0`);
    expect(wild.status).toBe(200);
    expect(col(wild.body, 'ready').count).toBe(0);
  });

  it('shows floor staff the moves that are theirs to make', async () => {
    const hand = await floorUser(t, 'Board Hand');
    const res = await foreman.post('/api/work-orders/assign').set(csrf).send({ ids: [wos[0].id], assigneeId: hand.id });
    expect(res.status).toBe(200);
    const mine = col((await hand.agent.get(`/api/board?customer=${company.id}`)).body, 'ready').cards;
    // Their own work and unassigned work move on one stage; nothing skips ahead or goes on hold.
    expect(mine.find((c) => c.id === wos[0].id)!.allowedMoves).toEqual(['winding']);
    expect(mine.find((c) => c.id === wos[1].id)!.allowedMoves).toEqual(['winding']);
    const foremans = col((await foreman.get(`/api/board?customer=${company.id}`)).body, 'ready').cards;
    expect(foremans.find((c) => c.id === wos[0].id)!.allowedMoves).toEqual(expect.arrayContaining(['winding', 'on_hold', 'rework']));
  });
});

describe('caching', () => {
  it('answers 304 to the ETag it gave, and a new answer after a change made here', async () => {
    const url = `/api/board?customer=${company.id}`;
    const a = await foreman.get(url);
    const etag = a.headers.etag;
    expect(etag).toMatch(/^".+"$/);
    expect(a.headers['cache-control']).toBe('private, no-cache');
    const same = await foreman.get(url).set('If-None-Match', etag);
    expect(same.status).toBe(304);
    await moveOk(foreman, wos[3].id, 'winding');
    const after = await foreman.get(url).set('If-None-Match', etag);
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(etag);
    expect(col(after.body, 'winding').cards.map((c: Card) => c.id)).toContain(wos[3].id);
  });

  it('hears a change made by another API process through the feed, and answers anew', async () => {
    const url = `/api/board?customer=${company.id}`;
    const before = await foreman.get(url);
    const w = wos[0];
    expect(col(before.body, 'ready').cards.find((c) => c.id === w.id)!.priority).toBe(0);
    // Another process's change: committed on its own connection with its NOTIFY (this process did
    // not make it, so only the feed can tell it).
    const c = await other.deps.pool.connect();
    try {
      await c.query('begin');
      const { rows } = await c.query('update work_orders set priority = 1, version = version + 1, updated_at = now() where id = $1 returning number, stage, version, updated_at', [w.id]);
      const change = { kind: 'priority', id: w.id, number: rows[0].number, stage: rows[0].stage, version: rows[0].version, at: rows[0].updated_at.toISOString() };
      await c.query('select pg_notify($1, $2)', [FLOOR_CHANNEL, JSON.stringify(change)]);
      await c.query('commit');
    } finally {
      c.release();
    }
    // The NOTIFY reaches this process a moment later; ask until it has (5 s at most).
    let body = before.body;
    for (let i = 0; i < 50 && col(body, 'ready').cards.find((x) => x.id === w.id)!.priority === 0; i++) {
      await new Promise((r) => setTimeout(r, 100));
      body = (await foreman.get(url)).body;
    }
    expect(col(body, 'ready').cards.find((x) => x.id === w.id)!.priority).toBe(1);
  });

  it('gzips a large answer when asked', async () => {
    const res = await foreman.get('/api/board').set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.body.columns).toHaveLength(10);
  });
});

describe('the live feed', () => {
  it('carries the changed card as the listener sees it', async () => {
    const feed = await openFloorFeed(t);
    try {
      await feed.readUntil(/event: ready/);
      const w = wos[1];
      const cur = await foreman.get(`/api/work-orders/${w.id}`);
      const res = await fetch(`${feed.base}/api/work-orders/${w.id}/move`, {
        method: 'POST',
        headers: { cookie: feed.cookie, 'content-type': 'application/json', [CSRF_HEADER]: CSRF_VALUE },
        body: JSON.stringify({ to: 'winding', version: cur.body.version }),
      });
      expect(res.status).toBe(200);
      await feed.readUntil(new RegExp(`"card":\\{"id":${w.id},`));
      const block = feed.text.split('\n\n').find((b) => b.includes(`"card":{"id":${w.id},`))!;
      const data = JSON.parse(block.split('\n').find((l) => l.startsWith('data: '))!.slice(6));
      expect(data).toMatchObject({ kind: 'move', id: w.id, stage: 'winding', version: cur.body.version + 1 });
      expect(data.card).toMatchObject({ id: w.id, number: w.number, stage: 'winding', version: cur.body.version + 1, customer: { id: company.id } });
      expect(data.card.allowedMoves).toContain('terminating');
    } finally {
      feed.close();
    }
  });
});
