#!/usr/bin/env bash
# npm start: everything from a fresh clone to a running Cairn. Ctrl-C stops all of it.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash docker-less-dev/up.sh
export CAIRN_LOCAL=1
npx tsx db/migrate.ts
npx tsx db/seed.ts
if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib db -newer .next/BUILD_ID -type f -print -quit 2>/dev/null)" ]; then
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
  Fake mailbox: http://localhost:${PORT}/dev/mailbox (messages also in .data/mail)
  Ctrl-C stops the app, the worker and the local services.

MSG
cleanup() { bash docker-less-dev/down.sh || true; }
trap cleanup EXIT
NEXTAUTH_URL="${NEXTAUTH_URL:-http://localhost:${PORT}}" npx concurrently -k -n web,worker -c cyan,magenta \
  "npx next start -p ${PORT} -H 127.0.0.1" "npx tsx worker/main.ts"
