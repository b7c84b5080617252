import { expect } from 'vitest';
import { csrf, type testApp } from './app';
import { moveOk, receiveFloorWire, releasedWorkOrders, type Wo } from './floor';

type T = ReturnType<typeof testApp>;
type Agent = Awaited<ReturnType<T['signIn']>>;

/** Releases work orders of 25 units and walks them with the foreman to testing (winding recorded). */
export async function workOrdersInTesting(t: T, foreman: Agent, companyId: number, count: number, lot: string, stationId: number): Promise<(Wo & { nominal: number; tolerance: number; buildSheetId: number })[]> {
  const office = await t.signIn('office');
  await receiveFloorWire(office, lot);
  const wos = await releasedWorkOrders(t, companyId, count, 30, 'Test-record coil');
  const out = [];
  for (const w of wos) {
    for (const stage of ['winding', 'terminating', 'impregnating', 'curing', 'testing']) {
      await moveOk(foreman, w.id, stage, stage === 'terminating' ? { turnsCounter: 1000, spoolLot: lot, stationId } : {});
    }
    const cur = await foreman.get(`/api/work-orders/${w.id}`);
    expect(cur.status).toBe(200);
    out.push({ ...w, nominal: cur.body.buildSheet.resistance20 as number, tolerance: cur.body.buildSheet.tolerancePercent as number, buildSheetId: cur.body.buildSheet.id as number, number: cur.body.number as string });
  }
  return out;
}

/** Posts a test record; returns the response. */
export const recordTest = (agent: Agent, woId: number, body: Record<string, unknown>) => agent.post(`/api/work-orders/${woId}/test-records`).set(csrf).send(body);
