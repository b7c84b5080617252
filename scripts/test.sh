#!/usr/bin/env bash
# npm test: the same set-up as npm start on separate test databases, then every suite
# (unit, integration, browser). The last line is the plain total over all suites.
set -uo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh --test || exit 1
already_up=$(npx tsx scripts/services.ts status | grep -cE ' up( |$)' || true)
npx tsx scripts/services.ts up || exit 1
npx tsx scripts/build-client.ts || exit 1
export NODE_ENV=test
mkdir -p test-results
rm -f test-results/*.json

npx vitest run --reporter=default --reporter=json --outputFile.json=test-results/integration.json
npx vitest run --config tests/e2e/vitest.config.ts --reporter=default --reporter=json --outputFile.json=test-results/e2e.json

# Stop the services again when this run started them (CI, a fresh machine).
if [[ "$already_up" == "0" ]]; then npx tsx scripts/services.ts down >/dev/null; fi
node scripts/test-summary.mjs test-results/integration.json test-results/e2e.json
