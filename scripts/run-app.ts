/**
 * Runs the API (which also serves the built client) and the background worker as child
 * processes (each one node process with tsx's loader); Ctrl-C or SIGTERM stops both, letting the
 * API finish its requests and the worker its running jobs. `npm run stop` sends that SIGTERM (it
 * finds this process through the pid file) before it stops the local services.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { APP_PID_FILE, PROJECT_ROOT as root, RUN_DIR } from './local-paths';

/** How long the children may take to finish what they are doing before they are killed. */
const STOP_GRACE_MS = 30_000;

mkdirSync(RUN_DIR, { recursive: true });
writeFileSync(APP_PID_FILE, String(process.pid));
const dropPidFile = () => {
  try {
    if (readFileSync(APP_PID_FILE, 'utf8').trim() === String(process.pid)) rmSync(APP_PID_FILE, { force: true });
  } catch {
    /* already gone */
  }
};

const entries = ['server/index.ts', 'jobs/worker.ts'].filter((e) => existsSync(path.join(root, e)));
const children: ChildProcess[] = entries.map((e) => spawn(process.execPath, ['--import', 'tsx', e], { cwd: root, stdio: 'inherit', env: process.env }));

let stopping = false;
function stop(code = 0) {
  if (stopping) return;
  stopping = true;
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  setTimeout(() => {
    for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
    dropPidFile();
    process.exit(code);
  }, STOP_GRACE_MS).unref();
  Promise.all(children.map((c) => new Promise((r) => (c.exitCode !== null || c.signalCode !== null ? r(null) : c.once('exit', r))))).then(() => {
    dropPidFile();
    process.exit(code);
  });
}
process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));
for (const c of children) c.once('exit', (code) => !stopping && stop(code ?? 1));
