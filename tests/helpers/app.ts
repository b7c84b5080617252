import request from 'supertest';
import type { Role } from '../../src/contracts/roles';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { createDeps, type Deps } from '../../server/deps';
import { DEMO_PASSWORD, demoEmail } from '../../server/seed/demo';

export const csrf = { [CSRF_HEADER]: CSRF_VALUE };

/** The real app over the real test database, Redis, mail catcher and object store. */
export function testApp(env: Record<string, string> = {}) {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test', ...env });
  const deps: Deps = createDeps(config);
  const app = createApp(deps);
  return {
    deps,
    app,
    request: () => request(app),
    /** A cookie-keeping agent signed in with the given demo role (or any e-mail/password). */
    async signIn(who: Role | { email: string; password: string }) {
      const agent = request.agent(app);
      const body = typeof who === 'string' ? { email: demoEmail(who), password: DEMO_PASSWORD } : who;
      const res = await agent.post('/api/auth/login').set(csrf).send(body);
      if (res.status !== 200) throw new Error(`sign-in as ${body.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
      return agent;
    },
    close: () => deps.close(),
  };
}

let counter = 0;
/** A unique e-mail per call, so tests never collide on the shared test database. */
export function uniqueEmail(prefix = 'user') {
  counter += 1;
  return `${prefix}-${process.pid}-${Date.now().toString(36)}-${counter}@example.test`;
}
