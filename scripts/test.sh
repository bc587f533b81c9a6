#!/usr/bin/env bash
# npm test: every set-up step the tests need, then every test (unit, integration, browser).
# The local services it starts are stopped again at the end, on success and on failure; those it
# found already running are left running, and it says so.
set -euo pipefail
cd "$(dirname "$0")/.."
export VITE_CONFIG_NATIVE_IGNORE_WARNING=true
export NEXT_TELEMETRY_DISABLED=1 # the build sends no usage data
bash scripts/ensure-deps.sh
started="$(mktemp)"
found_running=""
stop_started() {
  local status=$? list
  trap "" INT PIPE # a second Ctrl-C or a closed stdout must not cut the stop short
  list="$(sort -u "$started" | tr '\n' ' ')"
  [ -z "${list// /}" ] || bash docker-less-dev/down.sh $list || true
  rm -f "$started"
  [ -z "$found_running" ] || echo "[cairn] left running, as found before the tests:$found_running" || true
  exit $status
}
trap stop_started EXIT
up_log="$(CAIRN_STARTED_LIST="$started" CAIRN_NEED_BROWSER=1 CAIRN_NEED_S3=1 bash docker-less-dev/up.sh | tee /dev/stderr)"
grep -q "PostgreSQL already running" <<<"$up_log" && found_running="$found_running PostgreSQL"
grep -q "Redis already running" <<<"$up_log" && found_running="$found_running Redis"
grep -q "fake mail server already running" <<<"$up_log" && found_running="$found_running fake-mail-server"
grep -q "fake time-stamping authority already running" <<<"$up_log" && found_running="$found_running fake-time-stamping-authority"
grep -q "local S3 server already running" <<<"$up_log" && found_running="$found_running local-S3-server"
echo "[cairn] type check"
npx tsc --noEmit
echo "[cairn] unit tests"
npx vitest run --project unit
echo "[cairn] integration tests (real PostgreSQL, Redis, ffmpeg)"
npx vitest run --project integration
echo "[cairn] the integration tests that store or read files, again on the S3 store (local S3 server)"
STORAGE_BACKEND=s3 npx vitest run --project integration tests/integration/storage tests/integration/ingest tests/integration/processing \
  tests/integration/sharing tests/integration/review tests/integration/evidence-packages tests/integration/retention tests/integration/tracks \
  tests/integration/custody/legal-hold-deletion.test.ts
echo "[cairn] building the web app for the browser tests"
# a parallel test slot builds into a folder of its own (tests/support/test-env.ts)
if [ -n "${CAIRN_TEST_SLOT:-}" ] && [ "${CAIRN_TEST_SLOT}" != "0" ]; then export NEXT_DIST_DIR=".next-test-${CAIRN_TEST_SLOT}"; fi
CAIRN_TYPECHECKED=1 npx next build > .data/logs/next-build.log 2>&1 || { tail -50 .data/logs/next-build.log; exit 1; }
echo "[cairn] browser tests (Debian chromium), and the start command on a fresh data folder"
npx vitest run --project e2e
