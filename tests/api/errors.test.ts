import express from 'express';
import request from 'supertest';
import { z } from 'zod';
import { afterAll, describe, expect, it } from 'vitest';
import { errorHandler, parse } from '../../server/http/errors';
import { csrf, testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

describe('cross-site request defence', () => {
  it('refuses a state-changing request without the header (403 csrf)', async () => {
    const res = await t.request().post('/api/auth/login').send({ email: 'admin@spoolwright.test', password: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
  });

  it('refuses a signed-in user without the header too, multipart included', async () => {
    const admin = await t.signIn('admin');
    const json = await admin.post('/api/users').send({ email: 'a@b.test' });
    expect(json.status).toBe(403);
    const multipart = await admin.post('/api/users').field('email', 'a@b.test').attach('file', Buffer.from('%PDF-1.4'), 'x.pdf');
    expect(multipart.status).toBe(403);
    expect(multipart.body.error.code).toBe('csrf');
    const patch = await admin.patch('/api/me').send({ lengthUnit: 'in' });
    expect(patch.status).toBe(403);
  });

  it('lets reads through without the header', async () => {
    const admin = await t.signIn('admin');
    expect((await admin.get('/api/users')).status).toBe(200);
  });
});

describe('one error shape', () => {
  it('malformed JSON → 400 bad_json', async () => {
    const res = await t.request().post('/api/auth/login').set(csrf).set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { code: 'bad_json', message: expect.any(String) } });
  });

  it('unknown API path → 404 JSON', async () => {
    const res = await t.request().get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.type).toBe('application/json');
    expect(res.body.error.code).toBe('not_found');
  });

  it('validation → 400 with each bad field named', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.post('/api/users').set(csrf).send({ email: 'nope', name: '', role: 'wizard', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'name', 'password', 'role']);
    expect(res.body.error.fields.password).toMatch(/at least 10/i);
  });

  it('nested paths are joined with dots', () => {
    const schema = z.object({ bobbin: z.object({ length: z.number().positive() }) });
    try {
      parse(schema, { bobbin: { length: -1 } });
      expect.unreachable();
    } catch (e) {
      expect((e as { fields: Record<string, string> }).fields).toHaveProperty(['bobbin.length']);
    }
  });

  it('an unexpected failure → 500 with no stack or message leaked', async () => {
    const app = express();
    app.get('/boom', () => {
      throw new Error('secret internal detail at /srv/app.ts:12');
    });
    app.use(errorHandler);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('internal');
    expect(JSON.stringify(res.body)).not.toMatch(/secret|\.ts|at /);
  });

  it('security headers are set (helmet)', async () => {
    const res = await t.request().get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('health', () => {
  it('reports every service ok against the real services', async () => {
    const res = await t.request().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', checks: { database: 'ok', redis: 'ok', mail: 'ok', storage: 'ok' } });
  });

  it('answers 503 naming the failing check when a service is down', async () => {
    // Nothing listens on port 9 (discard) on loopback here; the other services are real.
    const broken = testApp({ REDIS_URL: 'redis://127.0.0.1:9/0', SMTP_URL: 'smtp://127.0.0.1:9' });
    try {
      const res = await broken.request().get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body.checks).toEqual({ database: 'ok', redis: 'failed', mail: 'failed', storage: 'ok' });
      expect(res.body.errors.redis).toBeTruthy();
    } finally {
      await broken.close();
    }
  });
});
