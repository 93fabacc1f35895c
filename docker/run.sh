#!/usr/bin/env bash
# docker/run.sh start|test|bench — the set-up behind `npm start`, `npm test` and `npm run bench`.
#
#   start  npm deps (when missing or stale), MariaDB + Redis on loopback (installed from Debian
#          when missing), migrations, demo seed, production build, then the web server on
#          127.0.0.1 and one worker (and the local fake SMTP server) until Ctrl-C.
#   test   the same set-up against the test database, Chromium from Debian when missing,
#          then the type check and every suite (unit, component, integration, e2e).
#   bench  the same set-up, then the benchmarks under tests/bench (they print figures).
set -euo pipefail
ROOT=$(cd "$(dirname "$0")/.." && pwd)
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"

log() { printf '\033[1;36mloftwise\033[0m %s\n' "$*"; }
die() { printf '\033[1;31mloftwise\033[0m %s\n' "$*" >&2; exit 1; }

ensure_deps() {
  local stamp=node_modules/.package-lock.json
  if [ -f "$stamp" ] && [ ! package-lock.json -nt "$stamp" ] && [ ! package.json -nt "$stamp" ]; then
    return 0
  fi
  log "installing npm dependencies (npm ci)…"
  # npm ci has been seen to hang; SIGINT stops it where SIGTERM does not. One retry.
  timeout -s INT 300 npm ci --no-audit --no-fund --prefer-offline \
    || timeout -s INT 600 npm ci --no-audit --no-fund \
    || die "npm ci failed"
}

ensure_chromium() {
  [ -x /usr/bin/chromium ] && return 0
  [ "$(id -u)" = 0 ] || die "browser tests need Debian's chromium: sudo apt-get install -y chromium"
  log "installing Debian's chromium for the browser tests…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -q >/dev/null 2>&1 || true
  apt-get install -y -q chromium >/dev/null || die "apt-get install chromium failed"
}

services() { bash docker/services.sh start; }

db() { tsx src/lib/server/db/cli.ts "$@"; }

build() {
  log "building the web app…"
  svelte-kit sync >/dev/null
  vite build --logLevel warn
}

cmd_start() {
  ensure_deps
  services
  export LOFTWISE_ENV=${LOFTWISE_ENV:-development}
  db migrate
  db seed
  build
  local host=${HOST:-127.0.0.1} port=${PORT:-3000}
  export HOST=$host PORT=$port ORIGIN=${ORIGIN:-http://$host:$port}
  local pids=()
  node build/index.js & pids+=($!)
  tsx jobs/worker.ts & pids+=($!)
  tsx jobs/mailbox.ts & pids+=($!)
  stop() {
    trap - INT TERM
    log "stopping…"
    kill -TERM "${pids[@]}" 2>/dev/null || true
    wait "${pids[@]}" 2>/dev/null || true
    log "stopped (MariaDB and Redis keep running: npm run services -- stop)"
    exit 0
  }
  trap stop INT TERM
  node -e 'const u=process.argv[1];let n=0;const t=()=>fetch(u).then(()=>process.exit(0),()=>++n<150?setTimeout(t,200):process.exit(1));t()' "$ORIGIN/api/health" || true
  cat <<INFO

  Loftwise is running at $ORIGIN

  Demo sign-ins (password for all: loftwise-demo)
    admin     admin@tarnwick.example
    engineer  engineer@tarnwick.example
    viewer    viewer@tarnwick.example

  Ctrl-C stops the web server and the worker.

INFO
  wait -n "${pids[@]}" || true
  stop
}

cmd_test() {
  ensure_deps
  services
  ensure_chromium
  export LOFTWISE_ENV=test
  build
  log "type check…"
  svelte-check --tsconfig ./tsconfig.json --threshold error
  log "running every suite…"
  vitest run "$@"
}

cmd_bench() {
  ensure_deps
  services
  export LOFTWISE_ENV=test
  db migrate >/dev/null
  local f rc=0
  for f in tests/bench/*.bench.ts; do
    log "bench $f"
    tsx "$f" || rc=1
  done
  return $rc
}

case "${1:-}" in
  start) shift; cmd_start "$@" ;;
  test) shift; cmd_test "$@" ;;
  bench) shift; cmd_bench "$@" ;;
  *) echo "usage: docker/run.sh start|test|bench" >&2; exit 2 ;;
esac
