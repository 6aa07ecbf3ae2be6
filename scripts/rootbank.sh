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

exec node --import tsx scripts/rootbank.ts "$@"
