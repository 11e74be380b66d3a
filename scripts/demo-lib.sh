# Shared by scripts/demo.sh and scripts/demo-cluster.sh (sourced, not run): the demo's settings and
# its start-up steps.

# The demo admin may read the catcher's page; nobody else (see env.ts, MAIL_OPERATORS).
export MAIL_OPERATORS="${MAIL_OPERATORS:-ines@kestrel-lab.example}"
export NEXT_TELEMETRY_DISABLED=1
# The interface the app listens on: loopback unless asked otherwise (HOST=0.0.0.0 for a LAN demo).
export DEMO_HOST="${HOST:-127.0.0.1}"

# Installs what is missing (extra arguments go to ensure-deps.sh), migrates and seeds the embedded
# database, and builds when the sources are newer than the last build.
prepare_demo() {
  bash scripts/ensure-deps.sh "$@"
  echo "== migrating ${DATABASE_URL:-file:data/squarely.db}"
  npm run --silent db:migrate
  echo "== seeding the demo scenario"
  npm run --silent db:seed
  local sources=(app components lib server db drizzle cli auth.ts auth.config.ts proxy.ts instrumentation.ts env.ts
    next.config.ts postcss.config.mjs tsconfig.json package-lock.json)
  if [ -f .next/BUILD_ID ] && [ -z "$(find "${sources[@]}" -newer .next/BUILD_ID -type f ! -name '*.test.ts' 2>/dev/null | head -n 1)" ]; then
    echo "== the build is newer than the sources; not rebuilding"
  else
    echo "== building (next build)"
    npx next build
  fi
}

# `next start` on port $1, replacing the (background) shell that calls it.
start_app() {
  exec node node_modules/next/dist/bin/next start -H "$DEMO_HOST" -p "$1"
}

# Waits until the app on port $1 answers (up to a minute); fails when process $2 has ended.
wait_for_app() {
  local url="http://127.0.0.1:$1/sign-in"
  [ "$DEMO_HOST" = "127.0.0.1" ] || [ "$DEMO_HOST" = "0.0.0.0" ] || url="http://$DEMO_HOST:$1/sign-in"
  for _ in $(seq 1 120); do
    if node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "$url"; then return 0; fi
    if ! kill -0 "$2" 2>/dev/null; then echo "the app did not start (is port $1 taken? set PORT=…)"; return 1; fi
    sleep 0.5
  done
  echo "the app on port $1 did not answer within a minute"
  return 1
}

# The demo people's sign-ins, for the banner.
demo_sign_ins() {
  node --conditions=react-server --import tsx scripts/demo-people.ts
}
