/**
 * npm run build: everything production runs, compiled.
 *   1. type-checks the whole project (tsc --noEmit): a type error stops the build;
 *   2. compiles the API (server/index.ts) and the worker (jobs/worker.ts) to JavaScript in
 *      dist/server/ with esbuild (one ES module each; packages stay in node_modules);
 *   3. builds the client into dist/client (vite).
 * `npm run start:prod` and `npm run worker:prod` then run them with plain node.
 *
 *   --server-only        step 2 alone;  --outdir <dir>  where step 2 writes (default dist/server)
 */
import { execFileSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { build } from 'esbuild';

const root = path.resolve(import.meta.dirname, '..');
const { values } = parseArgs({ options: { 'server-only': { type: 'boolean' }, outdir: { type: 'string' } } });
const outdir = path.resolve(root, values.outdir ?? path.join('dist', 'server'));
const node = (args: string[]) => execFileSync(process.execPath, args, { cwd: root, stdio: 'inherit' });

if (!values['server-only']) {
  console.log('build: type-checking (tsc)');
  node([path.join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '--noEmit', '-p', '.']);
}

console.log(`build: compiling the API and the worker into ${path.relative(root, outdir)}/`);
rmSync(outdir, { recursive: true, force: true });
const result = await build({
  absWorkingDir: root,
  entryPoints: { index: 'server/index.ts', worker: 'jobs/worker.ts' },
  outdir,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
  metafile: true,
});
for (const [file, out] of Object.entries(result.metafile.outputs)) {
  if (file.endsWith('.js')) console.log(`  ${file}  ${(out.bytes / 1024).toFixed(0)} KiB`);
}

if (!values['server-only']) {
  console.log('build: the client (vite)');
  node([path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'), path.join(root, 'scripts', 'build-client.ts'), '--force']);
}
console.log('build: done');
