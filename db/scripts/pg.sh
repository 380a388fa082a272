#!/usr/bin/env bash
# Start, stop or report a PostgreSQL server on 127.0.0.1 for Kerfwright, with its data in $KW_PG_DATA.
# Usage: db/scripts/pg.sh start|stop|status
# Env: KW_PG_DATA (data folder, required), KW_DB_PORT, KW_DB_NAME, KW_DB_USER, KW_DB_PASSWORD,
#      KW_PG_FAST=1 (tests only: fsync and synchronous_commit off).
# As root, PostgreSQL runs as the `postgres` user, so $KW_PG_DATA must be a folder that user can reach.
set -euo pipefail

: "${KW_PG_DATA:?KW_PG_DATA must name the PostgreSQL data folder}"
PORT="${KW_DB_PORT:-54329}"
DB="${KW_DB_NAME:-kerfwright}"
DB_USER="${KW_DB_USER:-kerfwright}"
DB_PASSWORD="${KW_DB_PASSWORD:-kerfwright-local}"
SOCK="$KW_PG_DATA/socket"
LOG="$KW_PG_DATA/server.log"
CLUSTER="$KW_PG_DATA/cluster"

bindir() {
  local d
  d=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)
  [ -n "$d" ] || { echo "PostgreSQL server binaries not found under /usr/lib/postgresql" >&2; exit 1; }
  echo "$d"
}
BIN=$(bindir)

as_pg() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

psql_admin() {
  as_pg "$BIN/psql" -X -q -v ON_ERROR_STOP=1 -h "$SOCK" -p "$PORT" -U postgres -d postgres "$@"
}

is_running() {
  [ -f "$CLUSTER/postmaster.pid" ] && as_pg "$BIN/pg_ctl" -D "$CLUSTER" status >/dev/null 2>&1
}

start() {
  mkdir -p "$KW_PG_DATA"
  if [ "$(id -u)" = 0 ]; then
    id postgres >/dev/null 2>&1 || { echo "the postgres system user is missing (is the postgresql package installed?)" >&2; exit 1; }
    chown postgres: "$KW_PG_DATA"
    if ! runuser -u postgres -- test -w "$KW_PG_DATA"; then
      echo "PostgreSQL (user postgres) cannot write $KW_PG_DATA: choose a folder outside /root with KW_STATE_DIR" >&2
      exit 1
    fi
  fi
  as_pg mkdir -p "$SOCK"
  if [ ! -f "$CLUSTER/PG_VERSION" ]; then
    as_pg "$BIN/initdb" -D "$CLUSTER" -U postgres -E UTF8 --locale=C --auth-local=trust --auth-host=scram-sha-256 >/dev/null
  fi
  if is_running; then
    echo "PostgreSQL already running on 127.0.0.1:$PORT"
  else
    local extra=""
    [ "${KW_PG_FAST:-0}" = 1 ] && extra="-c fsync=off -c synchronous_commit=off -c full_page_writes=off"
    as_pg "$BIN/pg_ctl" -D "$CLUSTER" -l "$LOG" -w -t 60 \
      -o "-p $PORT -k $SOCK -c listen_addresses=127.0.0.1 $extra" start >/dev/null
    echo "PostgreSQL started on 127.0.0.1:$PORT"
  fi
  # The application role and database (idempotent).
  local role_exists db_exists
  role_exists=$(psql_admin -tAc "SELECT 1 FROM pg_roles WHERE rolname = '$DB_USER'")
  if [ "$role_exists" != 1 ]; then
    psql_admin -c "CREATE ROLE \"$DB_USER\" LOGIN PASSWORD '$DB_PASSWORD'"
  fi
  db_exists=$(psql_admin -tAc "SELECT 1 FROM pg_database WHERE datname = '$DB'")
  if [ "$db_exists" != 1 ]; then
    psql_admin -c "CREATE DATABASE \"$DB\" OWNER \"$DB_USER\""
  fi
}

stop() {
  if is_running; then
    as_pg "$BIN/pg_ctl" -D "$CLUSTER" -m fast -w stop >/dev/null
    echo "PostgreSQL stopped"
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if is_running; then echo running; else echo stopped; exit 3; fi ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 2 ;;
esac
