/**
 * Browser tests: Debian's Chromium driven by playwright-core against the real API server, which
 * serves the built client (dist/client). Run `npx vite build` first, then
 *   npx vitest run --config tests/e2e/vitest.config.ts
 */
import path from 'node:path';
import { defineConfig } from 'vitest/config';

const root = path.resolve(import.meta.dirname, '..', '..');

export default defineConfig({
  root,
  test: {
    root,
    include: ['tests/e2e/**/*.test.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 180_000,
    globalSetup: ['tests/e2e/global-setup.ts'],
  },
});
