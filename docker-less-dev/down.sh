#!/usr/bin/env bash
# Stops the local services of this checkout's data folder, cleanly (PostgreSQL fast shutdown, Redis
# SHUTDOWN, the mail server's and the time-stamping authority's process groups SIGTERM, the local S3 server's too). With
# arguments, only those of postgres, redis, smtp, tsa, s3 (the names up.sh writes to CAIRN_STARTED_LIST);
# without, all five.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
want=("$@"); [ ${#want[@]} -gt 0 ] || want=(postgres redis smtp tsa s3)
wants() { local w; for w in "${want[@]}"; do [ "$w" = "$1" ] && return 0; done; return 1; }

if wants postgres; then
  bin="$(pg_bin)"
  if [ -f "$PG_DATA/PG_VERSION" ] && as_pg "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then
    as_pg "$bin/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null && log "PostgreSQL stopped"
  fi
fi
if wants redis && redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1; then
  # only a Redis that keeps its files in this data folder is ours to stop
  if [ "$(redis-cli -h 127.0.0.1 -p "$REDIS_PORT" config get dir 2>/dev/null | sed -n 2p)" = "$(cd "$REDIS_DIR" 2>/dev/null && pwd -P)" ]; then
    redis-cli -h 127.0.0.1 -p "$REDIS_PORT" shutdown >/dev/null 2>&1 || true
    for _ in $(seq 1 50); do redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1 || break; sleep 0.1; done
    log "Redis stopped"
  else
    log "Redis on 127.0.0.1:$REDIS_PORT does not keep its data in $REDIS_DIR: left running"
  fi
fi
if wants smtp && stop_node_service docker-less-dev/fake-smtp.ts "$SMTP_PIDFILE"; then log "fake mail server stopped"; fi
if wants tsa && stop_node_service docker-less-dev/fake-tsa.ts "$TSA_PIDFILE"; then log "fake time-stamping authority stopped"; fi
if wants s3 && stop_node_service docker-less-dev/fake-s3.ts "$S3_PIDFILE"; then log "local S3 server stopped"; fi
exit 0
