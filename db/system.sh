#!/usr/bin/env bash
# Makes sure this machine has what Hank & Lot runs on, then installs node_modules.
# Plain bash on purpose: it runs before anything from npm is installed.
#   usage: db/system.sh [--with-browser]
# As root it installs missing Debian packages with apt-get (apt-get update only when something is
# missing); otherwise it says exactly what to install and stops.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

need=()
[ -x /usr/lib/postgresql/15/bin/postgres ] || need+=(postgresql-15)
command -v redis-server >/dev/null 2>&1 || need+=(redis-server)
if [ "${1:-}" = "--with-browser" ]; then
  [ -x /usr/bin/chromium ] || need+=(chromium)
fi

if [ ${#need[@]} -gt 0 ]; then
  if [ "$(id -u)" = 0 ]; then
    echo "[hank&lot] installing Debian packages: ${need[*]}"
    apt-get update -qq
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
  else
    echo "[hank&lot] missing Debian packages: ${need[*]}" >&2
    echo "[hank&lot] install them with:  sudo apt-get update && sudo apt-get install -y --no-install-recommends ${need[*]}" >&2
    exit 1
  fi
fi

if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[hank&lot] installing node modules (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi
