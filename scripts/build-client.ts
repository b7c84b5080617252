/**
 * Builds the client into dist/client unless nothing it depends on changed since the last build
 * (a hash of the sources is kept beside the output), so a second `npm start` is quick.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');
const inputs = ['src', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];
const stampFile = path.join(root, 'dist', 'client', '.build-hash');

function addTree(hash: ReturnType<typeof createHash>, p: string) {
  if (!existsSync(p)) return;
  if (statSync(p).isDirectory()) {
    for (const name of readdirSync(p).sort()) addTree(hash, path.join(p, name));
  } else {
    hash.update(path.relative(root, p));
    hash.update(readFileSync(p));
  }
}

const hash = createHash('sha256');
for (const i of inputs) addTree(hash, path.join(root, i));
const digest = hash.digest('hex');

if (existsSync(stampFile) && readFileSync(stampFile, 'utf8') === digest && !process.argv.includes('--force')) {
  console.log('client: up to date');
} else {
  console.log('client: building');
  const env = { ...process.env, NODE_ENV: 'production' };
  execFileSync(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit', env });
  writeFileSync(stampFile, digest);
}
