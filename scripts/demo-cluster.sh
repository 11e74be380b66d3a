#!/usr/bin/env bash
# `npm run demo:cluster`: the demo on more than one process. Starts Redis (Debian's redis-server,
# installed when missing), two app processes on PORT and PORT+1 with JOB_QUEUE=bullmq, and two
# separate job worker processes, all on the one embedded database. Ctrl-C stops everything.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/demo-lib.sh

PORT="${PORT:-3000}"
PORT_B="$((PORT + 1))"
REDIS_PORT="${REDIS_PORT:-6390}"
# A REDIS_URL given from outside is used as it is; otherwise the script runs its own redis-server.
OWN_REDIS="${REDIS_URL:+no}"
export REDIS_URL="${REDIS_URL:-redis://127.0.0.1:$REDIS_PORT}"
export JOB_QUEUE=bullmq

prepare_demo --redis

mkdir -p data/cluster
redis_pid=""
pids=()
# Apps and workers first, each waited for, and Redis last: a worker closing gracefully still talks to Redis.
stop_all() {
  trap - INT TERM EXIT
  for pid in "${pids[@]}"; do kill -TERM -- -"$pid" 2>/dev/null || true; done
  for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
  if [ -n "$redis_pid" ]; then
    kill -TERM -- -"$redis_pid" 2>/dev/null || true
    wait "$redis_pid" 2>/dev/null || true
  fi
}
trap stop_all INT TERM EXIT
# Each in its own process group (set -m), so that stopping one stops what it started.
set -m
if [ "$OWN_REDIS" != "no" ]; then
  echo "== starting redis-server on 127.0.0.1:$REDIS_PORT"
  /usr/bin/redis-server --port "$REDIS_PORT" --bind 127.0.0.1 --dir data/cluster --save "" --appendonly no >data/cluster/redis.log 2>&1 &
  redis_pid=$!
fi
echo "== starting app processes on ports $PORT and $PORT_B, and two job workers"
APP_URL="http://localhost:$PORT" MAIL_CATCHER="${MAIL_CATCHER:-on}" start_app "$PORT" >data/cluster/app-a.log 2>&1 &
pids+=($!)
# One mail catcher (on SMTP_PORT, 2525 by default) for both; the second app sends to the first's.
APP_URL="http://localhost:$PORT_B" MAIL_CATCHER=off start_app "$PORT_B" >data/cluster/app-b.log 2>&1 &
pids+=($!)
for w in 1 2; do
  JOB_WORKERS="${JOB_WORKERS:-1}" node --conditions=react-server --import tsx scripts/job-worker.ts >"data/cluster/worker-$w.log" 2>&1 &
  pids+=($!)
done
set +m

wait_for_app "$PORT" "${pids[0]}"
wait_for_app "$PORT_B" "${pids[1]}"
for log in data/cluster/worker-1.log data/cluster/worker-2.log; do
  for _ in $(seq 1 60); do grep -q "^job worker" "$log" && break; sleep 0.5; done
done

cat <<BANNER

  Squarely is running on two app processes: http://localhost:$PORT and http://localhost:$PORT_B
  Jobs: BullMQ on $REDIS_URL, run by two worker processes:
$(grep -h "^job worker" data/cluster/worker-*.log | sed 's/^/    /')
  Logs: data/cluster/*.log

  Demo sign-ins (Kestrel Lab, an invented research group):
$(demo_sign_ins)

  Caught mail: http://localhost:$PORT/dev/mail (operators: $MAIL_OPERATORS)
  Stop with Ctrl-C.

BANNER
wait
