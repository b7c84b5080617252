import { migrate } from 'drizzle-orm/node-postgres/migrator';
import path from 'node:path';
import pg from 'pg';
import type { Db } from './client';
import { PROJECT_ROOT } from '../paths';

export const MIGRATIONS_FOLDER = path.join(PROJECT_ROOT, 'drizzle');

/** Creates the database named in the URL when it does not exist (local and test runs). */
export async function ensureDatabase(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.slice(1));
  url.pathname = '/postgres';
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    const found = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (!found.rowCount) await client.query(`create database "${name.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

/**
 * Test databases only (the name must end in `_test`): commits are acknowledged before their
 * write-ahead log reaches the disk (`synchronous_commit = off` for this database alone), which
 * makes the suite faster and can lose only the last moments of test data in a crash. The server
 * itself keeps fsync on, and every other database keeps synchronous commit.
 */
export async function relaxCommitDurabilityForTests(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.slice(1));
  if (!name.endsWith('_test')) throw new Error(`Refusing to relax commit durability of ${name}: only databases whose name ends in _test`);
  url.pathname = '/postgres';
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    await client.query(`alter database "${name.replace(/"/g, '""')}" set synchronous_commit = off`);
  } finally {
    await client.end();
  }
}

export async function runMigrations(db: Db) {
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}

/** Drops every table (tests only): a clean slate before migrating again. */
export async function dropEverything(pool: pg.Pool) {
  await pool.query('drop schema if exists public cascade; drop schema if exists drizzle cascade; create schema public;');
}
