/**
 * Starts and stops the local services on loopback: PostgreSQL and Redis from Debian's packages,
 * the SMTP catcher (maildev) and the S3-compatible fake (s3rver). Data lives under `.data/`
 * (`SPOOLWRIGHT_DATA_DIR`; with `SPOOLWRIGHT_PORT_OFFSET` a second set runs beside the first).
 *
 *   tsx scripts/services.ts up      start whatever is not running (idempotent)
 *   tsx scripts/services.ts down    stop the app and worker `npm start` runs (they finish what
 *                                   they are doing), then every service this project started
 *   tsx scripts/services.ts status
 *
 * Both stateful services keep what they acknowledged (they may hold a shop's real records):
 * PostgreSQL runs with fsync, synchronous commit and full-page writes on; Redis appends every
 * write to its append-only file (fsync every second), never evicts keys, and saves on shutdown.
 * `up` puts a service that is already running with weaker settings right. The test suite
 * relaxes synchronous commit for its own `_test` databases only (tests/global-setup.ts).
 *
 * As root, PostgreSQL runs as the `postgres` system user; when that user cannot reach the
 * project folder (a clone under /root, say) the cluster lives in a folder it can reach and
 * `.data/pg` links to it.
 */
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, openSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync, chmodSync, realpathSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import pg from 'pg';
import { Redis } from 'ioredis';
import { LOCAL } from '../server/config';
import { APP_PID_FILE, DATA_DIR as data, PROJECT_ROOT as root, RUN_DIR as run } from './local-paths';
const isRoot = process.getuid?.() === 0;

function log(msg: string) {
  console.log(`services: ${msg}`);
}

function portOpen(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ port, host });
    s.once('connect', () => { s.destroy(); resolve(true); });
    s.once('error', () => resolve(false));
    s.setTimeout(500, () => { s.destroy(); resolve(false); });
  });
}

