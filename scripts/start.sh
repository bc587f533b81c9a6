#!/usr/bin/env bash
# npm start: everything from a fresh clone to a running Cairn. Ctrl-C stops the web app, the worker
# and the local services this run started (services found already running are left alone).
set -euo pipefail
cd "$(dirname "$0")/.."
source docker-less-dev/lib.sh
bash scripts/ensure-deps.sh
up_and_stop_on_exit
export_local_env
export CAIRN_LOCAL=1
npx tsx db/migrate.ts
npx tsx db/seed.ts
DIST="${NEXT_DIST_DIR:-.next}"
if [ ! -f "$DIST/BUILD_ID" ] || [ -n "$(find app components lib db instrumentation.ts -newer "$DIST/BUILD_ID" -type f -print -quit 2>/dev/null)" ]; then
  echo "[cairn] building the web app"
  npx next build
fi
PORT="${PORT:-3100}"
cat <<MSG

  Cairn is starting on http://localhost:${PORT}
  Demo sign-ins (password cairn-demo-2026):
    owner@kestrelmoor.example     owner
    pilot@kestrelmoor.example     pilot
    reviewer@kestrelmoor.example  reviewer
    client@kestrelmoor.example    client
  Fake mailbox: http://localhost:${PORT}/dev/mailbox (messages also in ${MAIL_DIR})
  Ctrl-C stops the app, the worker and the local services.

MSG
export APP_URL="${APP_URL:-http://localhost:${PORT}}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-$APP_URL}"
# concurrently -k: when one stops, the other is stopped too; Ctrl-C reaches both
npx concurrently -k -n web,worker -c cyan,magenta \
  "npx next start -p ${PORT} -H ${CAIRN_LISTEN_HOST:-127.0.0.1}" "npx tsx worker/main.ts"
