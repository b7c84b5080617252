import { afterAll, describe, expect, it } from 'vitest';
import { testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

describe('GET /api/work-orders?number= (what a scanner types)', () => {
  it('finds exactly one work order by its number in any letter case, and none for an unknown one', async () => {
    const foreman = await t.signIn('foreman');
    const all = (await foreman.get('/api/work-orders')).body.workOrders as { id: number; number: string }[];
    expect(all.length).toBeGreaterThan(2);
    const pick = all[Math.floor(all.length / 2)];
    const res = await foreman.get(`/api/work-orders?number=${pick.number.toLowerCase()}`);
    expect(res.status).toBe(200);
    expect(res.body.workOrders.map((w: { id: number }) => w.id)).toEqual([pick.id]);
    const none = await foreman.get('/api/work-orders?number=WO-99-99999');
    expect(none.body.workOrders).toEqual([]);
    const bad = await foreman.get(`/api/work-orders?number=${'X'.repeat(40)}`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.number).toBeTruthy();
  });
});
