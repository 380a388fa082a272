# Shared helpers for scripts/start.sh and scripts/test.sh (sourced, not run).
# shellcheck shell=bash

KW_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export KW_ROOT

log() { printf '\033[1m[kerfwright]\033[0m %s\n' "$*"; }

# Default folder for service data: outside the checkout, reachable by the postgres user when root.
default_state_dir() {
  if [ "$(id -u)" = 0 ]; then echo "/var/lib/kerfwright"; else echo "${XDG_DATA_HOME:-$HOME/.local/share}/kerfwright"; fi
}

# Install Debian packages that are missing (needs root or sudo).
ensure_debian_packages() {
  local missing=()
  for pkg in "$@"; do
    dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q "install ok installed" || missing+=("$pkg")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  log "installing Debian packages: ${missing[*]}"
  local sudo=""
  [ "$(id -u)" = 0 ] || sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

# npm ci when node_modules is absent or older than package-lock.json.
ensure_node_modules() {
  local stamp="$KW_ROOT/node_modules/.kw-lock-sha"
  local want
  want=$(sha256sum "$KW_ROOT/package-lock.json" | cut -d' ' -f1)
  if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
    log "installing npm packages (npm ci)"
    (cd "$KW_ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    echo "$want" > "$stamp"
  fi
}

build_all() {
  log "building"
  (cd "$KW_ROOT" && npm run -s build)
}

# Wait until an HTTP URL answers 200, or fail after $2 seconds.
wait_for_http() {
  local url="$1" seconds="${2:-60}"
  for _ in $(seq 1 $((seconds * 5))); do
    curl -fsS -o /dev/null "$url" 2>/dev/null && return 0
    sleep 0.2
  done
  return 1
}
