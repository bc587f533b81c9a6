#!/usr/bin/env bash
# Shared settings for the docker-less-dev scripts: where data lives and which ports we own.
# Everything listens on 127.0.0.1 only, on ports of our own so a system server never collides.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA="${CAIRN_DATA_DIR:-$ROOT/.data}"
PG_PORT="${CAIRN_PG_PORT:-54329}"
REDIS_PORT="${CAIRN_REDIS_PORT:-63799}"
SMTP_PORT="${CAIRN_SMTP_PORT:-2525}"
PG_DATA="$DATA/postgres"
PG_RUN="$DATA/postgres-run"
PG_LOG="$DATA/logs/postgres.log"
REDIS_DIR="$DATA/redis"
PG_SUPERUSER="cairn_admin"
PG_SUPERPASS="cairn_admin_local"
PG_APPUSER="cairn_app"
PG_APPPASS="cairn_app_local"

log() { printf '[cairn-dev] %s\n' "$*"; }

pg_bin() {
  local v
  v=$(ls /usr/lib/postgresql 2>/dev/null | sort -V | tail -n 1 || true)
  [ -n "$v" ] || { echo ""; return; }
  echo "/usr/lib/postgresql/$v/bin"
}

# PostgreSQL refuses to run as root: as root we run it as the `postgres` system user.
as_pg() {
  if [ "$(id -u)" = "0" ]; then runuser -u postgres -- "$@"; else "$@"; fi
}
