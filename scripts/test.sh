#!/usr/bin/env bash
# Every test: typecheck, lint, unit, integration, build, end-to-end. Ends with one summary line.
set -uo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh --browser --redis || exit 1

export NODE_ENV=test
results=$(mktemp -d)
status=0
step() { echo; echo "== $1"; shift; "$@" || status=1; }

step "typecheck" npx tsc --noEmit
step "lint" npx eslint .
for project in unit integration; do
  step "vitest $project" npx vitest run --project "$project" --reporter=default --reporter=json --outputFile="$results/$project.json"
done
step "build" npx next build
step "vitest e2e" npx vitest run --project e2e --reporter=default --reporter=json --outputFile="$results/e2e.json"

node -e '
  const fs = require("node:fs"); let p = 0, f = 0, s = 0;
  for (const file of fs.readdirSync(process.argv[1])) {
    const r = JSON.parse(fs.readFileSync(process.argv[1] + "/" + file, "utf8"));
    p += r.numPassedTests; f += r.numFailedTests; s += r.numPendingTests + (r.numTodoTests || 0);
  }
  console.log(`\ntests: ${p} passed, ${f} failed, ${s} skipped`);
' "$results"
[ "$status" = 0 ] && echo "all steps passed" || echo "some steps failed"
exit "$status"
