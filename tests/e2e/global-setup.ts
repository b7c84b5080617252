/**
 * Starts the API server (which serves dist/client) for the browser tests, and stops it after.
 * The services are expected to be up (npm test sees to that); the test database is reset,
 * migrated and seeded here, so these tests never depend on what other suites left behind.
 * Builds the client only when dist/client/index.html is missing.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import resetTestDatabase from '../global-setup';

const root = path.resolve(import.meta.dirname, '..', '..');
export const E2E_PORT = Number(process.env.E2E_PORT ?? 3101);

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string;
  }
}

function portInUse(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ port, host: '127.0.0.1' });
    s.once('connect', () => {
      s.destroy();
      resolve(true);
    });
    s.once('error', () => resolve(false));
  });
}

async function waitForHealth(baseURL: string, child: ChildProcess, log: () => string, seconds = 90) {
  const until = Date.now() + seconds * 1000;
  let last = 'no answer';
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`The API server exited with code ${child.exitCode} before it was healthy:\n${log()}`);
    try {
      const res = await fetch(`${baseURL}/api/health`);
      if (res.status === 200) return;
      last = `${res.status} ${await res.text()}`;
    } catch (e) {
      last = (e as Error).message;
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`GET /api/health was not 200 within ${seconds} s (last: ${last}). Are the services up (npx tsx scripts/services.ts up)?\n${log()}`);
}

function stop(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null || !child.pid) return resolve();
    const pid = child.pid;
    const force = setTimeout(() => {
      try {
        process.kill(-pid, 'SIGKILL');
      } catch {
        /* already gone */
      }
    }, 8_000);
    child.once('exit', () => {
      clearTimeout(force);
      resolve();
    });
    try {
      // The server runs in its own process group (npx → tsx → node): stop the whole group we started.
      process.kill(-pid, 'SIGTERM');
    } catch {
      clearTimeout(force);
      resolve();
    }
  });
}

export default async function setup(project: TestProject) {
  await resetTestDatabase();
  const clientDir = process.env.CLIENT_DIR ?? path.join('dist', 'client');
  if (!existsSync(path.join(root, clientDir, 'index.html'))) {
    console.log(`e2e: ${clientDir} is missing; building the client`);
    const build = spawnSync('npx', ['vite', 'build', '--outDir', clientDir], { cwd: root, stdio: 'inherit' });
    if (build.status !== 0) throw new Error('e2e: `npx vite build` failed');
  }
  if (await portInUse(E2E_PORT)) {
    throw new Error(`e2e: port ${E2E_PORT} is already in use; stop what runs there or set E2E_PORT`);
  }

  const baseURL = `http://127.0.0.1:${E2E_PORT}`;
  const output: string[] = [];
  const child = spawn('npx', ['tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'test', PORT: String(E2E_PORT), HOST: '127.0.0.1' },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  const keep = (chunk: Buffer) => {
    output.push(chunk.toString());
    if (output.length > 200) output.shift();
  };
  child.stdout?.on('data', keep);
  child.stderr?.on('data', keep);

  try {
    await waitForHealth(baseURL, child, () => output.join(''));
  } catch (e) {
    await stop(child);
    throw e;
  }
  project.provide('baseURL', baseURL);
  return async () => {
    await stop(child);
  };
}
