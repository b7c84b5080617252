/**
 * npm run restore -- <dir> [--force]
 *
 * Puts a backup (npm run backup) into the database and bucket this environment names
 * (DATABASE_URL, S3_BUCKET …). Every file is checked against the manifest's SHA-256 first. The
 * database must have no tables and the bucket no objects: a restore never mixes with live data.
 * --force allows a non-empty target: the dump's tables are dropped and recreated, and objects
 * with the same keys are overwritten (others stay). Afterwards the row count of every table is
 * compared with the one taken at backup time.
 */
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { execFile } from 'node:child_process';
import { readFileSync, writeFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { parseArgs, promisify } from 'node:util';
import pg from 'pg';
import { loadConfig } from '../server/config';
import { ensureDatabase } from '../server/db/migrate';
import { createStorage } from '../server/infra/storage';
import { MANIFEST, listKeys, pgConnection, pgTool, sha256File, tableCounts, type Manifest } from './snapshot';

const run = promisify(execFile);
const { values, positionals } = parseArgs({ options: { force: { type: 'boolean' } }, allowPositionals: true });
if (positionals.length !== 1) {
  console.error('usage: npm run restore -- <dir> [--force]');
  process.exit(2);
}
const dir = path.resolve(positionals[0]);
const fail = (message: string, code = 1): never => {
  console.error(`restore: ${message}`);
  process.exit(code);
};

let manifest: Manifest;
try {
  manifest = JSON.parse(readFileSync(path.join(dir, MANIFEST), 'utf8'));
} catch (e) {
  fail(`no readable ${MANIFEST} in ${dir}: ${(e as Error).message}`, 2);
}
if (manifest!.format !== 'spoolwright-backup' || manifest!.version !== 1) fail(`${MANIFEST} is not a Spoolwright backup (version 1)`, 2);
const m = manifest!;

// 1. Every file as it was written.
const files = [{ file: m.database.file, sha256: m.database.sha256 }, ...m.objects];
for (const f of files) {
  const actual = await sha256File(path.join(dir, f.file)).catch(() => 'missing');
  if (actual !== f.sha256) fail(`${f.file} does not match the manifest (${actual === 'missing' ? 'missing' : 'changed'}); nothing was restored`);
}
console.log(`restore: ${files.length} files match the manifest`);

const config = loadConfig();
const dbName = new URL(config.databaseUrl).pathname.slice(1);
await ensureDatabase(config.databaseUrl);
const client = new pg.Client({ connectionString: config.databaseUrl });
await client.connect();
const storage = createStorage(config.s3);
const work = mkdtempSync(path.join(tmpdir(), 'spoolwright-restore-'));
try {
  // 2. An empty target, unless told otherwise.
  const existing = Object.keys(await tableCounts(client));
  await storage.ensureBucket();
  const existingObjects = (await listKeys(storage.client, storage.bucket)).length;
  if (!values.force && (existing.length > 0 || existingObjects > 0)) {
    fail(
      `the target is not empty (database ${dbName}: ${existing.length} tables; bucket ${storage.bucket}: ${existingObjects} objects). ` +
        'Restore into a new database and bucket, or pass --force to replace the tables and overwrite objects.',
    );
  }

  // 3. The database. The dump may create the schema "public", which a new database has already: leave that entry out.
  const pgRestore = await pgTool('pg_restore', client);
  const conn = pgConnection(config.databaseUrl);
  const dumpFile = path.join(dir, m.database.file);
  const { stdout: list } = await run(pgRestore, ['--list', dumpFile], { maxBuffer: 64 << 20 });
  const listFile = path.join(work, 'restore.list');
  writeFileSync(listFile, list.split('\n').filter((l) => !/ SCHEMA - public /.test(l)).join('\n'));
  const args = ['--no-owner', '--no-privileges', '--exit-on-error', '--single-transaction', `--use-list=${listFile}`, `--dbname=${conn.dbname}`];
  if (values.force) args.push('--clean', '--if-exists');
  await run(pgRestore, [...args, dumpFile], { env: conn.env, maxBuffer: 16 << 20 });
  console.log(`restore: database ${dbName} ← ${m.database.file}`);

  // 4. The objects.
  for (const o of m.objects) {
    const body = readFileSync(path.join(dir, o.file));
    await storage.client.send(new PutObjectCommand({ Bucket: storage.bucket, Key: o.key, Body: body, ContentType: o.contentType ?? undefined }));
  }
  console.log(`restore: bucket ${storage.bucket} ← ${m.objects.length} objects`);

  // 5. Row counts as at backup time.
  const counts = await tableCounts(client);
  const differ = Object.entries(m.database.tables).filter(([t, n]) => counts[t] !== n);
  if (differ.length) fail(`row counts differ after the restore: ${differ.map(([t, n]) => `${t} ${counts[t]} (backup: ${n})`).join(', ')}`);
  console.log(`restore: done; ${Object.keys(m.database.tables).length} tables have the row counts of ${m.createdAt}`);
} catch (e) {
  const err = e as Error & { stderr?: string };
  fail(`failed: ${err.stderr?.trim() || err.message}`);
} finally {
  rmSync(work, { recursive: true, force: true });
  await client.end();
  storage.client.destroy();
}
