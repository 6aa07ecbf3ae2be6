#!/usr/bin/env bash
# Entry point for `npm start`, `npm run dev`, `npm test`, `npm run worker` and `npm run bench`.
# Installs dependencies when they are missing or stale, then hands over to scripts/rootbank.ts.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

stamp=node_modules/.package-lock.json
if [ ! -f "$stamp" ] || [ package-lock.json -nt "$stamp" ]; then
  echo "rootbank: installing dependencies (npm ci)…"
  npm ci --no-audit --no-fund
fi

# Test runs and benchmarks share fixed ports and the test database: one at a time per machine.
if [ "${1:-}" = test ] || [ "${1:-}" = bench ]; then
  lock="${TMPDIR:-/tmp}/rootbank-test-run.lock"
  exec 9>"$lock"
  if ! flock -n 9; then
    echo "rootbank: another test run or benchmark is using the test ports; waiting for it…"
    flock 9
  fi
fi

exec node --import tsx scripts/rootbank.ts "$@"
