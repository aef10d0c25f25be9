#!/usr/bin/env bash
# `npm test`: every suite against throw-away services of its own, on test ports that never collide
# with `npm start` (3000/54329/6390/2526).
#   usage: db/test.sh [unit] [integration] [e2e] [bench]   (default: all; extra vitest/playwright
#          filters go after --, e.g. `npm test -- integration -- invitations`)
# env: TEST_STATE (.pgtest) TEST_PORT (3100) TEST_PGPORT (54339) TEST_REDIS_PORT (6392) TEST_SMTP_PORT (2536)
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

suites=(); filters=()
while [ $# -gt 0 ]; do
  if [ "$1" = "--" ]; then shift; filters=("$@"); break; fi
  suites+=("$1"); shift
done
[ ${#suites[@]} -gt 0 ] || suites=(unit integration e2e bench)
has() { local s; for s in "${suites[@]}"; do [ "$s" = "$1" ] && return 0; done; return 1; }

if has e2e; then bash db/system.sh --with-browser; else bash db/system.sh; fi

export PORT="${TEST_PORT:-3100}" PGPORT="${TEST_PGPORT:-54339}" REDIS_PORT="${TEST_REDIS_PORT:-6392}" SMTP_PORT="${TEST_SMTP_PORT:-2536}"
T="${TEST_STATE:-.pgtest}"   # state folder of this run (parallel runs need their own)
export PG_STATE="$T" PG_FAST=1 DB_NAME=hl_test REDIS_DIR="$T/redis" MAIL_DIR="$ROOT/$T/mail"
export HL_STATE="$T"   # the state folder for lib/env (uploads land in $T/uploads and go with it)
export SMTP_HOST=127.0.0.1 APP_URL="http://127.0.0.1:$PORT" NEXT_TELEMETRY_DISABLED=1 OUTBOX_SWEEP_MS=1000
export WORKER_LOCK_MS=4000 WORKER_STALLED_MS=1500   # a killed worker's jobs come back within seconds

pids=()
cleanup() {
  trap - EXIT INT TERM
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
  bash jobs/redis.sh stop || true
  bash db/pg.sh destroy >/dev/null 2>&1 || true
  rm -rf "$T"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

t0=$(date +%s)
bash db/pg.sh destroy >/dev/null 2>&1 || true
rm -rf "$T" && mkdir -p "$T"
export DATABASE_URL="$(bash db/pg.sh start | tail -n 1)"
export REDIS_URL="$(bash jobs/redis.sh start | tail -n 1)"
node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest >/dev/null
node --import tsx fakes/smtp-catcher.ts > "$T/mail-catcher.log" 2>&1 & pids+=($!)
node --import tsx jobs/worker.ts > "$T/worker.log" 2>&1 & pids+=($!)
echo "[test] services up in $(( $(date +%s) - t0 )) s: PostgreSQL :$PGPORT, Redis :$REDIS_PORT, SMTP :$SMTP_PORT"

vitest_dirs=()
has unit && vitest_dirs+=(tests/unit)
has integration && vitest_dirs+=(tests/integration)
if [ ${#vitest_dirs[@]} -gt 0 ]; then
  # with filters, only the files they name run (a folder would match every file in it)
  if [ ${#filters[@]} -gt 0 ]; then node node_modules/vitest/vitest.mjs run "${filters[@]}"
  else node node_modules/vitest/vitest.mjs run "${vitest_dirs[@]}"; fi
fi

if has bench; then
  for b in tests/bench/*.ts; do
    [ -e "$b" ] || continue
    echo "[test] benchmark at tiny size: $b"
    BENCH_SIZE=tiny node --conditions=react-server --import tsx "$b"
  done
fi

if has e2e; then
  t1=$(date +%s)
  node node_modules/next/dist/bin/next build > "$T/next-build.log" 2>&1 || { cat "$T/next-build.log"; exit 1; }
  echo "[test] next build in $(( $(date +%s) - t1 )) s"
  node node_modules/@playwright/test/cli.js test --config tests/e2e/playwright.config.ts "${filters[@]}"
fi
echo "[test] all suites passed in $(( $(date +%s) - t0 )) s"
