import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { csrf, testApp } from '../helpers/app';
import { dropDatabase, runScript, siblingDatabase } from './helpers';

const DB = siblingDatabase('spoolwright_prod_setup_test');
const PASSWORD = 'first admin chose this';
const NEW_PASSWORD = 'my very own password';

beforeAll(() => dropDatabase(DB));
afterAll(() => dropDatabase(DB));

describe('npm run setup on a fresh database', () => {
  let app: ReturnType<typeof testApp> | undefined;
  afterAll(() => app?.close());

  it('creates the first admin, who must change the password before anything else; a second setup refuses', async () => {
    const asArgument = await runScript('scripts/setup.ts', ['--admin-email', 'owner@shop.example', '--admin-name', 'Shop Owner', '--admin-password', PASSWORD], { DATABASE_URL: DB });
    expect(asArgument.code).toBe(2);
    expect(asArgument.out).toContain('the password is never an argument');

    const first = await runScript('scripts/setup.ts', ['--admin-email', 'Owner@Shop.example', '--admin-name', 'Shop Owner'], {
      DATABASE_URL: DB,
      SPOOLWRIGHT_ADMIN_PASSWORD: PASSWORD,
    });
    expect(first.out).toContain('owner@shop.example is its first admin');
    expect(first.code).toBe(0);

    app = testApp({ DATABASE_URL: DB });
    const admin = await app.signIn({ email: 'owner@shop.example', password: PASSWORD });
    const me = await admin.get('/api/auth/me');
    expect(me.body.user).toMatchObject({ role: 'admin', mustChangePassword: true });
    const blocked = await admin.get('/api/users');
    expect(blocked.status).toBe(403);
    expect(blocked.body.error.code).toBe('password_change_required');
    expect((await admin.post('/api/customers').set(csrf).send({ name: 'Anyone' })).body.error.code).toBe('password_change_required');

    const wrong = await admin.post('/api/auth/password').set(csrf).send({ currentPassword: 'not it at all', newPassword: NEW_PASSWORD });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.currentPassword).toBeDefined();
    const same = await admin.post('/api/auth/password').set(csrf).send({ currentPassword: PASSWORD, newPassword: PASSWORD });
    expect(same.body.error.fields.newPassword).toBeDefined();
    const changed = await admin.post('/api/auth/password').set(csrf).send({ currentPassword: PASSWORD, newPassword: NEW_PASSWORD });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    expect(changed.body.user.mustChangePassword).toBeUndefined();
    const users = await admin.get('/api/users');
    expect(users.status).toBe(200);
    expect(users.body.users.map((u: { email: string }) => u.email)).toEqual(['owner@shop.example']);
    // The old password no longer signs in; the new one does.
    await expect(app.signIn({ email: 'owner@shop.example', password: PASSWORD })).rejects.toThrow(/401/);
    expect((await (await app.signIn({ email: 'owner@shop.example', password: NEW_PASSWORD })).get('/api/users')).status).toBe(200);

    const second = await runScript('scripts/setup.ts', ['--admin-email', 'other@shop.example', '--admin-name', 'Someone Else'], {
      DATABASE_URL: DB,
      SPOOLWRIGHT_ADMIN_PASSWORD: PASSWORD,
    });
    expect(second.code).toBe(1);
    expect(second.out).toContain('refused: An admin exists already (owner@shop.example)');
  }, 180_000);

  it('refuses the demo seed when NODE_ENV=production', async () => {
    const seeded = await runScript('scripts/db.ts', ['seed'], {
      NODE_ENV: 'production',
      DATABASE_URL: DB,
      SESSION_SECRET: 'a production secret of some length',
      REDIS_URL: loadConfig({ ...process.env, NODE_ENV: 'test' }).redisUrl,
      SMTP_URL: 'smtp://127.0.0.1:1025',
      S3_BUCKET: 'spoolwright-prod-setup-test',
      PUBLIC_URL: 'https://coils.example',
    });
    expect(seeded.code).toBe(2);
    expect(seeded.out).toContain('the demo shop is never seeded with NODE_ENV=production');
  }, 180_000);
});

describe('production configuration', () => {
  it('names every missing secret and service address, and refuses the development secret', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(
      /SESSION_SECRET: required in production\n {2}DATABASE_URL: required in production\n {2}REDIS_URL: required in production\n {2}SMTP_URL: required in production\n {2}S3_BUCKET: required in production\n {2}PUBLIC_URL: required in production/,
    );
    const complete = {
      NODE_ENV: 'production',
      DATABASE_URL: 'postgres://u:p@db.internal:5432/shop',
      REDIS_URL: 'redis://cache.internal:6379/0',
      SMTP_URL: 'smtps://relay.internal:465',
      S3_BUCKET: 'shop-files',
      PUBLIC_URL: 'https://coils.example',
    };
    expect(() => loadConfig({ ...complete, SESSION_SECRET: 'spoolwright-local-development-secret' })).toThrow(/not the development one/);
    expect(loadConfig({ ...complete, SESSION_SECRET: 'a production secret of some length' }).production).toBe(true);
  });
});
