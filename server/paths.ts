import { existsSync } from 'node:fs';
import path from 'node:path';

/**
 * The project folder (the one holding package.json), found by walking up from this module. The
 * same code runs from `server/` (tsx) and from the compiled bundle in `dist/server/`.
 */
export function findProjectRoot(from = import.meta.dirname): string {
  let dir = from;
  for (;;) {
    if (existsSync(path.join(dir, 'package.json')) && existsSync(path.join(dir, 'drizzle'))) return dir;
    const up = path.dirname(dir);
    if (up === dir) throw new Error(`No project folder above ${from}`);
    dir = up;
  }
}

export const PROJECT_ROOT = findProjectRoot();
