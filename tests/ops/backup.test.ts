import { DeleteBucketCommand, DeleteObjectCommand, GetObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { createStorage } from '../../server/infra/storage';
import { listKeys } from '../../scripts/snapshot';
import { csrf, testApp } from '../helpers/app';
import { dropDatabase, runScript, siblingDatabase } from './helpers';

const TARGET_DB = siblingDatabase('spoolwright_prod_restore_test');
const TARGET_BUCKET = 'spoolwright-prod-restore-test';
const dir = path.join(mkdtempSync(path.join(tmpdir(), 'spoolwright-backup-')), 'snapshot');
const t = testApp();
const target = createStorage(loadConfig({ ...process.env, NODE_ENV: 'test', S3_BUCKET: TARGET_BUCKET }).s3);

async function emptyBucket(client: S3Client, bucket: string) {
  for (const key of await listKeys(client, bucket).catch(() => [])) await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}

afterAll(async () => {
  await t.close();
  await dropDatabase(TARGET_DB);
  await emptyBucket(target.client, TARGET_BUCKET);
  await target.client.send(new DeleteBucketCommand({ Bucket: TARGET_BUCKET })).catch(() => {});
  target.client.destroy();
  rmSync(path.dirname(dir), { recursive: true, force: true });
});

/** Rows per table, counted here with plain SQL (not the scripts' own counter). */
async function counts(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const tables = await c.query<{ s: string; t: string }>(
      `select schemaname as s, tablename as t from pg_tables where schemaname not in ('pg_catalog', 'information_schema') order by 1, 2`,
    );
    const out: Record<string, number> = {};
    for (const { s, t: name } of tables.rows) out[`${s}.${name}`] = Number((await c.query(`select count(*) as n from "${s}"."${name}"`)).rows[0].n);
    const seq = await c.query(`select last_value from order_number_seq`);
    return { tables: out, orderSeq: String(seq.rows[0].last_value) };
  } finally {
    await c.end();
  }
}

/** SHA-256 of every object in a bucket, read back through the S3 SDK. */
async function hashes(storage: ReturnType<typeof createStorage>) {
  const out: Record<string, string> = {};
  for (const key of await listKeys(storage.client, storage.bucket)) {
    const r = await storage.client.send(new GetObjectCommand({ Bucket: storage.bucket, Key: key }));
    out[key] = createHash('sha256').update(await r.Body!.transformToByteArray()).digest('hex');
  }
  return out;
}

describe('backup and restore', () => {
  it('round-trips the demo shop: every table’s rows and every object’s bytes', async () => {
    // A drawing of our own, so the bucket surely holds an object this test made.
    const office = await t.signIn('office');
    const order = (await office.get('/api/orders?status=entered,acknowledged')).body.orders[0];
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj 2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n');
    const up = await office.post(`/api/orders/${order.id}/attachments`).set(csrf).attach('file', pdf, { filename: 'backup-probe.pdf', contentType: 'application/pdf' });
    expect(up.status, JSON.stringify(up.body)).toBe(201);

    await dropDatabase(TARGET_DB);
    await emptyBucket(target.client, TARGET_BUCKET);
    const backup = await runScript('scripts/backup.ts', [dir], {});
    expect(backup.out).toContain('backup: done');
    expect(backup.code).toBe(0);

    const restore = await runScript('scripts/restore.ts', [dir], { DATABASE_URL: TARGET_DB, S3_BUCKET: TARGET_BUCKET });
    expect(restore.out).toContain('restore: done');
    expect(restore.code).toBe(0);

    const [before, after] = [await counts(t.deps.config.databaseUrl), await counts(TARGET_DB)];
    expect(Object.keys(after.tables).length).toBeGreaterThan(20);
    expect(after).toEqual(before);
    expect(after.tables['public.orders']).toBeGreaterThan(0);
    const [sourceObjects, restoredObjects] = [await hashes(t.deps.storage), await hashes(target)];
    expect(Object.keys(restoredObjects).length).toBeGreaterThan(0);
    expect(restoredObjects).toEqual(sourceObjects);
    expect(Object.values(restoredObjects)).toContain(createHash('sha256').update(pdf).digest('hex'));

    // A second restore finds the target in use and changes nothing.
    const again = await runScript('scripts/restore.ts', [dir], { DATABASE_URL: TARGET_DB, S3_BUCKET: TARGET_BUCKET });
    expect(again.code).toBe(1);
    expect(again.out).toContain('the target is not empty');
  }, 180_000); // a dump, an upload of every object and a restore: slow on a busy machine
});