async function waitForPort(port: number, what: string, seconds = 30) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (await portOpen(port)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${what} did not open port ${port} within ${seconds} s (see ${path.relative(root, run)}/*.log)`);
}

function pgBin(name: string): string {
  const base = '/usr/lib/postgresql';
  const versions = existsSync(base) ? readdirSync(base).filter((v) => existsSync(path.join(base, v, 'bin', name))) : [];
  versions.sort((a, b) => Number(b) - Number(a));
  if (!versions.length) throw new Error(`PostgreSQL's ${name} not found under ${base}; run scripts/ensure-deps.sh`);
  return path.join(base, versions[0], 'bin', name);
}

/** Runs a command as the postgres system user when we are root. */
function asPostgres(cmd: string, args: string[], opts: { input?: string } = {}) {
  const [file, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
  const r = spawnSync(file, argv, { encoding: 'utf8', input: opts.input, cwd: '/' });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

function postgresCanReach(dir: string): boolean {
  if (!isRoot) return true;
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir], { cwd: '/' }).status === 0;
}

/** The cluster's directory: `.data/pg`, or a reachable folder it links to. */
function pgDataDir(): string {
  const link = path.join(data, 'pg');
  if (existsSync(link)) return realpathSync(link);
  mkdirSync(data, { recursive: true });
  if (isRoot) {
    execFileSync('chown', ['postgres:postgres', data]);
    const reachable = postgresCanReach(data);
    execFileSync('chown', ['root:root', data]);
    // Reaching a folder's parents is not enough: the folder itself (root's again) must let it in.
    const enters = reachable && spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', data], { cwd: '/' }).status === 0;
    if (!enters) {
      const hash = createHash('sha256').update(data).digest('hex').slice(0, 12);
      const outside = `/var/lib/spoolwright/${hash}/pg`;
      mkdirSync(outside, { recursive: true });
      execFileSync('chown', ['-R', 'postgres:postgres', path.dirname(outside)]);
      chmodSync(path.dirname(outside), 0o700);
      symlinkSync(outside, link);
      return outside;
    }
  }
  mkdirSync(link, { recursive: true });
  if (isRoot) execFileSync('chown', ['postgres:postgres', link]);
  chmodSync(link, 0o700);
  return link;
}

/**
 * PostgreSQL's durability settings, given on the server's command line so that nothing in a
 * configuration file can weaken them: every commit is flushed to the write-ahead log on disk
 * before it is acknowledged, and a crash in the middle of a page write can be repaired.
 */
const PG_DURABLE = { fsync: 'on', synchronous_commit: 'on', full_page_writes: 'on' } as const;

function pgClient() {
  const { host, port, user, password } = LOCAL.postgres;
  return new pg.Client({ host, port, user, password, database: 'postgres', connectionTimeoutMillis: 5_000 });
}

/** The running server's durability settings (server-wide defaults, as a new connection sees them). */
async function pgSettings(): Promise<Record<string, string>> {
  const client = pgClient();
  await client.connect();
  try {
    const names = Object.keys(PG_DURABLE);
    const r = await client.query<{ name: string; setting: string }>('select name, setting from pg_settings where name = any($1)', [names]);
    return Object.fromEntries(r.rows.map((row) => [row.name, row.setting]));
  } finally {
    await client.end();
  }
}

const weakSettings = (settings: Record<string, string>) =>
  Object.entries(PG_DURABLE).filter(([k, v]) => settings[k] !== v).map(([k]) => `${k}=${settings[k] ?? '?'}`);

function pgStart(dir: string) {
  const logFile = path.join(dir, 'server.log');
  const durable = Object.entries(PG_DURABLE).map(([k, v]) => `-c ${k}=${v}`).join(' ');
  asPostgres(pgBin('pg_ctl'), [
    '-D', dir, '-l', logFile, '-w', '-t', '120',
    '-o', `-c listen_addresses=127.0.0.1 -c port=${LOCAL.postgres.port} -c unix_socket_directories=${dir} ${durable} -c max_connections=200`,
    'start',
  ]);
}

/** The cluster's directory when this data folder holds one, else null. */
function ownPgDir(): string | null {
  const link = path.join(data, 'pg');
  return existsSync(link) ? realpathSync(link) : null;
}

async function startPostgres() {
  const { port, user, password } = LOCAL.postgres;
  if (await portOpen(port)) {
    const weak = weakSettings(await pgSettings());
    if (!weak.length) return log(`PostgreSQL already on 127.0.0.1:${port} (durable: fsync, synchronous commit, full-page writes on)`);
    const dir = ownPgDir();
    if (!dir || !existsSync(path.join(dir, 'postmaster.pid'))) {
      throw new Error(`the PostgreSQL on 127.0.0.1:${port} runs with ${weak.join(', ')} and is not this project's to restart; stop it or start it with ${Object.entries(PG_DURABLE).map(([k, v]) => `${k}=${v}`).join(', ')}`);
    }
    log(`PostgreSQL on 127.0.0.1:${port} runs with ${weak.join(', ')}: restarting it with durable settings`);
    asPostgres(pgBin('pg_ctl'), ['-D', dir, '-m', 'fast', '-w', 'stop']);
    pgStart(dir);
    await waitForPort(port, 'PostgreSQL');
    return log(`PostgreSQL on 127.0.0.1:${port}`);
  }
  const dir = pgDataDir();
  if (!existsSync(path.join(dir, 'PG_VERSION'))) {
    log(`initialising a PostgreSQL cluster in ${dir}`);
    const pwfile = path.join(dir, '..', `.pw-${process.pid}`);
    writeFileSync(pwfile, `${password}\n`, { mode: 0o600 });
    if (isRoot) execFileSync('chown', ['postgres:postgres', pwfile]);
    try {
      asPostgres(pgBin('initdb'), ['-D', dir, '-U', user, '--pwfile', pwfile, '-A', 'scram-sha-256', '-E', 'UTF8', '--locale', 'C.UTF-8']);
    } finally {
      rmSync(pwfile, { force: true });
    }
  }
  // After a crash (power cut, kill -9) the server replays its write-ahead log on start; a
  // postmaster.pid left behind by a dead server does not stop pg_ctl.
  pgStart(dir);
  await waitForPort(port, 'PostgreSQL');
  log(`PostgreSQL on 127.0.0.1:${port}`);
}

function stopPostgres() {
  const link = path.join(data, 'pg');
  if (!existsSync(link)) return;
  const dir = realpathSync(link);
  if (!existsSync(path.join(dir, 'postmaster.pid'))) return;
  // Fast shutdown: open transactions roll back, everything committed is on disk.
  const r = spawnSync(isRoot ? 'runuser' : pgBin('pg_ctl'), [...(isRoot ? ['-u', 'postgres', '--', pgBin('pg_ctl')] : []), '-D', dir, '-m', 'fast', '-w', 'stop'], { encoding: 'utf8', cwd: '/' });
  if (r.status === 0) log('PostgreSQL stopped');
  else log(`PostgreSQL was not running (${(r.stderr || r.stdout).trim().split('\n').pop()})`);
}

/**
 * Redis keeps the queue (traveler and document jobs, their progress, failed jobs) and the
 * sign-in limiter's counts. Every write is appended to the append-only file and flushed every
 * second (a killed process loses nothing it answered; a power cut at most the last second); keys
 * are never evicted (the queue library refuses to run otherwise); a shutdown saves.
 */
const REDIS_DURABLE: Record<string, string> = { appendonly: 'yes', appendfsync: 'everysec', 'maxmemory-policy': 'noeviction' };

async function redisSettings(): Promise<Record<string, string>> {
  const client = new Redis({ host: LOCAL.redis.host, port: LOCAL.redis.port, lazyConnect: true, maxRetriesPerRequest: 1 });
  try {
    await client.connect();
    const out: Record<string, string> = {};
    for (const key of Object.keys(REDIS_DURABLE)) {
      const [, value] = (await client.config('GET', key)) as string[];
      out[key] = value;
    }
    return out;
  } finally {
    client.disconnect();
  }
}

async function startRedis() {
  const { port } = LOCAL.redis;
  if (await portOpen(port)) {
    const settings = await redisSettings();
    const weak = Object.entries(REDIS_DURABLE).filter(([k, v]) => settings[k] !== v);
    if (weak.length) {
      // All three can be changed on a running server; appendonly starts a rewrite of the file.
      const client = new Redis({ host: LOCAL.redis.host, port, maxRetriesPerRequest: 1 });
      try {
        for (const [k, v] of weak) await client.config('SET', k, v);
      } finally {
        client.disconnect();
      }
      log(`Redis on 127.0.0.1:${port} ran with ${weak.map(([k]) => `${k}=${settings[k]}`).join(', ')}: set to ${weak.map(([k, v]) => `${k}=${v}`).join(', ')}`);
    }
    return log(`Redis already on 127.0.0.1:${port} (append-only file, fsync every second)`);
  }
  const dir = path.join(data, 'redis');
  mkdirSync(dir, { recursive: true });
  mkdirSync(run, { recursive: true });
  execFileSync('redis-server', [
    '--bind', '127.0.0.1', '--port', String(port), '--dir', dir, '--daemonize', 'yes',
    '--pidfile', path.join(run, 'redis.pid'), '--logfile', path.join(run, 'redis.log'),
    ...Object.entries(REDIS_DURABLE).flatMap(([k, v]) => [`--${k}`, v]),
    // A snapshot besides the append-only file, for backups: after 100 changes in 60 s.
    '--save', '60', '100',
  ]);
  await waitForPort(port, 'Redis');
  log(`Redis on 127.0.0.1:${port}`);
}

/** Starts a Node-based stand-in detached, with its pid and log under .data/run. */
async function startNode(name: string, port: number, bin: string, args: string[]) {
  if (await portOpen(port)) return log(`${name} already on 127.0.0.1:${port}`);
  mkdirSync(run, { recursive: true });
  const out = openSync(path.join(run, `${name}.log`), 'a');
  const child = spawn(process.execPath, [path.join(root, 'node_modules', bin), ...args], {
    cwd: root, detached: true, stdio: ['ignore', out, out],
  });
  child.unref();
  writeFileSync(path.join(run, `${name}.pid`), String(child.pid));
  await waitForPort(port, name);
  log(`${name} on 127.0.0.1:${port}`);
}

function stopPidFile(name: string) {
  const file = path.join(run, `${name}.pid`);
  if (!existsSync(file)) return;
  const pid = Number(readFileSync(file, 'utf8').trim());
  try {
    process.kill(pid, 'SIGTERM');
    log(`${name} stopped`);
  } catch {
    /* already gone */
  }
  rmSync(file, { force: true });
}

async function up() {
  mkdirSync(data, { recursive: true });
  await startPostgres();
  await startRedis();
  const mailDir = path.join(data, 'mail');
  mkdirSync(mailDir, { recursive: true });
  await startNode('maildev', LOCAL.smtp.port, 'maildev/bin/maildev', [
    '--smtp', String(LOCAL.smtp.port), '--web', String(LOCAL.mailViewer.port), '--ip', '127.0.0.1',
    '--mail-directory', mailDir, '--silent',
  ]);
  await waitForPort(LOCAL.mailViewer.port, 'maildev viewer');
  const s3Dir = path.join(data, 's3');
  mkdirSync(s3Dir, { recursive: true });
  await startNode('s3rver', LOCAL.s3.port, 's3rver/bin/s3rver.js', [
    '-d', s3Dir, '-a', '127.0.0.1', '-p', String(LOCAL.s3.port), '--silent',
  ]);
}

/** Whether a process with this id is alive. */
function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/**
 * Stops the app and worker `npm start` runs, and waits for them: on SIGTERM the API stops taking
 * connections and finishes the requests it has, the worker finishes its running jobs, then both
 * close their connections (scripts/run-app.ts, server/index.ts, jobs/worker.ts).
 */
async function stopApp(seconds = 40) {
  if (!existsSync(APP_PID_FILE)) return;
  const pid = Number(readFileSync(APP_PID_FILE, 'utf8').trim());
  if (Number.isInteger(pid) && pid > 0 && alive(pid)) {
    process.kill(pid, 'SIGTERM');
    const until = Date.now() + seconds * 1000;
    while (alive(pid) && Date.now() < until) await new Promise((r) => setTimeout(r, 200));
    if (alive(pid)) {
      log(`the app (pid ${pid}) did not stop within ${seconds} s; stopping it now`);
      process.kill(pid, 'SIGKILL');
    } else log('app and worker stopped');
  }
  rmSync(APP_PID_FILE, { force: true });
}

async function down() {
  await stopApp();
  stopPidFile('s3rver');
  stopPidFile('maildev');
  const redisPid = path.join(run, 'redis.pid');
  if (existsSync(redisPid)) {
    // SHUTDOWN SAVE: flush the append-only file and write a snapshot before exiting.
    const r = spawnSync('redis-cli', ['-h', '127.0.0.1', '-p', String(LOCAL.redis.port), 'shutdown', 'save'], { encoding: 'utf8' });
    if (r.status === 0) log('Redis saved and stopped');
  }
  stopPostgres();
}

async function status() {
  const rows: [string, number][] = [
    ['PostgreSQL', LOCAL.postgres.port], ['Redis', LOCAL.redis.port], ['SMTP catcher', LOCAL.smtp.port],
    ['mailbox viewer', LOCAL.mailViewer.port], ['object store', LOCAL.s3.port],
  ];
  for (const [name, port] of rows) {
    const up = await portOpen(port);
    let detail = '';
    if (up && name === 'PostgreSQL') {
      const s = await pgSettings().catch(() => null);
      if (s) detail = `  (${Object.keys(PG_DURABLE).map((k) => `${k} ${s[k]}`).join(', ')})`;
    } else if (up && name === 'Redis') {
      const s = await redisSettings().catch(() => null);
      if (s) detail = `  (${Object.keys(REDIS_DURABLE).map((k) => `${k} ${s[k]}`).join(', ')})`;
    }
    console.log(`${name.padEnd(16)} 127.0.0.1:${port}  ${up ? 'up' : 'down'}${detail}`);
  }
}

const cmd = process.argv[2] ?? 'up';
const actions: Record<string, () => Promise<void>> = { up, down, status };
if (!actions[cmd]) {
  console.error('usage: tsx scripts/services.ts up|down|status');
  process.exit(2);
}
actions[cmd]().catch((e) => {
  console.error(`services: ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
