import { createHash } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { csrf, testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

const bearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });

describe('API tokens', () => {
  it('work without a cookie or the CSRF header, only within their role, until revoked', async () => {
    const admin = await t.signIn('admin');
    const issued = await admin.post('/api/tokens').set(csrf).send({ name: 'Label printer script', role: 'engineer' });
    expect(issued.status).toBe(201);
    const secret = issued.body.secret as string;
    expect(secret).toMatch(/^swt_[A-Za-z0-9_-]{43}$/);
    expect(issued.body.token).toMatchObject({ name: 'Label printer script', role: 'engineer', revokedAt: null });

    // Only the SHA-256 is stored (computed here with node:crypto, FIPS 180-4), never the secret.
    const row = await t.deps.pool.query('select * from api_tokens where id = $1', [issued.body.token.id]);
    expect(row.rows[0].token_hash).toBe(createHash('sha256').update(secret).digest('hex'));
    expect(JSON.stringify(row.rows[0])).not.toContain(secret.slice(10));
    const list = await admin.get('/api/tokens');
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(10));

    // Inside its role: a read and a write, no cookie sent back, no X-Requested-By needed.
    const read = await t.request().get('/api/spools').set(bearer(secret));
    expect(read.status).toBe(200);
    expect(read.headers['set-cookie']).toBeUndefined();
    const write = await t
      .request()
      .post('/api/spools')
      .set(bearer(secret))
      .send({ conductor: 'aluminium', wire: { standard: 'AWG', gauge: 25 }, insulationGrade: 1, supplier: 'Token Wire Co', lot: 'TOK-1', netMass: 1.5 });
    expect(write.status, JSON.stringify(write.body)).toBe(201);
    // The record names who issued the token.
    expect(write.body.spool.receivedBy.name).toBe('Imogen Varley');

    // Outside its role.
    const users = await t.request().get('/api/users').set(bearer(secret));
    expect(users.status).toBe(403);
    expect(users.body.error.code).toBe('forbidden');

    // A cookie request still needs the header.
    const office = await t.signIn('office');
    expect((await office.post('/api/spools').send({})).body.error.code).toBe('csrf');

    const revoked = await admin.post(`/api/tokens/${issued.body.token.id}/revoke`).set(csrf).send({});
    expect(revoked.body.token.revokedAt).not.toBeNull();
    const after = await t.request().get('/api/spools').set(bearer(secret));
    expect(after.status).toBe(401);
    expect(after.body.error.code).toBe('unauthenticated');
  });

  it('refuse an unknown secret, a customer role, and token management by a token', async () => {
    expect((await t.request().get('/api/spools').set(bearer('swt_nothing-like-a-real-one'))).status).toBe(401);
    const admin = await t.signIn('admin');
    const customer = await admin.post('/api/tokens').set(csrf).send({ name: 'Portal', role: 'customer' });
    expect(customer.status).toBe(400);
    expect(customer.body.error.fields.role).toBeDefined();
    const adminToken = (await admin.post('/api/tokens').set(csrf).send({ name: 'Ops', role: 'admin' })).body.secret;
    const byToken = await t.request().post('/api/tokens').set(bearer(adminToken)).send({ name: 'Chain', role: 'floor' });
    expect(byToken.status).toBe(422);
  });
});
