#!/usr/bin/env bash
# npm run dev: services + migrations + seed, then Next in development mode and the worker.
# Ctrl-C stops both, and the local services this run started.
set -euo pipefail
cd "$(dirname "$0")/.."
source docker-less-dev/lib.sh
bash scripts/ensure-deps.sh
up_and_stop_on_exit
export_local_env
npx tsx db/migrate.ts
npx tsx db/seed.ts
npx concurrently -k -n web,worker -c cyan,magenta "npx next dev -p ${PORT:-3100}" "npx tsx watch worker/main.ts"
