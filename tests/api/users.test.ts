import { and, eq, inArray, ne } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { users } from '../../server/db/schema';
import { BCRYPT_COST, updateUser } from '../../server/users/service';
import { csrf, testApp, uniqueEmail } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

const PASSWORD = 'a long enough password';

async function createUser(role: string, extra: Record<string, unknown> = {}) {
  const admin = await t.signIn('admin');
  const email = uniqueEmail(role);
  const res = await admin.post('/api/users').set(csrf).send({ email, name: `Test ${role}`, role, password: PASSWORD, ...extra });
  expect(res.status).toBe(201);
  return { id: res.body.user.id as number, email };
}

describe('users', () => {
  it('admin lists users without password hashes', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.get('/api/users');
    expect(res.status).toBe(200);
    expect(res.body.users.length).toBeGreaterThanOrEqual(7);
    expect(JSON.stringify(res.body)).not.toMatch(/passwordHash|\$2[aby]\$/);
  });

  it('stores a bcrypt hash with cost of at least 10', async () => {
    const { id } = await createUser('office');
    const row = await t.deps.db.query.users.findFirst({ where: eq(users.id, id) });
    expect(BCRYPT_COST).toBeGreaterThanOrEqual(10);
    expect(bcrypt.getRounds(row!.passwordHash)).toBe(BCRYPT_COST);
    expect(await bcrypt.compare(PASSWORD, row!.passwordHash)).toBe(true);
  });

  it('refuses a second account with the same e-mail in another case (409)', async () => {
    const { email } = await createUser('floor');
    const admin = await t.signIn('admin');
    const res = await admin.post('/api/users').set(csrf).send({ email: email.toUpperCase(), name: 'Dup', role: 'floor', password: PASSWORD });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.email).toBeTruthy();
  });

  it('a customer user needs a company, and staff must not have one', async () => {
    const admin = await t.signIn('admin');
    const noCompany = await admin.post('/api/users').set(csrf).send({ email: uniqueEmail('c'), name: 'C', role: 'customer', password: PASSWORD });
    expect(noCompany.status).toBe(400);
    expect(noCompany.body.error.fields.customerId).toBeTruthy();
    const { body } = await admin.get('/api/users/customer-options');
    const companyId = body.customers[0].id;
    const staffWithCompany = await admin.post('/api/users').set(csrf).send({ email: uniqueEmail('s'), name: 'S', role: 'floor', password: PASSWORD, customerId: companyId });
    expect(staffWithCompany.status).toBe(400);
    const unknown = await admin.post('/api/users').set(csrf).send({ email: uniqueEmail('c'), name: 'C', role: 'customer', password: PASSWORD, customerId: 999999 });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.customerId).toMatch(/no such/i);
    const ok = await admin.post('/api/users').set(csrf).send({ email: uniqueEmail('c'), name: 'C', role: 'customer', password: PASSWORD, customerId: companyId });
    expect(ok.status).toBe(201);
    expect(ok.body.user.customerName).toBeTruthy();
  });

  it('changes a role and resets a password (the old one stops working)', async () => {
    const { id, email } = await createUser('floor');
    const admin = await t.signIn('admin');
    const res = await admin.patch(`/api/users/${id}`).set(csrf).send({ role: 'foreman', password: 'brand new password 2' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('foreman');
    expect((await t.request().post('/api/auth/login').set(csrf).send({ email, password: PASSWORD })).status).toBe(401);
    const agent = await t.signIn({ email, password: 'brand new password 2' });
    expect((await agent.get('/api/auth/me')).body.user.role).toBe('foreman');
  });

  it('an empty change and an unknown user are refused', async () => {
    const admin = await t.signIn('admin');
    expect((await admin.patch('/api/users/1').set(csrf).send({})).status).toBe(400);
    expect((await admin.patch('/api/users/999999').set(csrf).send({ name: 'X' })).status).toBe(404);
    expect((await admin.patch('/api/users/abc').set(csrf).send({ name: 'X' })).status).toBe(404);
  });
});

describe('the last active admin', () => {
  /** Leaves only the given admins active for the duration of fn, then restores the others. */
  async function onlyThese(adminIds: number[], fn: () => Promise<void>) {
    const others = await t.deps.db
      .update(users)
      .set({ active: false })
      .where(and(eq(users.role, 'admin'), eq(users.active, true), ne(users.id, adminIds[0]), ...adminIds.slice(1).map((id) => ne(users.id, id))))
      .returning({ id: users.id });
    try {
      await fn();
    } finally {
      if (others.length) await t.deps.db.update(users).set({ active: true }).where(inArray(users.id, others.map((o) => o.id)));
    }
  }

  it('cannot be demoted or deactivated', async () => {
    const { id, email } = await createUser('admin');
    await onlyThese([id], async () => {
      const agent = await t.signIn({ email, password: PASSWORD });
      const demote = await agent.patch(`/api/users/${id}`).set(csrf).send({ role: 'engineer' });
      expect(demote.status).toBe(422);
      expect(demote.body.error.code).toBe('rule');
      expect(demote.body.error.fields.role).toMatch(/last active admin/i);
      const deactivate = await agent.patch(`/api/users/${id}`).set(csrf).send({ active: false });
      expect(deactivate.status).toBe(422);
      const row = await t.deps.db.query.users.findFirst({ where: eq(users.id, id) });
      expect(row).toMatchObject({ role: 'admin', active: true });
    });
  });

  it('two admins demoting each other at once leave exactly one admin', async () => {
    const a = await createUser('admin');
    const b = await createUser('admin');
    await onlyThese([a.id, b.id], async () => {
      const agentA = await t.signIn({ email: a.email, password: PASSWORD });
      const agentB = await t.signIn({ email: b.email, password: PASSWORD });
      const [ra, rb] = await Promise.all([
        agentA.patch(`/api/users/${b.id}`).set(csrf).send({ role: 'office' }),
        agentB.patch(`/api/users/${a.id}`).set(csrf).send({ role: 'office' }),
      ]);
      // One wins; the other is refused by the rule (422) or, when it arrives after the winner
      // committed, finds its own session ended by its demotion (401).
      const statuses = [ra.status, rb.status].sort();
      expect(statuses[0]).toBe(200);
      expect([401, 422]).toContain(statuses[1]);
      const left = await t.deps.db.select().from(users).where(and(inArray(users.id, [a.id, b.id]), eq(users.role, 'admin')));
      expect(left).toHaveLength(1);
    });
  });

  it('the service locks admins: simultaneous demotions, exactly one succeeds', async () => {
    const a = await createUser('admin');
    const b = await createUser('admin');
    await onlyThese([a.id, b.id], async () => {
      const results = await Promise.allSettled([
        updateUser(t.deps.db, b.id, { role: 'office' }, a.id),
        updateUser(t.deps.db, a.id, { role: 'office' }, b.id),
      ]);
      expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
      const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
      expect(refused.reason).toMatchObject({ status: 422, code: 'rule' });
    });
  });
});
