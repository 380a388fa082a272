#!/usr/bin/env bash
# Start or stop a Redis server on 127.0.0.1 for Kerfwright, with its files in $KW_REDIS_DIR.
# Usage: scripts/redis.sh start|stop
# Env: KW_REDIS_DIR (required), KW_REDIS_PORT, KW_REDIS_PERSIST=1 (append-only file on; the product) or 0 (tests).
set -euo pipefail

: "${KW_REDIS_DIR:?KW_REDIS_DIR must name the Redis folder}"
PORT="${KW_REDIS_PORT:-63790}"
PIDFILE="$KW_REDIS_DIR/redis.pid"

cli() { redis-cli -h 127.0.0.1 -p "$PORT" "$@"; }

start() {
  mkdir -p "$KW_REDIS_DIR"
  if cli ping >/dev/null 2>&1; then
    echo "Redis already running on 127.0.0.1:$PORT"
    return
  fi
  local persist=(--save '' --appendonly no)
  [ "${KW_REDIS_PERSIST:-1}" = 1 ] && persist=(--appendonly yes --appendfsync everysec)
  redis-server --bind 127.0.0.1 --port "$PORT" --daemonize yes --pidfile "$PIDFILE" \
    --logfile "$KW_REDIS_DIR/redis.log" --dir "$KW_REDIS_DIR" "${persist[@]}"
  for _ in $(seq 1 100); do
    cli ping >/dev/null 2>&1 && { echo "Redis started on 127.0.0.1:$PORT"; return; }
    sleep 0.1
  done
  echo "Redis did not answer on port $PORT; see $KW_REDIS_DIR/redis.log" >&2
  exit 1
}

stop() {
  if cli ping >/dev/null 2>&1; then
    if [ "${KW_REDIS_PERSIST:-1}" = 1 ]; then cli shutdown >/dev/null 2>&1 || true; else cli shutdown nosave >/dev/null 2>&1 || true; fi
    echo "Redis stopped"
  elif [ -f "$PIDFILE" ]; then
    kill "$(cat "$PIDFILE")" 2>/dev/null || true
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  *) echo "usage: $0 start|stop" >&2; exit 2 ;;
esac
