#!/usr/bin/env bash
# Start, stop or report the local fake time-stamping authority (fake-tsa.ts) that custody checkpoints
# are stamped by (TSA_URL, default http://127.0.0.1:3399/). For up.sh / down.sh / status.sh:
#   bash docker-less-dev/fake-tsa.sh start|stop|status
# Skipped by `start` when TSA_URL is set (an external authority, or "off").
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
TSA_PORT="${CAIRN_TSA_PORT:-3399}"
up() { (exec 3<>"/dev/tcp/127.0.0.1/$TSA_PORT") 2>/dev/null; }

case "${1:-status}" in
  start)
    if [ -n "${TSA_URL:-}" ]; then log "TSA_URL set: using that time-stamping authority"; exit 0; fi
    if up; then log "fake time-stamping authority already running on 127.0.0.1:$TSA_PORT"; exit 0; fi
    mkdir -p "$DATA/logs"
    # its own process group, so stopping it also stops the node process that tsx starts
    (cd "$ROOT" && CAIRN_TSA_PORT="$TSA_PORT" CAIRN_TSA_DIR="$DATA/tsa" setsid nohup node_modules/.bin/tsx docker-less-dev/fake-tsa.ts >>"$DATA/logs/fake-tsa.log" 2>&1 </dev/null &)
    # the first start makes its CA and TSA certificates (a few openssl runs)
    for _ in $(seq 1 300); do up && break; sleep 0.1; done
    if up; then log "fake time-stamping authority on 127.0.0.1:$TSA_PORT (certificates in $DATA/tsa)"; else log "fake time-stamping authority did not start: see $DATA/logs/fake-tsa.log"; exit 1; fi
    ;;
  stop)
    # found through this clone's own tsx loader path, so another checkout's authority is never touched
    pid=$(pgrep -f "$ROOT/node_modules/tsx/dist/loader.mjs docker-less-dev/fake-tsa.ts" | head -n 1 || true)
    if [ -n "$pid" ]; then
      pgid=$(ps -o pgid= -p "$pid" | tr -d ' ')
      kill -TERM -- "-$pgid" 2>/dev/null && log "fake time-stamping authority stopped" || true
    fi
    ;;
  status)
    if up; then echo "tsa       up    127.0.0.1:$TSA_PORT  certificates $DATA/tsa"; else echo "tsa       down"; fi
    ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 2 ;;
esac
