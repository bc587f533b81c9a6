#!/usr/bin/env bash
# Stops what up.sh started, cleanly (PostgreSQL fast shutdown, Redis SHUTDOWN, mail server SIGTERM).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
bin="$(pg_bin)"
if [ -f "$PG_DATA/PG_VERSION" ] && as_pg "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then
  as_pg "$bin/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null && log "PostgreSQL stopped"
fi
if redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1; then
  redis-cli -h 127.0.0.1 -p "$REDIS_PORT" shutdown >/dev/null 2>&1 || true; log "Redis stopped"
fi
if [ -f "$DATA/fake-smtp.pid" ]; then
  kill -TERM -- "-$(cat "$DATA/fake-smtp.pid")" 2>/dev/null && log "fake mail server stopped" || true
  rm -f "$DATA/fake-smtp.pid"
fi
