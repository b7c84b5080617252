#!/usr/bin/env bash
# npm start: everything from a fresh machine to a running shop at http://127.0.0.1:${PORT:-3000}.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
npx tsx scripts/services.ts up
npx tsx scripts/db.ts migrate
npx tsx scripts/db.ts seed
npx tsx scripts/build-client.ts
export SPOOLWRIGHT_BANNER=1
exec npx tsx scripts/run-app.ts
