#!/usr/bin/env bash
# npm run dev: services + migrations + seed, then Next in development mode and the worker.
# Ctrl-C stops both, and the local services this run started.
set -euo pipefail
cd "$(dirname "$0")/.."
source docker-less-dev/lib.sh
bash scripts/ensure-deps.sh
started="$(mktemp)"
stop_started() {
  local list; list="$(sort -u "$started" | tr '\n' ' ')"
  [ -z "${list// /}" ] || bash docker-less-dev/down.sh $list || true
  rm -f "$started"
}
trap stop_started EXIT
CAIRN_STARTED_LIST="$started" bash docker-less-dev/up.sh
export_local_env
npx tsx db/migrate.ts
npx tsx db/seed.ts
npx concurrently -k -n web,worker -c cyan,magenta "npx next dev -p ${PORT:-3100}" "npx tsx watch worker/main.ts"
