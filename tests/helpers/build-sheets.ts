import { expect } from 'vitest';
import type { CoilSpec } from '../../src/contracts/coil';
import { csrf, type testApp } from './app';
import { line, newOrder } from './orders';

type T = ReturnType<typeof testApp>;
type Agent = Awaited<ReturnType<T['signIn']>>;

/**
 * A 24 V DC layer-wound coil on a 12/30 × 35 mm bobbin (invented demo values), copper grade 3.
 * Grade 3 is never stocked by the demo seed, so each test file owns its wire: AWG 32–34 run
 * within class 155 here, AWG 28 runs over it (the engine's own results are asserted where it matters).
 */
export const coilSpec = (gauge: number, over: Partial<CoilSpec> = {}): CoilSpec => ({
  conductor: 'copper',
  wire: { standard: 'AWG', gauge },
  insulationGrade: 3,
  bobbin: { innerDiameter: 0.012, outerDiameter: 0.03, length: 0.035 },
  pattern: 'layer',
  drive: { kind: 'voltage', volts: 24 },
  dutyCycle: 1,
  ambient: 40,
  insulationClass: 155,
  ...over,
});

/** An order entered and acknowledged through the API, with lines of the given quantities. */
export async function acknowledgedOrder(office: Agent, customerId: number, quantities: number[], over: Record<string, unknown> = {}) {
  const order = await newOrder(office, customerId, { lines: quantities.map((quantity, i) => line({ quantity, title: `Test coil ${i + 1}` })), ...over });
  const ack = await office.post(`/api/orders/${order.id}/acknowledge`).set(csrf).send({});
  expect(ack.status, JSON.stringify(ack.body)).toBe(200);
  return order;
}

export async function draftSheet(engineer: Agent, lineId: number, spec: CoilSpec, extra: Record<string, unknown> = {}) {
  const res = await engineer.post(`/api/order-lines/${lineId}/build-sheet`).set(csrf).send({ spec, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; version: number; status: string; spec: CoilSpec; result: Record<string, unknown> & { wireMass: number; turns: number; resistance20: number; warnings: { code: string }[] } };
}

/** Drafts and approves a sheet; returns the approved record. */
export async function approvedSheet(engineer: Agent, lineId: number, spec: CoilSpec) {
  const d = await draftSheet(engineer, lineId, spec);
  const res = await engineer.post(`/api/build-sheets/${d.id}/approve`).set(csrf).send({});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as typeof d;
}

/** Receives a spool of copper AWG `gauge` (grade 3 unless told) through the API. */
export async function receiveSpool(agent: Agent, gauge: number, netMass: number, receivedAt?: string, lot = `LOT-${Math.random().toString(36).slice(2, 8)}`, insulationGrade = 3) {
  const res = await agent
    .post('/api/spools')
    .set(csrf)
    .send({ conductor: 'copper', wire: { standard: 'AWG', gauge }, insulationGrade, supplier: 'Test Wire Supplies', lot, netMass, location: 'Test rack', ...(receivedAt && { receivedAt }) });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.spool as { id: number; netMass: number; reservedMass: number; freeMass: number; lot: string };
}
