#!/usr/bin/env bash
# npm start: everything a fresh machine needs, then the app and its worker on http://localhost:$PORT.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
mkdir -p .data
scripts/setup.sh "${STORMLEDGER_DB_NAME:-stormledger}"
export STORMLEDGER_DB_NAME="${STORMLEDGER_DB_NAME:-stormledger}"
node_modules/.bin/tsx scripts/seed.ts
scripts/build-if-stale.sh
exec node_modules/.bin/tsx scripts/serve.ts
