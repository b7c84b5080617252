#!/usr/bin/env bash
# npm run dev: Vite's dev server (http://127.0.0.1:5173) with the API behind its proxy, both
# reloading on change.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
npx tsx scripts/services.ts up
npx tsx scripts/db.ts migrate
npx tsx scripts/db.ts seed
cmds=("tsx watch --clear-screen=false server/index.ts" "vite")
names="api,web"
if [[ -f jobs/worker.ts ]]; then cmds+=("tsx watch --clear-screen=false jobs/worker.ts"); names+=",worker"; fi
exec npx concurrently -k -n "$names" "${cmds[@]}"
