import { expect } from 'vitest';
import type { RequirementInput } from '../../src/contracts/orders';
import { csrf, uniqueEmail, type testApp } from './app';

type T = ReturnType<typeof testApp>;
type Agent = Awaited<ReturnType<T['signIn']>>;

export const PASSWORD = 'a long enough password';

/** A 24 V DC solenoid requirement in SI (invented demo values). */
export const solenoid24V = (): RequirementInput => ({
  drive: { kind: 'voltage', volts: 24 },
  dutyCycle: 1,
  ambient: 40,
  insulationClass: 155,
  bobbin: { innerDiameter: 0.012, outerDiameter: 0.03, length: 0.035 },
  target: { kind: 'ampereTurns', ampereTurns: 900 },
});

/** A 12 V DC plunger magnet with a pull target at a 2 mm gap (invented demo values). */
export const plunger12V = (): RequirementInput => ({
  drive: { kind: 'voltage', volts: 12 },
  dutyCycle: 0.5,
  ambient: 25,
  insulationClass: 130,
  bobbin: { innerDiameter: 0.01, outerDiameter: 0.028, length: 0.032 },
  magneticCircuit: { relativePermeability: 2000, saturationFluxDensity: 1.5, ironPathLength: 0.06, airGap: 0.002, gapCount: 1, area: 9.5e-5 },
  target: { kind: 'pull', force: 10 },
});

export const line = (over: Record<string, unknown> = {}) => ({ quantity: 10, title: 'Valve coil 24 V DC', requirement: solenoid24V(), ...over });

let po = 0;
/** A purchase-order number no other test uses. */
export const uniquePo = (prefix = 'PO') => `${prefix}-${process.pid}-${Date.now().toString(36)}-${++po}`;

export const inDays = (days: number) => {
  const d = new Date();
  d.setDate(d.getDate() + days);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}`;
};

/** A new customer company (with the given contacts) entered by the office. */
export async function newCompany(office: Agent, contacts: unknown[] = [], name = `Test Company ${uniquePo('C')}`) {
  const res = await office.post('/api/customers').set(csrf).send({ name, contacts });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.customer as { id: number; name: string; contacts: { id: number; name: string; email: string }[] };
}

/** A customer-role user of a company, signed in. */
export async function customerAgent(t: T, companyId: number) {
  const admin = await t.signIn('admin');
  const email = uniqueEmail('buyer');
  const res = await admin.post('/api/users').set(csrf).send({ email, name: 'Test Buyer', role: 'customer', password: PASSWORD, customerId: companyId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return t.signIn({ email, password: PASSWORD });
}

/** Enters an order through the API and returns its detail. */
export async function newOrder(office: Agent, customerId: number, over: Record<string, unknown> = {}) {
  const res = await office
    .post('/api/orders')
    .set(csrf)
    .send({ customerId, purchaseOrder: uniquePo(), dueDate: inDays(30), lines: [line()], ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order as { id: number; number: string; status: string; lines: { id: number; lineNo: number }[] } & Record<string, unknown>;
}
