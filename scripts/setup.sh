#!/usr/bin/env bash
# Shared set-up for `npm start` and `npm test`: dependencies from the lock, PostgreSQL, the database,
# migrations. Usage: scripts/setup.sh DATABASE_NAME
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"
DB_NAME="${1:?database name}"

# 1. Dependencies: (re)install from the lock when node_modules is missing or older than the lock.
stamp=node_modules/.stormledger-lock.sha
lock_sum=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$lock_sum" ]; then
  echo "[setup] installing dependencies from package-lock.json (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$lock_sum" > "$stamp"
fi

# 2. PostgreSQL and the database.
scripts/pg.sh start
scripts/pg.sh ensure-db "$DB_NAME"

# 3. Migrations, before anything serves requests.
STORMLEDGER_DB_NAME="$DB_NAME" node_modules/.bin/tsx scripts/migrate.ts
