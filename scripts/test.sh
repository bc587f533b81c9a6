#!/usr/bin/env bash
# npm test: every set-up step the tests need, then every test (unit, integration, browser).
set -euo pipefail
cd "$(dirname "$0")/.."
export VITE_CONFIG_NATIVE_IGNORE_WARNING=true
bash scripts/ensure-deps.sh
CAIRN_NEED_BROWSER=1 bash docker-less-dev/up.sh
echo "[cairn] type check"
npx tsc --noEmit
echo "[cairn] unit tests"
npx vitest run --project unit
echo "[cairn] integration tests (real PostgreSQL, Redis, ffmpeg)"
npx vitest run --project integration
echo "[cairn] building the web app for the browser tests"
npx next build > .data/logs/next-build.log 2>&1 || { tail -50 .data/logs/next-build.log; exit 1; }
echo "[cairn] browser tests (Debian chromium)"
npx vitest run --project e2e
