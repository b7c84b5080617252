import { afterAll, describe, expect, it } from 'vitest';
import { LOGIN_FAILURES_ALLOWED } from '../../server/auth/limiter';
import { SESSION_COOKIE } from '../../server/auth/session';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { csrf, testApp, uniqueEmail } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

function sessionId(res: { headers: Record<string, unknown> }) {
  const cookies = (res.headers['set-cookie'] as string[] | undefined) ?? [];
  const c = cookies.find((x) => x.startsWith(`${SESSION_COOKIE}=`));
  return c?.split(';')[0];
}

async function makeUser(role = 'office', password = 'correct horse battery') {
  const admin = await t.signIn('admin');
  const email = uniqueEmail(role);
  const res = await admin.post('/api/users').set(csrf).send({ email, name: 'Test Person', role, password });
  expect(res.status).toBe(201);
  return { email, password, id: res.body.user.id as number, admin };
}

describe('sign-in', () => {
  it('accepts a good pair, ignoring the case of the e-mail, and sets an httpOnly SameSite=Lax cookie', async () => {
    const res = await t.request().post('/api/auth/login').set(csrf).send({ email: 'Engineer@SpoolWright.test', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'engineer@spoolwright.test', role: 'engineer' });
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookie = (res.headers['set-cookie'] as unknown as string[]).join(';');
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('answers 401 with the same message for an unknown user and a wrong password', async () => {
    const unknown = await t.request().post('/api/auth/login').set(csrf).send({ email: uniqueEmail('nobody'), password: 'whatever-it-is' });
    const wrong = await t.request().post('/api/auth/login').set(csrf).send({ email: 'office@spoolwright.test', password: 'not-the-password' });
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body.error.code).toBe('unauthenticated');
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
  });

  it('validates the body and names the fields', async () => {
    const res = await t.request().post('/api/auth/login').set(csrf).send({ email: 'not-an-address' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'password']);
  });

  it(`limits an account and address after ${LOGIN_FAILURES_ALLOWED} failures, even with the right password then`, async () => {
    const { email, password } = await makeUser();
    for (let i = 0; i < LOGIN_FAILURES_ALLOWED; i++) {
      const r = await t.request().post('/api/auth/login').set(csrf).send({ email, password: `wrong-${i}` });
      expect(r.status).toBe(401);
    }
    const blocked = await t.request().post('/api/auth/login').set(csrf).send({ email, password });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_requests');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // Another account from the same address is not affected.
    const other = await t.request().post('/api/auth/login').set(csrf).send({ email: 'floor@spoolwright.test', password: DEMO_PASSWORD });
    expect(other.status).toBe(200);
  });

  it('a success clears earlier failures', async () => {
    const { email, password } = await makeUser();
    for (let i = 0; i < LOGIN_FAILURES_ALLOWED - 1; i++) {
      await t.request().post('/api/auth/login').set(csrf).send({ email, password: 'nope-nope' });
    }
    expect((await t.request().post('/api/auth/login').set(csrf).send({ email, password })).status).toBe(200);
    for (let i = 0; i < LOGIN_FAILURES_ALLOWED - 1; i++) {
      await t.request().post('/api/auth/login').set(csrf).send({ email, password: 'nope-nope' });
    }
    expect((await t.request().post('/api/auth/login').set(csrf).send({ email, password })).status).toBe(200);
  });

  it('gives a new session id at each sign-in', async () => {
    const first = await t.request().post('/api/auth/login').set(csrf).send({ email: 'office@spoolwright.test', password: DEMO_PASSWORD });
    const sid = sessionId(first);
    expect(sid).toBeTruthy();
    const again = await t.request().post('/api/auth/login').set(csrf).set('Cookie', sid!).send({ email: 'office@spoolwright.test', password: DEMO_PASSWORD });
    expect(sessionId(again)).toBeTruthy();
    expect(sessionId(again)).not.toBe(sid);
  });

  it('/me answers the user, and 401 after sign-out', async () => {
    const agent = await t.signIn('foreman');
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.role).toBe('foreman');
    expect((await agent.post('/api/auth/logout').set(csrf)).status).toBe(204);
    const after = await agent.get('/api/auth/me');
    expect(after.status).toBe(401);
    expect(after.body.error.code).toBe('unauthenticated');
  });

  it('a deactivated user can no longer sign in, and their open session ends', async () => {
    const { email, password, id, admin } = await makeUser('floor');
    const session = await t.signIn({ email, password });
    expect((await session.get('/api/auth/me')).status).toBe(200);
    expect((await admin.patch(`/api/users/${id}`).set(csrf).send({ active: false })).status).toBe(200);
    expect((await session.get('/api/auth/me')).status).toBe(401);
    expect((await t.request().post('/api/auth/login').set(csrf).send({ email, password })).status).toBe(401);
  });

  it('unit preferences are saved per user', async () => {
    const { email, password } = await makeUser('engineer');
    const agent = await t.signIn({ email, password });
    const res = await agent.patch('/api/me').set(csrf).send({ lengthUnit: 'in', temperatureUnit: 'F' });
    expect(res.status).toBe(200);
    expect((await agent.get('/api/auth/me')).body.user).toMatchObject({ lengthUnit: 'in', temperatureUnit: 'F' });
    const bad = await agent.patch('/api/me').set(csrf).send({ lengthUnit: 'furlong' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.lengthUnit).toBeTruthy();
  });
});
