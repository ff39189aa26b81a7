#!/usr/bin/env bash
# npm test: the same set-up as npm start against the test databases, then every Vitest project.
# Extra arguments go to Vitest (e.g. npm test -- --project unit).
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
mkdir -p .data
scripts/setup.sh stormledger_test
scripts/pg.sh ensure-db stormledger_e2e

# Debian's chromium for the browser tests.
if [ ! -x /usr/bin/chromium ]; then
  echo "[test] installing Debian's chromium for the browser tests…"
  if [ "$(id -u)" = 0 ]; then
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null && apt-get install -y -qq chromium >/dev/null
  else
    echo "[test] chromium is missing and installing it needs root: sudo apt-get install -y chromium" >&2
    exit 1
  fi
fi

scripts/build-if-stale.sh
echo "[test] type-checking (strict TypeScript, pages and server)…"
node_modules/.bin/nuxt typecheck
echo "[test] linting (eslint, the project's rules in eslint.config.mjs)…"
node_modules/.bin/eslint .
exec node_modules/.bin/vitest run "$@"
