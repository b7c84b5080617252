import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../src/contracts/roles';
import { csrf, testApp } from '../helpers/app';
import { concretePath, listRoutes } from '../helpers/routes';

const t = testApp();
afterAll(() => t.close());

const PUBLIC_ROUTES = ['GET /api/health', 'POST /api/auth/login'];
const routes = listRoutes(t.app);
const agents = {} as Record<Role, Awaited<ReturnType<typeof t.signIn>>>;

beforeAll(async () => {
  for (const role of ROLES) agents[role] = await t.signIn(role);
});

function send(agent: ReturnType<typeof t.request> | (typeof agents)[Role], method: string, path: string) {
  const m = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  return (agent as unknown as Record<string, (p: string) => import('supertest').Test>)[m](path).set(csrf).send({});
}

describe('every API route declares who may use it', () => {
  it('finds the routes (the walk itself works)', () => {
    const names = routes.map((r) => `${r.method} ${r.path}`);
    expect(names).toContain('POST /api/auth/login');
    expect(names).toContain('GET /api/users');
    expect(routes.length).toBeGreaterThan(6);
  });

  it('has no route without a declared rule', () => {
    const missing = routes.filter((r) => !r.rule).map((r) => `${r.method} ${r.path}`);
    expect(missing).toEqual([]);
  });

  it('only health and sign-in are public', () => {
    const open = routes.filter((r) => r.rule && 'public' in r.rule).map((r) => `${r.method} ${r.path}`);
    expect(open.sort()).toEqual([...PUBLIC_ROUTES].sort());
  });

  it('refuses every non-public route when signed out (401)', async () => {
    const failures: string[] = [];
    for (const r of routes) {
      if (!r.rule || 'public' in r.rule || r.rule.loopback) continue;
      const res = await send(t.request(), r.method, concretePath(r.path));
      if (res.status !== 401 || res.body.error?.code !== 'unauthenticated') failures.push(`${r.method} ${r.path} → ${res.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('refuses every role a route does not list (403)', async () => {
    const failures: string[] = [];
    let checked = 0;
    for (const r of routes) {
      if (!r.rule || 'public' in r.rule || r.rule.loopback) continue;
      const admitted = r.rule.roles;
      for (const role of ROLES.filter((x) => !admitted.includes(x))) {
        checked += 1;
        const res = await send(agents[role], r.method, concretePath(r.path));
        if (res.status !== 403 || res.body.error?.code !== 'forbidden') failures.push(`${role}: ${r.method} ${r.path} → ${res.status}`);
      }
    }
    expect(checked).toBeGreaterThan(0);
    expect(failures).toEqual([]);
  });

  it('states the loopback rule of /metrics only, and enforces it: from elsewhere, an admin token only', async () => {
    const loopback = routes.filter((r) => r.rule && 'roles' in r.rule && r.rule.loopback).map((r) => `${r.method} ${r.path} ${JSON.stringify(r.rule)}`);
    expect(loopback).toEqual(['GET /metrics {"roles":["admin"],"loopback":true}']);
    const admin = agents.admin;
    const issue = async (role: Role) => (await admin.post('/api/tokens').set(csrf).send({ name: `metrics walk ${role}`, role })).body.secret as string;
    const [adminToken, officeToken] = [await issue('admin'), await issue('office')];
    // A forwarded request (through a proxy) is never the machine itself.
    const away = { 'X-Forwarded-For': '203.0.113.7' };
    expect((await t.request().get('/metrics')).status).toBe(200);
    expect((await t.request().get('/metrics').set(away)).status).toBe(401);
    expect((await admin.get('/metrics').set(away)).status).toBe(401); // a session cookie is not read outside /api
    expect((await t.request().get('/metrics').set(away).set('Authorization', `Bearer ${officeToken}`)).status).toBe(403);
    expect((await t.request().get('/metrics').set(away).set('Authorization', `Bearer ${adminToken}`)).status).toBe(200);
  });
});
