#!/usr/bin/env bash
# npm start: install what is missing, build, start PostgreSQL and Redis on loopback, migrate, seed the demo
# workshop and run the API (which serves the web app). Ctrl-C stops everything this script started.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$KW_ROOT"

export KW_MODE="${KW_MODE:-development}"
export KW_PORT="${KW_PORT:-3000}"
export KW_DB_PORT="${KW_DB_PORT:-54329}"
export KW_REDIS_PORT="${KW_REDIS_PORT:-63790}"
export KW_STATE_DIR="${KW_STATE_DIR:-$(default_state_dir)}"
export KW_PG_DATA="${KW_PG_DATA:-$KW_STATE_DIR/postgres}"
export KW_REDIS_DIR="${KW_REDIS_DIR:-$KW_STATE_DIR/redis}"
export KW_REDIS_PERSIST=1
export KW_SMTP_PORT="${KW_SMTP_PORT:-2525}"
export KW_MAIL_VIEW_PORT="${KW_MAIL_VIEW_PORT:-2580}"
export KW_STORAGE="${KW_STORAGE:-s3}"
export KW_S3_PORT="${KW_S3_PORT:-4569}"
export KW_S3_DIR="${KW_S3_DIR:-$KW_STATE_DIR/s3}"

ensure_debian_packages postgresql redis-server curl
ensure_node_modules
build_all

API_PID=""
MAIL_PID=""
S3_PID=""
STARTED_PG=0
STARTED_REDIS=0

stop_pid() { # pid: TERM one process this script started, and wait for it
  if [ -n "$1" ] && kill -0 "$1" 2>/dev/null; then
    kill -TERM "$1" 2>/dev/null || true
    wait "$1" 2>/dev/null || true
  fi
}

cleanup() {
  trap - INT TERM EXIT
  log "stopping"
  stop_pid "$API_PID"
  stop_pid "$MAIL_PID"
  stop_pid "$S3_PID"
  if [ "$STARTED_REDIS" = 1 ]; then scripts/redis.sh stop || true; fi
  if [ "$STARTED_PG" = 1 ]; then db/scripts/pg.sh stop || true; fi
  log "stopped"
}
trap cleanup INT TERM EXIT

mkdir -p "$KW_STATE_DIR"
db/scripts/pg.sh start && STARTED_PG=1
scripts/redis.sh start && STARTED_REDIS=1
node db/dist/src/cli.js migrate
node db/dist/src/cli.js seed

# The development SMTP catch-all standing in for the mail service.
node apps/api/dist/dev-mail/main.js &
MAIL_PID=$!

# The S3-compatible fake standing in for object storage (cut-pack files), unless files go to a folder.
if [ "$KW_STORAGE" = s3 ] && [ -z "${KW_S3_ENDPOINT:-}" ]; then
  node apps/api/dist/dev-s3/main.js &
  S3_PID=$!
fi

node apps/api/dist/main.js &
API_PID=$!
if ! wait_for_http "http://127.0.0.1:$KW_PORT/api/health" 90; then
  log "the API did not become healthy on port $KW_PORT"
  exit 1
fi

cat <<MSG

  Kerfwright is running:  http://127.0.0.1:$KW_PORT
  API health:             http://127.0.0.1:$KW_PORT/api/health
  API documentation:      http://127.0.0.1:$KW_PORT/api/docs
  Captured e-mail:        http://127.0.0.1:$KW_MAIL_VIEW_PORT/
  Data folder:            $KW_STATE_DIR

  Demo sign-ins (never valid in production mode):
MSG
node db/dist/src/cli.js demo-users
cat <<MSG

  Press Ctrl-C to stop everything this command started.

MSG
wait "$API_PID"
