#!/usr/bin/env bash
# Starts PostgreSQL, Redis, the fake mail server, the fake time-stamping authority and, for the bucket
# store (STORAGE_BACKEND=s3), the local S3 server, on loopback with data under .data/.
# Idempotent: anything already running is left alone. With DATABASE_URL / REDIS_URL / SMTP_URL /
# TSA_URL / S3_ENDPOINT set in the environment, that service is external and nothing is started for it.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
bash "$ROOT/docker-less-dev/install-packages.sh"
mkdir -p "$DATA/logs"

start_postgres() {
  local bin; bin="$(pg_bin)"
  mkdir -p "$PG_DATA" "$PG_RUN"
  if [ "$(id -u)" = "0" ]; then
    chown postgres:postgres "$PG_DATA" "$PG_RUN"; chmod 700 "$PG_DATA"
    touch "$PG_LOG"; chown postgres:postgres "$PG_LOG"
    # the postgres user must be able to reach the data folder
    local d="$DATA"; while [ "$d" != "/" ]; do chmod o+x "$d" 2>/dev/null || true; d="$(dirname "$d")"; done
  fi
  if [ ! -f "$PG_DATA/PG_VERSION" ]; then
    log "initialising PostgreSQL cluster in $PG_DATA"
    local pw; pw="$(mktemp)"; echo "$PG_SUPERPASS" > "$pw"; chmod 644 "$pw"
    as_pg "$bin/initdb" -D "$PG_DATA" -U "$PG_SUPERUSER" --pwfile="$pw" --auth=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
    rm -f "$pw"
  fi
  if as_pg "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1; then
    log "PostgreSQL already running on 127.0.0.1:$PG_PORT"
  else
    if pg_isready -h 127.0.0.1 -p "$PG_PORT" >/dev/null 2>&1; then
      log "port $PG_PORT already has a PostgreSQL that is not this checkout's ($PG_DATA), perhaps another checkout's:"
      log "stop it (its docker-less-dev/down.sh), or pick other ports with CAIRN_PG_PORT / CAIRN_REDIS_PORT / CAIRN_SMTP_PORT"
      exit 1
    fi
    as_pg "$bin/pg_ctl" -D "$PG_DATA" -l "$PG_LOG" -w -t 60 \
      -o "-c listen_addresses=127.0.0.1 -p $PG_PORT -k $PG_RUN -c fsync=on" start >/dev/null
    note_started postgres
    log "PostgreSQL started on 127.0.0.1:$PG_PORT"
  fi
  # The app connects as a role without superuser, so it cannot disable the custody log's trigger.
  PGPASSWORD="$PG_SUPERPASS" psql -q -h 127.0.0.1 -p "$PG_PORT" -U "$PG_SUPERUSER" -d postgres -v ON_ERROR_STOP=1 <<SQL >/dev/null
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$PG_APPUSER') THEN
    CREATE ROLE $PG_APPUSER LOGIN PASSWORD '$PG_APPPASS' NOSUPERUSER NOCREATEDB NOCREATEROLE;
  END IF;
END \$\$;
SQL
  for db in cairn cairn_test; do
    if ! PGPASSWORD="$PG_SUPERPASS" psql -h 127.0.0.1 -p "$PG_PORT" -U "$PG_SUPERUSER" -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname='$db'" | grep -q 1; then
      PGPASSWORD="$PG_SUPERPASS" createdb -h 127.0.0.1 -p "$PG_PORT" -U "$PG_SUPERUSER" "$db"
      log "created database $db"
    fi
  done
}

start_redis() {
  mkdir -p "$REDIS_DIR"
  if redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1; then
    log "Redis already running on 127.0.0.1:$REDIS_PORT"; return
  fi
  redis-server --bind 127.0.0.1 --port "$REDIS_PORT" --dir "$REDIS_DIR" --appendonly yes \
    --maxmemory-policy noeviction --daemonize yes --pidfile "$REDIS_DIR/redis.pid" \
    --logfile "$DATA/logs/redis.log" --save ""
  for _ in $(seq 1 50); do redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping >/dev/null 2>&1 && break; sleep 0.1; done
  note_started redis
  log "Redis started on 127.0.0.1:$REDIS_PORT"
}

# Starts one of the project's own local servers (a tsx script in docker-less-dev/) unless its port
# answers already:  start_own_server NAME LABEL PORT SCRIPT PIDFILE WHAT [ENV=VALUE ...]
start_own_server() {
  local name="$1" label="$2" port="$3" script="$4" pidfile="$5" what="$6" logfile
  shift 6
  if port_open "$port"; then
    log "$label already running on 127.0.0.1:$port"; return
  fi
  logfile="$DATA/logs/$(basename "$script" .ts).log"
  start_node_service "$script" "$pidfile" "$logfile" "$@"
  # up to 30 s: the time-stamping authority's first start makes its certificates (a few openssl runs)
  for _ in $(seq 1 300); do port_open "$port" && break; sleep 0.1; done
  port_open "$port" || { log "$label did not start: see $logfile"; exit 1; }
  note_started "$name"
  log "$label on 127.0.0.1:$port ($what)"
}

start_smtp() {
  mkdir -p "$DATA/mail"
  start_own_server smtp "fake mail server" "$SMTP_PORT" docker-less-dev/fake-smtp.ts "$SMTP_PIDFILE" "messages in $DATA/mail" \
    CAIRN_SMTP_PORT="$SMTP_PORT" MAIL_DIR="$DATA/mail"
}

# The local RFC 3161 time-stamping authority that custody checkpoints are stamped by
# (docker-less-dev/fake-tsa.ts, answering with `openssl ts -reply`).
start_tsa() {
  start_own_server tsa "fake time-stamping authority" "$TSA_PORT" docker-less-dev/fake-tsa.ts "$TSA_PIDFILE" "certificates in $DATA/tsa" \
    CAIRN_TSA_PORT="$TSA_PORT" CAIRN_TSA_DIR="$DATA/tsa"
}

# The local S3 server (docker-less-dev/fake-s3.ts, s3rver from npm), for the bucket store.
start_s3() {
  start_own_server s3 "local S3 server" "$S3_PORT" docker-less-dev/fake-s3.ts "$S3_PIDFILE" "objects in $DATA/s3" \
    CAIRN_S3_PORT="$S3_PORT" CAIRN_S3_DIR="$DATA/s3"
}

if [ -n "${DATABASE_URL:-}" ]; then log "DATABASE_URL set: using that PostgreSQL"; else start_postgres; fi
if [ -n "${REDIS_URL:-}" ]; then log "REDIS_URL set: using that Redis"; else start_redis; fi
if [ -n "${SMTP_URL:-}" ]; then log "SMTP_URL set: using that mail server"; else start_smtp; fi
if [ -n "${TSA_URL:-}" ]; then log "TSA_URL set: using that time-stamping authority"; else start_tsa; fi
if [ "${STORAGE_BACKEND:-disk}" = "s3" ] || [ "${CAIRN_NEED_S3:-}" = "1" ]; then
  if [ -n "${S3_ENDPOINT:-}" ]; then log "S3_ENDPOINT set: using that object storage"; else start_s3; fi
fi
