/**
 * Sessions stay on the server and outlive the API process: a user signed in on one app instance
 * is still signed in on a new instance started afterwards (as after a restart), whichever store
 * holds them (Redis, the default, or PostgreSQL); signing out ends the session on the server, so
 * the old cookie no longer works anywhere.
 */
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, demoEmail } from '../../server/seed/demo';
import { csrf, testApp } from '../helpers/app';

describe.each(['redis', 'postgres'] as const)('sessions in %s', (store) => {
  it('survive a restart of the API and end on sign-out', async () => {
    const first = testApp({ SESSION_STORE: store });
    const login = await request(first.app).post('/api/auth/login').set(csrf).send({ email: demoEmail('foreman'), password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    const cookie = login.headers['set-cookie'] as unknown as string[];
    expect(cookie.join(';')).toMatch(/spoolwright\.sid=/);
    await first.close();

    const restarted = testApp({ SESSION_STORE: store });
    try {
      const me = await request(restarted.app).get('/api/auth/me').set('Cookie', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(demoEmail('foreman'));
      const out = await request(restarted.app).post('/api/auth/logout').set(csrf).set('Cookie', cookie);
      expect(out.status).toBe(204);
      expect((await request(restarted.app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    } finally {
      await restarted.close();
    }
  });
});
