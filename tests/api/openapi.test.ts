import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, describe, expect, it } from 'vitest';
import { testApp } from '../helpers/app';
import { listRoutes } from '../helpers/routes';

const t = testApp();
afterAll(() => t.close());

describe('GET /api/openapi.json', () => {
  it('is a valid OpenAPI 3.1 document (checked against the published schema by a validator package)', async () => {
    const engineer = await t.signIn('engineer');
    const res = await engineer.get('/api/openapi.json');
    expect(res.status).toBe(200);
    const validator = new Validator();
    const result = await validator.validate(res.body);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('lists exactly the routes the app mounts, each with the roles its rule admits', async () => {
    const res = await (await t.signIn('admin')).get('/api/openapi.json');
    const documented = Object.entries(res.body.paths as Record<string, Record<string, unknown>>)
      .flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p.replace(/\{(\w+)\}/g, ':$1')}`))
      .sort();
    const mounted = listRoutes(t.app).map((r) => `${r.method} ${r.path}`).sort();
    expect(documented).toEqual(mounted);
    expect(res.body.paths['/api/users'].get['x-roles']).toEqual(['admin']);
    expect(res.body.paths['/api/customers'].post.requestBody.content['application/json'].schema.required).toContain('name');
  });

  it('is not for customers or the signed-out', async () => {
    expect((await (await t.signIn('customer')).get('/api/openapi.json')).status).toBe(403);
    expect((await t.request().get('/api/openapi.json')).status).toBe(401);
  });
});
