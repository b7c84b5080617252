/**
 * Starts and stops the local services on loopback: PostgreSQL and Redis from Debian's packages,
 * the SMTP catcher (maildev) and the S3-compatible fake (s3rver). Data lives under `.data/`.
 *
 *   tsx scripts/services.ts up      start whatever is not running (idempotent)
 *   tsx scripts/services.ts down    stop everything this project started
 *   tsx scripts/services.ts status
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
import { LOCAL } from '../server/config';

const root = path.resolve(import.meta.dirname, '..');
const data = path.join(root, '.data');
const run = path.join(data, 'run');
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
    if (!postgresCanReach(data)) {
      execFileSync('chown', ['root:root', data]);
      const hash = createHash('sha256').update(root).digest('hex').slice(0, 12);
      const outside = `/var/lib/spoolwright/${hash}/pg`;
      mkdirSync(outside, { recursive: true });
      execFileSync('chown', ['-R', 'postgres:postgres', path.dirname(outside)]);
      chmodSync(path.dirname(outside), 0o700);
      symlinkSync(outside, link);
      return outside;
    }
    execFileSync('chown', ['root:root', data]);
  }
  mkdirSync(link, { recursive: true });
  if (isRoot) execFileSync('chown', ['postgres:postgres', link]);
  chmodSync(link, 0o700);
  return link;
}

async function startPostgres() {
  const { port, user, password } = LOCAL.postgres;
  if (await portOpen(port)) return log(`PostgreSQL already on 127.0.0.1:${port}`);
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
  const logFile = path.join(dir, 'server.log');
  asPostgres(pgBin('pg_ctl'), [
    '-D', dir, '-l', logFile, '-w', '-t', '60',
    '-o', `-c listen_addresses=127.0.0.1 -c port=${port} -c unix_socket_directories=${dir} -c fsync=off -c synchronous_commit=off -c max_connections=200`,
    'start',
  ]);
  await waitForPort(port, 'PostgreSQL');
  log(`PostgreSQL on 127.0.0.1:${port}`);
}

function stopPostgres() {
  const link = path.join(data, 'pg');
  if (!existsSync(link)) return;
  const dir = realpathSync(link);
  if (!existsSync(path.join(dir, 'postmaster.pid'))) return;
  asPostgres(pgBin('pg_ctl'), ['-D', dir, '-m', 'fast', '-w', 'stop']);
  log('PostgreSQL stopped');
}

async function startRedis() {
  const { port } = LOCAL.redis;
  if (await portOpen(port)) return log(`Redis already on 127.0.0.1:${port}`);
  const dir = path.join(data, 'redis');
  mkdirSync(dir, { recursive: true });
  mkdirSync(run, { recursive: true });
  execFileSync('redis-server', [
    '--bind', '127.0.0.1', '--port', String(port), '--dir', dir, '--daemonize', 'yes',
    '--pidfile', path.join(run, 'redis.pid'), '--logfile', path.join(run, 'redis.log'),
    '--save', '60', '100', '--appendonly', 'no', '--maxmemory-policy', 'noeviction',
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

async function down() {
  stopPidFile('s3rver');
  stopPidFile('maildev');
  const redisPid = path.join(run, 'redis.pid');
  if (existsSync(redisPid)) {
    spawnSync('redis-cli', ['-h', '127.0.0.1', '-p', String(LOCAL.redis.port), 'shutdown', 'nosave'], { stdio: 'ignore' });
    log('Redis stopped');
  }
  stopPostgres();
}

async function status() {
  const rows: [string, number][] = [
    ['PostgreSQL', LOCAL.postgres.port], ['Redis', LOCAL.redis.port], ['SMTP catcher', LOCAL.smtp.port],
    ['mailbox viewer', LOCAL.mailViewer.port], ['object store', LOCAL.s3.port],
  ];
  for (const [name, port] of rows) console.log(`${name.padEnd(16)} 127.0.0.1:${port}  ${(await portOpen(port)) ? 'up' : 'down'}`);
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
