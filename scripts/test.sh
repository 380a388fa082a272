#!/usr/bin/env bash
# npm test: install what is missing, build, start a private PostgreSQL and Redis (own ports and data, never the
# ones `npm start` uses), then run lint, type checks, unit tests, API end-to-end tests, web component tests and
# browser tests in Debian's Chromium. Ends with the plain line `N passed, N failed`.
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$KW_ROOT"

export KW_MODE=test
export KW_PORT="${KW_TEST_PORT:-3101}"
export KW_DB_PORT="${KW_TEST_DB_PORT:-54339}"
export KW_REDIS_PORT="${KW_TEST_REDIS_PORT:-63791}"
export KW_DB_NAME=kerfwright_test
export KW_STATE_DIR="${KW_TEST_STATE_DIR:-${TMPDIR:-/tmp}/kerfwright-test-$(id -u)}"
export KW_PG_DATA="$KW_STATE_DIR/postgres"
export KW_REDIS_DIR="$KW_STATE_DIR/redis"
export KW_REDIS_PERSIST=0
export KW_PG_FAST=1
export KW_LOGIN_LIMIT=10
# A suite's hobbyists request many jobs; apps/api/test/request-limit.e2e-spec.ts sets its own limit.
export KW_OPEN_REQUEST_LIMIT=1000
export KW_SMTP_PORT="${KW_TEST_SMTP_PORT:-2535}"
export KW_MAIL_POLL_MS=500
export KW_STORAGE=s3
export KW_S3_PORT="${KW_TEST_S3_PORT:-4579}"
export KW_S3_DIR="$KW_STATE_DIR/s3"
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"

set -e
ensure_debian_packages postgresql redis-server chromium curl
ensure_node_modules
build_all
set +e

RESULTS="$KW_STATE_DIR/results"
API_PID=""
MAIL_PID=""
S3_PID=""
cleanup() {
  trap - INT TERM EXIT
  if [ -n "$API_PID" ] && kill -0 "$API_PID" 2>/dev/null; then kill -TERM "$API_PID"; wait "$API_PID" 2>/dev/null; fi
  if [ -n "$MAIL_PID" ] && kill -0 "$MAIL_PID" 2>/dev/null; then kill -TERM "$MAIL_PID"; wait "$MAIL_PID" 2>/dev/null; fi
  if [ -n "$S3_PID" ] && kill -0 "$S3_PID" 2>/dev/null; then kill -TERM "$S3_PID"; wait "$S3_PID" 2>/dev/null; fi
  scripts/redis.sh stop >/dev/null 2>&1
  db/scripts/pg.sh stop >/dev/null 2>&1
}
trap cleanup INT TERM EXIT

# A fresh private database and Redis for every run.
scripts/redis.sh stop >/dev/null 2>&1
db/scripts/pg.sh stop >/dev/null 2>&1
rm -rf "$KW_STATE_DIR"
mkdir -p "$KW_STATE_DIR" "$RESULTS"
db/scripts/pg.sh start || { echo "PostgreSQL did not start"; echo "0 passed, 1 failed"; exit 1; }
scripts/redis.sh start || { echo "Redis did not start"; echo "0 passed, 1 failed"; exit 1; }
node db/dist/src/cli.js migrate && node db/dist/src/cli.js seed || { echo "0 passed, 1 failed"; exit 1; }

check() { # name, command...: a pass/fail check
  local name="$1"; shift
  log "$name"
  if "$@"; then echo pass > "$RESULTS/$name.check"; else echo fail > "$RESULTS/$name.check"; fi
}
jest_suite() { # name, jest args...
  local name="$1"; shift
  log "$name"
  echo '{"success":false,"numPassedTests":0,"numFailedTests":1}' > "$RESULTS/$name.json" # replaced on completion
  npx jest --ci --silent --json --outputFile="$RESULTS/$name.json" "$@" 2>&1 | grep -vE '^\s*$' | tail -n 25
}

check lint-eslint npx eslint . --max-warnings=0
check lint-prettier npx prettier --check . --log-level warn
for ws in contracts geometry db api web; do
  check "typecheck-$ws" npm run -s typecheck -w "@kerfwright/$ws"
done
jest_suite unit-contracts -c libs/contracts/jest.config.js
jest_suite unit-geometry -c libs/geometry/jest.config.js
jest_suite unit-db -c db/jest.config.js --passWithNoTests
jest_suite unit-api -c apps/api/jest.config.js
# The suites share one database but give their queues prefixes of their own, so no worker may take over
# another suite's owed exports (the outages suite turns the reconciler back on for its private services).
KW_EXPORT_RECONCILE_MS=0 jest_suite e2e-api -c apps/api/test/jest-e2e.config.js
log "web component tests"
echo '{"success":false,"numPassedTests":0,"numFailedTests":1}' > "$RESULTS/web-components.json"
(cd apps/web && npx vitest run --reporter=default --reporter=json --outputFile.json="$RESULTS/web-components.json" 2>&1 | tail -n 15)

# Browser tests against the running product (with the mail catch-all, as `npm start` runs it), on a freshly
# seeded database as `npm start` gives a new workshop: nothing the API suites left behind is in their way.
log "fresh database for the browser tests"
db/scripts/pg.sh stop >/dev/null 2>&1
rm -rf "$KW_PG_DATA"
redis-cli -h 127.0.0.1 -p "$KW_REDIS_PORT" flushall >/dev/null 2>&1
if ! { db/scripts/pg.sh start >/dev/null && node db/dist/src/cli.js migrate >/dev/null && node db/dist/src/cli.js seed; }; then
  echo fail > "$RESULTS/browser-database.check"
fi
KW_MAIL_VIEW_PORT=0 node apps/api/dist/dev-mail/main.js > "$KW_STATE_DIR/mail.log" 2>&1 &
MAIL_PID=$!
node apps/api/dist/dev-s3/main.js > "$KW_STATE_DIR/s3.log" 2>&1 &
S3_PID=$!
# The browser suites sign the demo people in again and again from one address; on a fast machine that passed
# the sign-in limit (10 a minute) and a later suite was refused. The API suites test that limit itself.
KW_LOGIN_LIMIT=1000 node apps/api/dist/main.js > "$KW_STATE_DIR/api.log" 2>&1 &
API_PID=$!
if wait_for_http "http://127.0.0.1:$KW_PORT/api/health" 90; then
  KW_BASE_URL="http://127.0.0.1:$KW_PORT" jest_suite browser -c apps/web/e2e/jest.config.cjs
else
  log "API did not start for browser tests; log follows"; tail -n 40 "$KW_STATE_DIR/api.log"
  echo fail > "$RESULTS/browser-api-start.check"
fi

node scripts/tally.mjs "$RESULTS"
