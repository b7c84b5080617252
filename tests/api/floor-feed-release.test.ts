import { afterAll, describe, expect, it } from 'vitest';
import { csrf, testApp } from '../helpers/app';
import { acknowledgedOrder, approvedSheet } from '../helpers/build-sheets';
import { floorSpec, openFloorFeed, receiveFloorWire } from '../helpers/floor';
import { newCompany } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

describe('the board hears of releases and of work orders a new sheet version puts on hold', () => {
  it('sends a release message per new work order, and a move to on_hold when a sheet is superseded', async () => {
    const office = await t.signIn('office');
    const engineer = await t.signIn('engineer');
    await receiveFloorWire(engineer, `FEED-${Date.now()}`);
    const company = await newCompany(office, [], `Feed Test Works ${Date.now()}`);
    const order = await acknowledgedOrder(office, company.id, [30]);
    const lineId = order.lines[0].id;
    const v1 = await approvedSheet(engineer, lineId, floorSpec());

    const feed = await openFloorFeed(t);
    const readUntil = feed.readUntil;
    const messages = () =>
      feed.text
        .split('\n\n')
        .filter((b) => b.startsWith('event: work-order'))
        .map((b) => JSON.parse(b.split('\n').find((l) => l.startsWith('data: '))!.slice(6)) as { kind: string; id: number; stage: string });
    try {
      await readUntil(/event: ready/);
      const first = await engineer.post(`/api/build-sheets/${v1.id}/release`).set(csrf).send({});
      expect(first.status, JSON.stringify(first.body)).toBe(200);
      const ids = (first.body.workOrders as { id: number }[]).map((w) => w.id);
      expect(ids).toHaveLength(2); // 30 units at 25 per work order
      for (const id of ids) await readUntil(new RegExp(`"kind":"release","id":${id}[,}]`));
      expect(messages().filter((m) => ids.includes(m.id)).every((m) => m.kind === 'release' && m.stage === 'ready')).toBe(true);

      const v2 = await approvedSheet(engineer, lineId, { ...floorSpec(), leadLength: 0.2 });
      const second = await engineer.post(`/api/build-sheets/${v2.id}/release`).set(csrf).send({});
      expect(second.status, JSON.stringify(second.body)).toBe(200);
      for (const id of ids) await readUntil(new RegExp(`"kind":"move","id":${id},[^}]*"stage":"on_hold"`));
    } finally {
      feed.close();
    }
  });
});
