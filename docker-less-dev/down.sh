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
# the mail server runs in a process group of its own (up.sh): stop the whole group, found through
# this clone's own tsx loader path so another checkout's server is never touched
smtp_pid=$(pgrep -f "$ROOT/node_modules/tsx/dist/loader.mjs docker-less-dev/fake-smtp.ts" | head -n 1 || true)
if [ -n "$smtp_pid" ]; then
  pgid=$(ps -o pgid= -p "$smtp_pid" | tr -d ' ')
  kill -TERM -- "-$pgid" 2>/dev/null && log "fake mail server stopped" || true
fi
