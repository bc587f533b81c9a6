#!/usr/bin/env bash
# npm run dev: services + migrations + seed, then Next in development mode and the worker.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash docker-less-dev/up.sh
npx tsx db/migrate.ts
npx tsx db/seed.ts
npx concurrently -k -n web,worker -c cyan,magenta "npx next dev -p ${PORT:-3100}" "npx tsx watch worker/main.ts"
