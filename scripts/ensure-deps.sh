#!/usr/bin/env bash
# Installs what is missing: npm packages from the lock file, (with --browser) Debian's chromium, and
# (with --redis) Debian's redis-server, which the multi-process job tests start on their own.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "== installing npm packages (npm ci)"
  npm ci --no-audit --no-fund
fi

if [[ " $* " == *" --browser "* ]] && [ ! -x /usr/bin/chromium ]; then
  echo "== installing Debian's chromium for the end-to-end tests"
  if [ "$(id -u)" = "0" ]; then
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium
  else
    sudo apt-get update -qq && sudo DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium
  fi
fi

if [[ " $* " == *" --redis "* ]] && [ ! -x /usr/bin/redis-server ]; then
  echo "== installing Debian's redis-server for the multi-process job tests"
  if [ "$(id -u)" = "0" ]; then SUDO=""; else SUDO="sudo"; fi
  $SUDO apt-get update -qq && $SUDO env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq redis-server
fi
