#!/usr/bin/env bash
# Private PostgreSQL + Redis for running single test suites by hand, beside (not instead of) `npm test`.
# Usage: scripts/test-services.sh up|down|env   (after `npm run build`)
#   KW_SLOT=<n> picks ports and a state folder of its own (default 1), so several people or agents can each
#   keep one running: PostgreSQL 55400+n, Redis 63800+n, folder ${TMPDIR:-/tmp}/kerfwright-slot-<uid>-<n>.
# Then:  eval "$(scripts/test-services.sh env)" && npx jest -c apps/api/test/jest-e2e.config.js test/jobs
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$KW_ROOT"
SLOT="${KW_SLOT:-1}"
case "$SLOT" in '' | *[!0-9]*) echo "KW_SLOT must be a number" >&2; exit 2 ;; esac
export KW_MODE=test KW_DB_NAME=kerfwright_test KW_PG_FAST=1 KW_REDIS_PERSIST=0 KW_LOGIN_LIMIT=10
# A suite's hobbyists request many jobs; apps/api/test/request-limit.e2e-spec.ts sets its own limit.
export KW_OPEN_REQUEST_LIMIT=1000
export KW_DB_PORT=$((55400 + SLOT)) KW_REDIS_PORT=$((63800 + SLOT))
export KW_STATE_DIR="${TMPDIR:-/tmp}/kerfwright-slot-$(id -u)-$SLOT"
export KW_PG_DATA="$KW_STATE_DIR/postgres" KW_REDIS_DIR="$KW_STATE_DIR/redis"
case "${1:-}" in
  up)
    mkdir -p "$KW_STATE_DIR"
    db/scripts/pg.sh start && scripts/redis.sh start
    node db/dist/src/cli.js migrate && node db/dist/src/cli.js seed
    ;;
  down)
    scripts/redis.sh stop || true
    db/scripts/pg.sh stop || true
    ;;
  env)
    for v in KW_MODE KW_DB_NAME KW_DB_PORT KW_REDIS_PORT KW_STATE_DIR KW_LOGIN_LIMIT KW_OPEN_REQUEST_LIMIT; do
      printf 'export %s=%q\n' "$v" "${!v}"
    done
    ;;
  *) echo "usage: scripts/test-services.sh up|down|env" >&2; exit 2 ;;
esac
