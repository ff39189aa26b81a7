#!/usr/bin/env bash
# Builds the production bundle when .output is missing or any source file changed since the last build.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
sources=$(find app.vue nuxt.config.ts tailwind.config.ts package-lock.json pages components composables layouts middleware plugins stores assets public server shared docs \
  -type f 2>/dev/null | LC_ALL=C sort || true) # folders that do not exist yet are skipped
sum=$(echo "$sources" | xargs sha256sum | sha256sum | cut -d' ' -f1)
stamp=.output/.stormledger-build.sha
if [ -f .output/server/index.mjs ] && [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$sum" ]; then
  echo "[build] up to date"
  exit 0
fi
echo "[build] building the application (about a minute)…"
node_modules/.bin/nuxt build > .data/build.log 2>&1 || { tail -n 40 .data/build.log >&2; echo "[build] failed; full log in .data/build.log" >&2; exit 1; }
echo "$sum" > "$stamp"
echo "[build] done"
