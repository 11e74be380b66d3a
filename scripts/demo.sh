#!/usr/bin/env bash
# `npm run demo`: installs what is missing, migrates and seeds the embedded database, builds when the
# sources are newer than the last build, and starts the app with the local mail catcher.
set -euo pipefail
cd "$(dirname "$0")/.."

PORT="${PORT:-3000}"
export APP_URL="${APP_URL:-http://localhost:$PORT}"
export MAIL_CATCHER="${MAIL_CATCHER:-on}"
# The demo admin may read the catcher's page; nobody else (see env.ts, MAIL_OPERATORS).
export MAIL_OPERATORS="${MAIL_OPERATORS:-ines@kestrel-lab.example}"
export NEXT_TELEMETRY_DISABLED=1

bash scripts/ensure-deps.sh

echo "== migrating ${DATABASE_URL:-file:data/squarely.db}"
npm run --silent db:migrate
echo "== seeding the demo scenario"
npm run --silent db:seed

SOURCES=(app components lib server db drizzle cli auth.ts auth.config.ts proxy.ts instrumentation.ts env.ts
  next.config.ts postcss.config.mjs tsconfig.json package-lock.json)
if [ -f .next/BUILD_ID ] && [ -z "$(find "${SOURCES[@]}" -newer .next/BUILD_ID -type f ! -name '*.test.ts' 2>/dev/null | head -n 1)" ]; then
  echo "== the build is newer than the sources; not rebuilding"
else
  echo "== building (next build)"
  npx next build
fi

echo "== starting on port $PORT"
# Its own process group, so that stopping the demo stops the server and anything it started.
set -m
node node_modules/next/dist/bin/next start -p "$PORT" &
server=$!
set +m
trap 'kill -- -"$server" 2>/dev/null; wait "$server" 2>/dev/null' INT TERM EXIT

for _ in $(seq 1 120); do
  if node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "http://127.0.0.1:$PORT/sign-in"; then break; fi
  if ! kill -0 "$server" 2>/dev/null; then echo "the app did not start (is port $PORT taken? set PORT=…)"; exit 1; fi
  sleep 0.5
done

cat <<BANNER

  Squarely is running: $APP_URL

  Demo sign-ins (Kestrel Lab, an invented research group):
$(node --conditions=react-server --import tsx scripts/demo-people.ts)

  Caught mail (sign-in links, notifications): $APP_URL/dev/mail (operators: $MAIL_OPERATORS)
  Stop with Ctrl-C.

BANNER
wait "$server"
