/**
 * What backup.ts and restore.ts share: finding PostgreSQL's own dump tools, counting rows,
 * listing and hashing object-store objects, and the manifest's shape.
 */
import { ListObjectsV2Command, type S3Client } from '@aws-sdk/client-s3';
import { createHash } from 'node:crypto';
import { createReadStream, existsSync } from 'node:fs';
import path from 'node:path';
import type pg from 'pg';

export const MANIFEST = 'manifest.json';
export const SUMS = 'SHA256SUMS';
export const DUMP = 'database.dump';

export type Manifest = {
  format: 'spoolwright-backup';
  version: 1;
  createdAt: string;
  database: { file: string; sha256: string; size: number; serverVersion: string; tables: Record<string, number> };
  bucket: string;
  objects: { key: string; file: string; size: number; sha256: string; contentType: string | null }[];
};

/**
 * A PostgreSQL client program (pg_dump, pg_restore) of the server's major version: PG_BIN_DIR
 * when set, else Debian's /usr/lib/postgresql/<major>/bin, else whatever is on the PATH.
 */
export async function pgTool(name: 'pg_dump' | 'pg_restore', client: pg.Client | pg.Pool): Promise<string> {
  const { rows } = await client.query<{ v: string }>('show server_version_num');
  const major = Math.floor(Number(rows[0].v) / 10_000);
  const dirs = [process.env.PG_BIN_DIR, `/usr/lib/postgresql/${major}/bin`].filter(Boolean) as string[];
  for (const d of dirs) if (existsSync(path.join(d, name))) return path.join(d, name);
  return name;
}

/** The URL without its password, and the password in PGPASSWORD: nothing secret in the process list. */
export function pgConnection(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const password = decodeURIComponent(url.password);
  url.password = '';
  return { dbname: url.toString(), env: { ...process.env, ...(password && { PGPASSWORD: password }) } };
}

/** Rows per table in every schema but the system's, keyed "schema.table". */
export async function tableCounts(client: pg.Client | pg.Pool): Promise<Record<string, number>> {
  const { rows } = await client.query<{ s: string; t: string }>(
    `select table_schema as s, table_name as t from information_schema.tables
      where table_type = 'BASE TABLE' and table_schema not in ('pg_catalog', 'information_schema') order by 1, 2`,
  );
  const out: Record<string, number> = {};
  for (const { s, t } of rows) {
    const q = `select count(*)::bigint as n from "${s.replace(/"/g, '""')}"."${t.replace(/"/g, '""')}"`;
    out[`${s}.${t}`] = Number((await client.query<{ n: string }>(q)).rows[0].n);
  }
  return out;
}

/** Every object's key in a bucket (all pages). */
export async function listKeys(client: S3Client, bucket: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await client.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    for (const o of page.Contents ?? []) if (o.Key) keys.push(o.Key);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys.sort();
}

export const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

export function sha256File(file: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const h = createHash('sha256');
    createReadStream(file)
      .on('data', (c) => h.update(c))
      .on('error', reject)
      .on('end', () => resolve(h.digest('hex')));
  });
}

/** Where an object's copy lives inside the backup: its key as a path, refused when it could leave the folder. */
export function objectFile(key: string): string {
  const parts = key.split('/');
  if (!key || parts.some((p) => p === '' || p === '.' || p === '..') || key.includes('\\') || key.includes('\0')) {
    throw new Error(`object key ${JSON.stringify(key)} cannot be stored as a file`);
  }
  return path.posix.join('objects', ...parts);
}
