import { expect } from 'vitest';
import { csrf, uniqueEmail, type testApp } from './app';
import { acknowledgedOrder, approvedSheet, coilSpec, receiveSpool } from './build-sheets';
import { PASSWORD, inDays, line, solenoid24V } from './orders';

type T = ReturnType<typeof testApp>;
type Agent = Awaited<ReturnType<T['signIn']>>;

export type Wo = { id: number; number: string; version: number; stage: string; quantity: number };

/** A new floor-role user (admin creates it), signed in. */
export async function floorUser(t: T, name = 'Test Floor Hand') {
  const admin = await t.signIn('admin');
  const email = uniqueEmail('floor');
  const res = await admin.post('/api/users').set(csrf).send({ email, name, role: 'floor', password: PASSWORD });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.user.id as number, name, agent: await t.signIn({ email, password: PASSWORD }) };
}

let stationNo = 0;
/** A new station (admin); a winder by default. */
export async function newStation(admin: Agent, over: Record<string, unknown> = {}) {
  stationNo += 1;
  const res = await admin
    .post('/api/stations')
    .set(csrf)
    .send({ name: `Test winder ${process.pid}-${Date.now().toString(36)}-${stationNo}`, kind: 'winder', spindleRpm: 1500, setupSeconds: 600, wireDiameterMin: 0.1e-3, wireDiameterMax: 0.5e-3, ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.station as { id: number; name: string };
}

/** The floor tests' wire: copper AWG 34 grade 1 — no other test file or the demo seed stocks it. */
export const FLOOR_GAUGE = 34;
export const FLOOR_GRADE = 1;
export const floorSpec = () => coilSpec(FLOOR_GAUGE, { insulationGrade: FLOOR_GRADE });

/** Receives plenty of the floor tests' wire with the given lot. */
export const receiveFloorWire = (agent: Agent, lot: string) => receiveSpool(agent, FLOOR_GAUGE, 2000, '2020-01-01', lot, FLOOR_GRADE);

/** Releases `count` work orders of 25 units (one line) for a company, due in `dueDays`. */
export async function releasedWorkOrders(t: T, companyId: number, count: number, dueDays = 30, title = 'Floor test coil'): Promise<Wo[]> {
  const office = await t.signIn('office');
  const engineer = await t.signIn('engineer');
  const order = await acknowledgedOrder(office, companyId, [25 * count], {
    dueDate: inDays(dueDays),
    lines: [line({ quantity: 25 * count, title, requirement: solenoid24V() })],
  });
  const sheet = await approvedSheet(engineer, order.lines[0].id, floorSpec());
  const res = await engineer.post(`/api/build-sheets/${sheet.id}/release`).set(csrf).send({});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.workOrders as Wo[];
}

/** Moves a work order (reading its current version first); returns the response. */
export async function move(agent: Agent, id: number, to: string, extra: Record<string, unknown> = {}) {
  const cur = await agent.get(`/api/work-orders/${id}`);
  expect(cur.status, JSON.stringify(cur.body)).toBe(200);
  return agent.post(`/api/work-orders/${id}/move`).set(csrf).send({ to, version: cur.body.version, ...extra });
}

/** Moves and expects 200. */
export async function moveOk(agent: Agent, id: number, to: string, extra: Record<string, unknown> = {}) {
  const res = await move(agent, id, to, extra);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

/**
 * Records a passing first test for every unit of a work order (resistance at 20 °C exactly on the
 * build sheet's nominal), so the packing gate's unit count is met. Serials `<WO number>-001` ….
 */
export async function passAllUnits(agent: Agent, id: number) {
  const wo = await agent.get(`/api/work-orders/${id}`);
  expect(wo.status, JSON.stringify(wo.body)).toBe(200);
  for (let u = 1; u <= wo.body.quantity; u++) {
    const res = await agent
      .post(`/api/work-orders/${id}/test-records`)
      .set(csrf)
      .send({ serial: `${wo.body.number}-${String(u).padStart(3, '0')}`, resistance: wo.body.buildSheet.resistance20, temperature: 20 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.passed).toBe(true);
  }
}

/**
 * Opens the board's live feed as a signed-in foreman over a real HTTP connection (the app listens
 * on a free port). `readUntil` reads the stream until a pattern appears (5 s at most); `text` is
 * everything read so far; `close` ends the stream and the listener.
 */
export async function openFloorFeed(t: T) {
  const { CSRF_HEADER, CSRF_VALUE } = await import('../../src/contracts/errors');
  const { DEMO_PASSWORD, demoEmail } = await import('../../server/seed/demo');
  const server = t.app.listen(0);
  const base = `http://127.0.0.1:${(server.address() as import('node:net').AddressInfo).port}`;
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', [CSRF_HEADER]: CSRF_VALUE },
    body: JSON.stringify({ email: demoEmail('foreman'), password: DEMO_PASSWORD }),
  });
  expect(login.status).toBe(200);
  const cookie = login.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const ctrl = new AbortController();
  const stream = await fetch(`${base}/api/floor/events`, { headers: { cookie }, signal: ctrl.signal });
  const reader = stream.body!.getReader();
  const decoder = new TextDecoder();
  const feed = {
    base,
    cookie,
    stream,
    text: '',
    async readUntil(pattern: RegExp) {
      const deadline = Date.now() + 5000;
      while (!pattern.test(feed.text)) {
        if (Date.now() > deadline) throw new Error(`no ${pattern} in: ${feed.text}`);
        const { value, done } = await reader.read();
        if (done) throw new Error(`stream ended: ${feed.text}`);
        feed.text += decoder.decode(value, { stream: true });
      }
    },
    close() {
      ctrl.abort();
      server.close();
    },
  };
  return feed;
}
