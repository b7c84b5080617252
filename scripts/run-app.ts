/**
 * Runs the API (which also serves the built client) and the background worker as child
 * processes (each one node process with tsx's loader); Ctrl-C stops both. `npm run stop` stops
 * the local services.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');
const entries = ['server/index.ts', 'jobs/worker.ts'].filter((e) => existsSync(path.join(root, e)));
const children: ChildProcess[] = entries.map((e) => spawn(process.execPath, ['--import', 'tsx', e], { cwd: root, stdio: 'inherit', env: process.env }));

let stopping = false;
function stop(code = 0) {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => process.exit(code), 6_000).unref();
  Promise.all(children.map((c) => new Promise((r) => (c.exitCode !== null ? r(null) : c.once('exit', r))))).then(() => process.exit(code));
}
process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));
for (const c of children) c.once('exit', (code) => !stopping && stop(code ?? 1));
