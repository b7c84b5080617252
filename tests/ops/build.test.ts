import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { ROOT, runScript } from './helpers';

/** The test run's own database, Redis and bucket (the defaults when the environment names none). */
const testConfig = loadConfig({ ...process.env, NODE_ENV: 'test' });

const children: ChildProcess[] = [];
afterAll(() => {
  // npm runs the script in its own process group: end the group (npm, its shell, node).
  for (const c of children) if (c.pid && c.exitCode === null) process.kill(-c.pid, 'SIGTERM');
});

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

/** Starts an npm script in its own process group and waits (30 s at most) for a line matching `ready`. */
function startNpm(script: string, env: Record<string, string>, ready: RegExp): Promise<{ line: string; output: () => string }> {
  const child = spawn('npm', ['run', '--silent', script], { cwd: ROOT, env: { ...process.env, ...env, NODE_OPTIONS: '' }, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  let out = '';
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${script} did not start:\n${out}`)), 30_000);
    const onData = (d: Buffer) => {
      out += d;
      const m = out.split('\n').find((l) => ready.test(l));
      if (m) {
        clearTimeout(timer);
        resolve({ line: m, output: () => out });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code) => reject(new Error(`${script} ended (${code}):\n${out}`)));
  });
}

/** What the kernel says a process was started with: its command line and whether NODE_OPTIONS was set. */
function processFacts(pid: number) {
  const cmdline = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean);
  const environ = readFileSync(`/proc/${pid}/environ`, 'utf8').split('\0');
  return { cmdline, nodeOptions: environ.find((e) => e.startsWith('NODE_OPTIONS=')) ?? '' };
}

describe('the compiled build', () => {
  it('runs the API and the worker with plain node, no TypeScript loader in either process', async () => {
    const built = await runScript('scripts/build.ts', ['--server-only'], {});
    expect(built.out).toContain('dist/server/index.js');
    expect(built.code).toBe(0);

    const port = await freePort();
    const env = {
      NODE_ENV: 'production',
      PORT: String(port),
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      SESSION_SECRET: 'a production secret for this test only',
      DATABASE_URL: testConfig.databaseUrl,
      REDIS_URL: testConfig.redisUrl,
      SMTP_URL: testConfig.smtpUrl,
      S3_BUCKET: testConfig.s3.bucket,
      S3_ENDPOINT: 'http://127.0.0.1:4568',
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: 'true',
      LOG_LEVEL: 'warn',
    };
    const api = await startNpm('start:prod', env, /Spoolwright API listening/);
    const worker = await startNpm('worker:prod', env, /Spoolwright worker started/);

    for (const line of [api.line, worker.line]) {
      expect(line).toMatch(/flags: --enable-source-maps\)$/);
      const pid = Number(/pid (\d+)/.exec(line)![1]);
      const facts = processFacts(pid);
      expect(facts.cmdline[0]).toMatch(/node$/);
      expect(facts.cmdline.slice(1)).toEqual(['--enable-source-maps', line === api.line ? 'dist/server/index.js' : 'dist/server/worker.js']);
      expect(facts.cmdline.join(' ')).not.toMatch(/tsx|--import|--loader|--require|\.ts\b/);
      expect(facts.nodeOptions).toMatch(/^(NODE_OPTIONS=)?$/);
    }

    const health = await fetch(`http://127.0.0.1:${port}/api/health`);
    expect(health.status).toBe(200);
    expect((await health.json()).status).toBe('ok');
    const login = await fetch(`http://127.0.0.1:${port}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-requested-by': 'spoolwright' },
      body: JSON.stringify({ email: 'admin@spoolwright.test', password: 'spoolwright-demo' }),
    });
    expect(login.status).toBe(200);
  }, 180_000);
});
