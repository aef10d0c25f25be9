#!/usr/bin/env bash
# `npm start`: the whole product on loopback. Installs what is missing, starts the project's own
# PostgreSQL and Redis, migrates, loads the demo company into an empty database only, builds, then
# runs the web app, the job worker and the mail catcher together. Ctrl-C stops everything it started.
# env: PORT (3000) PGPORT (54329) REDIS_PORT (6390) SMTP_PORT (2526) HL_STATE (.data: state folder)
#      SKIP_BUILD=1 reuses an existing .next build
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
bash db/system.sh

export PORT="${PORT:-3000}" PGPORT="${PGPORT:-54329}" REDIS_PORT="${REDIS_PORT:-6390}" SMTP_PORT="${SMTP_PORT:-2526}"
export HL_STATE="${HL_STATE:-.data}"
export PG_STATE="$HL_STATE" REDIS_DIR="$HL_STATE/redis" MAIL_DIR="$ROOT/$HL_STATE/mail"
case "$HL_STATE" in /*) export MAIL_DIR="$HL_STATE/mail" ;; esac
export SMTP_HOST=127.0.0.1 APP_URL="${APP_URL:-http://127.0.0.1:$PORT}" NEXT_TELEMETRY_DISABLED=1 NODE_ENV=production

stop_services() {
  trap - EXIT INT TERM
  echo "[hank&lot] stopping Redis and PostgreSQL"
  bash jobs/redis.sh stop || true
  bash db/pg.sh stop >/dev/null 2>&1 || true
}
trap stop_services EXIT
trap 'exit 130' INT TERM

echo "[hank&lot] starting PostgreSQL on 127.0.0.1:$PGPORT"
export DATABASE_URL="$(bash db/pg.sh start | tail -n 1)"
echo "[hank&lot] starting Redis on 127.0.0.1:$REDIS_PORT"
export REDIS_URL="$(bash jobs/redis.sh start | tail -n 1)"

node --import tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:latest
node --conditions=react-server --import tsx db/seeds/load-demo.ts

if [ "${SKIP_BUILD:-0}" != 1 ] || [ ! -f .next/BUILD_ID ]; then
  echo "[hank&lot] building the web app"
  node node_modules/next/dist/bin/next build
fi

cat <<BANNER

  Hank & Lot is starting on  $APP_URL
$(node --import tsx db/seeds/load-demo.ts --print-sign-ins)
  Captured mail: sign in as an admin, Settings -> Captured mail.  Ctrl-C stops everything.

BANNER

# Foreground, so Ctrl-C reaches concurrently and its children; the EXIT trap then stops the services.
node node_modules/concurrently/dist/bin/concurrently.js --kill-others --names web,worker,mail \
  --prefix-colors auto \
  "node node_modules/next/dist/bin/next start -H 127.0.0.1 -p $PORT" \
  "node --import tsx jobs/worker.ts" \
  "node --import tsx fakes/smtp-catcher.ts"
