#!/usr/bin/env bash
# Reports whether each local service answers.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
if pg_isready -h 127.0.0.1 -p "$PG_PORT" >/dev/null 2>&1; then
  # the server on our port may belong to another checkout: say whose data it runs on
  if as_pg "$(pg_bin)/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then echo "postgres  up    127.0.0.1:$PG_PORT  data $PG_DATA"
  else echo "postgres  up    127.0.0.1:$PG_PORT  but not on this checkout's data ($PG_DATA): another checkout's server?"; fi
else echo "postgres  down"; fi
if redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1; then echo "redis     up    127.0.0.1:$REDIS_PORT  data $REDIS_DIR"; else echo "redis     down"; fi
if port_open "$SMTP_PORT"; then echo "mail      up    127.0.0.1:$SMTP_PORT  messages $DATA/mail"; else echo "mail      down"; fi
if port_open "$TSA_PORT"; then echo "tsa       up    127.0.0.1:$TSA_PORT  certificates $DATA/tsa"; else echo "tsa       down"; fi
if port_open "$S3_PORT"; then echo "s3        up    127.0.0.1:$S3_PORT  objects $DATA/s3"; else echo "s3        down (started only for STORAGE_BACKEND=s3)"; fi
