// Adds up vitest's JSON reports and prints the plain total as the last line; exits 1 on any
// failure, including a suite that did not load or a report that is missing.
import { existsSync, readFileSync } from 'node:fs';

let passed = 0, failed = 0, skipped = 0;
for (const file of process.argv.slice(2)) {
  if (!existsSync(file)) {
    console.log(`${file}: no report (the runner did not finish)`);
    failed += 1;
    continue;
  }
  const r = JSON.parse(readFileSync(file, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
  skipped += r.numPendingTests + (r.numTodoTests ?? 0);
  // A file that failed before any test ran (a syntax or import error) counts as a failure.
  for (const s of r.testResults ?? []) if (s.status === 'failed' && !(s.assertionResults ?? []).some((a) => a.status === 'failed')) failed += 1;
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
