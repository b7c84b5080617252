/**
 * npm run backup -- <dir>
 *
 * A consistent snapshot of the shop in a new folder: the database as pg_dump's custom format
 * (taken in one exported snapshot, with the row count of every table in that same snapshot),
 * every object in the object store (drawings, travelers, packing lists, certificates) fetched
 * through the S3 SDK, a manifest.json naming each file with its size and SHA-256, and
 * SHA256SUMS (checkable with `sha256sum -c SHA256SUMS`). The database is dumped first and the
 * objects copied after it, so every object the dump refers to is in the folder.
 * Uses the same environment as the app (DATABASE_URL, S3_*).
 */
import { GetObjectCommand } from '@aws-sdk/client-s3';
import { execFile } from 'node:child_process';
import { mkdirSync, readdirSync, statSync, writeFileSync, existsSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { loadConfig } from '../server/config';
import { createStorage } from '../server/infra/storage';
import { DUMP, MANIFEST, SUMS, listKeys, objectFile, pgConnection, pgTool, sha256, sha256File, tableCounts, type Manifest } from './snapshot';

const run = promisify(execFile);
const dirArg = process.argv[2];
if (!dirArg || dirArg.startsWith('-')) {
  console.error('usage: npm run backup -- <dir>   (a new or empty folder)');
  process.exit(2);
}
const dir = path.resolve(dirArg);
if (existsSync(dir) && (!statSync(dir).isDirectory() || readdirSync(dir).length > 0)) {
  console.error(`backup: ${dir} is not an empty folder; choose a new one per backup`);
  process.exit(2);
}
mkdirSync(dir, { recursive: true });

const config = loadConfig();
const conn = pgConnection(config.databaseUrl);
const client = new pg.Client({ connectionString: config.databaseUrl });
await client.connect();
const storage = createStorage(config.s3);
try {
  const started = Date.now();
  // One snapshot for the dump and the row counts: exported by this transaction, used by pg_dump.
  await client.query('begin isolation level repeatable read, read only');
  const snapshot = (await client.query<{ id: string }>('select pg_export_snapshot() as id')).rows[0].id;
  const serverVersion = (await client.query<{ v: string }>('show server_version')).rows[0].v;
  const tables = await tableCounts(client);
  const pgDump = await pgTool('pg_dump', client);
  const dumpFile = path.join(dir, DUMP);
  await run(pgDump, ['--format=custom', `--snapshot=${snapshot}`, `--file=${dumpFile}`, `--dbname=${conn.dbname}`], { env: conn.env, maxBuffer: 16 << 20 });
  await client.query('commit');
  const dumpSize = statSync(dumpFile).size;
  console.log(`backup: database ${new URL(config.databaseUrl).pathname.slice(1)} → ${DUMP} (${(dumpSize / 1024).toFixed(0)} KiB, ${Object.keys(tables).length} tables)`);

  const objects: Manifest['objects'] = [];
  for (const key of await listKeys(storage.client, storage.bucket)) {
    const file = objectFile(key);
    const r = await storage.client.send(new GetObjectCommand({ Bucket: storage.bucket, Key: key }));
    const body = Buffer.from(await r.Body!.transformToByteArray());
    mkdirSync(path.dirname(path.join(dir, file)), { recursive: true });
    writeFileSync(path.join(dir, file), body);
    objects.push({ key, file, size: body.length, sha256: sha256(body), contentType: r.ContentType ?? null });
  }
  console.log(`backup: bucket ${storage.bucket} → ${objects.length} objects (${(objects.reduce((s, o) => s + o.size, 0) / 1024).toFixed(0)} KiB)`);

  const manifest: Manifest = {
    format: 'spoolwright-backup',
    version: 1,
    createdAt: new Date().toISOString(),
    database: { file: DUMP, sha256: await sha256File(dumpFile), size: dumpSize, serverVersion, tables },
    bucket: storage.bucket,
    objects,
  };
  writeFileSync(path.join(dir, MANIFEST), JSON.stringify(manifest, null, 2) + '\n');
  const sums = [`${manifest.database.sha256}  ${DUMP}`, ...objects.map((o) => `${o.sha256}  ${o.file}`)];
  writeFileSync(path.join(dir, SUMS), sums.join('\n') + '\n');
  console.log(`backup: done in ${((Date.now() - started) / 1000).toFixed(1)} s → ${dir}`);
} catch (e) {
  console.error(`backup: failed: ${(e as Error).message}`);
  process.exitCode = 1;
} finally {
  await client.end();
  storage.client.destroy();
}
