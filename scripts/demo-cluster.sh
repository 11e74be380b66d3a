#!/usr/bin/env bash
# `npm run demo:cluster`: the demo on more than one process. Starts Redis (Debian's redis-server,
# installed when missing), two app processes on PORT and PORT+1 with JOB_QUEUE=bullmq, and two
# separate job worker processes, all on the one embedded database. Ctrl-C stops everything.
set -euo pipefail
cd "$(dirname "$0")/.."

PORT="${PORT:-3000}"
PORT_B="$((PORT + 1))"
REDIS_PORT="${REDIS_PORT:-6390}"
# A REDIS_URL given from outside is used as it is; otherwise the script runs its own redis-server.
OWN_REDIS="${REDIS_URL:+no}"
export REDIS_URL="${REDIS_URL:-redis://127.0.0.1:$REDIS_PORT}"
export JOB_QUEUE=bullmq
export MAIL_OPERATORS="${MAIL_OPERATORS:-ines@kestrel-lab.example}"
export NEXT_TELEMETRY_DISABLED=1

bash scripts/ensure-deps.sh --redis

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

mkdir -p data/cluster
pids=()
stop_all() {
  for pid in "${pids[@]}"; do kill -- -"$pid" 2>/dev/null || true; done
  wait 2>/dev/null || true
}
trap stop_all INT TERM EXIT
# Each in its own process group (set -m), so that stopping one stops what it started.
set -m
if [ "$OWN_REDIS" != "no" ]; then
  echo "== starting redis-server on 127.0.0.1:$REDIS_PORT"
  /usr/bin/redis-server --port "$REDIS_PORT" --bind 127.0.0.1 --dir data/cluster --save "" --appendonly no >data/cluster/redis.log 2>&1 &
  pids+=($!)
fi
echo "== starting app processes on ports $PORT and $PORT_B, and two job workers"
APP_URL="http://localhost:$PORT" MAIL_CATCHER="${MAIL_CATCHER:-on}" \
  node node_modules/next/dist/bin/next start -p "$PORT" >data/cluster/app-a.log 2>&1 &
pids+=($!)
# One mail catcher (SMTP port 2525) for both; the second app sends to the first's.
APP_URL="http://localhost:$PORT_B" MAIL_CATCHER=off \
  node node_modules/next/dist/bin/next start -p "$PORT_B" >data/cluster/app-b.log 2>&1 &
pids+=($!)
for w in 1 2; do
  JOB_WORKERS="${JOB_WORKERS:-1}" node --conditions=react-server --import tsx scripts/job-worker.ts >"data/cluster/worker-$w.log" 2>&1 &
  pids+=($!)
done
set +m

for port in "$PORT" "$PORT_B"; do
  for _ in $(seq 1 120); do
    if node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "http://127.0.0.1:$port/sign-in"; then break; fi
    sleep 0.5
  done
done
for log in data/cluster/worker-1.log data/cluster/worker-2.log; do
  for _ in $(seq 1 60); do grep -q "^job worker" "$log" && break; sleep 0.5; done
done

cat <<BANNER

  Squarely is running on two app processes: http://localhost:$PORT and http://localhost:$PORT_B
  Jobs: BullMQ on $REDIS_URL, run by two worker processes:
$(grep -h "^job worker" data/cluster/worker-*.log | sed 's/^/    /')
  Logs: data/cluster/*.log

  Demo sign-ins (Kestrel Lab, an invented research group):
$(node --conditions=react-server --import tsx scripts/demo-people.ts)

  Caught mail: http://localhost:$PORT/dev/mail (operators: $MAIL_OPERATORS)
  Stop with Ctrl-C.

BANNER
wait
