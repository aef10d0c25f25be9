#!/usr/bin/env bash
# Smoke test of `npm start` on spare ports: the sign-in page is served, the demo admin signs in
# through the API, and after SIGINT (what Ctrl-C sends to the terminal's process group) every
# process it started, PostgreSQL and Redis included, has stopped.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
export PORT=3210 PGPORT=54359 REDIS_PORT=6396 SMTP_PORT=2556 HL_STATE=.run/smoke
URL="http://127.0.0.1:$PORT"
mkdir -p .run
LOG=.run/smoke.log

fail() { echo "[smoke] FAIL: $*" >&2; tail -n 60 "$LOG" >&2 || true; exit 1; }
final_cleanup() {
  PG_STATE="$HL_STATE" bash db/pg.sh destroy >/dev/null 2>&1 || true
  REDIS_DIR="$HL_STATE/redis" bash jobs/redis.sh stop >/dev/null 2>&1 || true
  [ -n "${group:-}" ] && kill -KILL -- "-$group" 2>/dev/null || true
  rm -rf .run/smoke
}
trap final_cleanup EXIT

t0=$(date +%s)
setsid bash -c 'exec npm start' > "$LOG" 2>&1 &
group=$!

for _ in $(seq 1 600); do
  curl -fsS -o /dev/null "$URL/sign-in" 2>/dev/null && break
  kill -0 "$group" 2>/dev/null || fail "npm start exited early"
  sleep 0.5
done
curl -fsS "$URL/sign-in" | grep -q "Sign in" || fail "sign-in page not served"
echo "[smoke] sign-in page served $(( $(date +%s) - t0 )) s after npm start"

jar=$(mktemp)
code=$(curl -sS -o /dev/null -w '%{http_code}' -c "$jar" -H 'content-type: application/json' \
  -d '{"email":"admin@hankandlot.test","password":"cure-and-casing-26"}' "$URL/api/auth/sign-in")
[ "$code" = 200 ] || fail "API sign-in answered $code"
curl -fsS -b "$jar" "$URL/api/me" | grep -q '"role":"admin"' || fail "/api/me did not return the admin"
echo "[smoke] demo admin signed in through the API"

# every process npm start owns: its process group, plus PostgreSQL and Redis (they daemonize)
pids=$(pgrep -g "$group" || true)
redis_pid=$(redis-cli -p "$REDIS_PORT" info server | tr -d '\r' | sed -n 's/^process_id://p')
pg_dir=$(PG_STATE="$HL_STATE" bash db/pg.sh psql -d postgres -tAc "show data_directory")
pg_pid=$(head -n 1 "$pg_dir/postmaster.pid")
[ -n "$redis_pid" ] && [ -n "$pg_pid" ] || fail "could not find the Redis or PostgreSQL process"
all="$pids $redis_pid $pg_pid"
echo "[smoke] processes started: $(echo $all | wc -w) (PostgreSQL $pg_pid, Redis $redis_pid)"

kill -INT -- "-$group"
for _ in $(seq 1 60); do
  alive=""
  for p in $all; do kill -0 "$p" 2>/dev/null && alive="$alive $p"; done
  [ -z "$alive" ] && break
  sleep 0.5
done
[ -z "$alive" ] || { ps -o pid,cmd -p ${alive// /,} >&2 || true; fail "still running after SIGINT:$alive"; }
echo "[smoke] after SIGINT every process stopped; total $(( $(date +%s) - t0 )) s"
rm -f "$jar"
