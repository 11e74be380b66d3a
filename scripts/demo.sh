#!/usr/bin/env bash
# `npm run demo`: installs what is missing, migrates and seeds the embedded database, builds when the
# sources are newer than the last build, and starts the app with the local mail catcher.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/demo-lib.sh

PORT="${PORT:-3000}"
export APP_URL="${APP_URL:-http://localhost:$PORT}"
export MAIL_CATCHER="${MAIL_CATCHER:-on}"

prepare_demo

echo "== starting on port $PORT"
# Its own process group, so that stopping the demo stops the server and anything it started.
set -m
start_app "$PORT" &
server=$!
set +m
trap 'kill -- -"$server" 2>/dev/null; wait "$server" 2>/dev/null' INT TERM EXIT

wait_for_app "$PORT" "$server"

cat <<BANNER

  Squarely is running: $APP_URL

  Demo sign-ins (Kestrel Lab, an invented research group):
$(demo_sign_ins)

  Caught mail (sign-in links, notifications): $APP_URL/dev/mail (operators: $MAIL_OPERATORS)
  Stop with Ctrl-C.

BANNER
wait "$server"
