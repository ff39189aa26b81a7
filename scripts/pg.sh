#!/usr/bin/env bash
# PostgreSQL lifecycle for Stormledger: a private cluster in .data/postgres, on 127.0.0.1 and our own port.
#   scripts/pg.sh start            install if missing, initialise once, start, wait until ready
#   scripts/pg.sh stop             stop cleanly (fast shutdown; data kept)
#   scripts/pg.sh status           say whether it runs
#   scripts/pg.sh ensure-db NAME   create the application role and database NAME if missing
# Idempotent; never deletes data.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="$ROOT/.data/postgres"
PORT="${STORMLEDGER_PG_PORT:-54329}"
LOG="$ROOT/.data/postgres.log"
APP_ROLE=stormledger
APP_PASSWORD=stormledger

say() { printf '[postgres] %s\n' "$*"; }
die() { printf '[postgres] ERROR: %s\n' "$1" >&2; [ -n "${2:-}" ] && printf '[postgres] How to fix: %s\n' "$2" >&2; exit 1; }

find_bin() {
  local d
  for d in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -t/ -k4 -V -r); do
    [ -x "$d/pg_ctl" ] && { echo "$d"; return 0; }
  done
  return 1
}

install_postgres() {
  say "PostgreSQL server binaries not found; installing Debian's postgresql package…"
  [ "$(id -u)" = 0 ] || die "installing PostgreSQL needs root" "run: sudo apt-get update && sudo apt-get install -y postgresql"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq >/dev/null || die "apt-get update failed" "check the package sources in /etc/apt and retry"
  apt-get install -y -qq postgresql >/dev/null || die "apt-get install postgresql failed" "install the Debian package postgresql by hand, then retry"
}

BIN="$(find_bin || true)"
if [ -z "$BIN" ]; then install_postgres; BIN="$(find_bin)" || die "PostgreSQL still not found after install" "install the Debian package postgresql"; fi

# As root, the cluster belongs to the postgres system user (initdb refuses to run as root).
if [ "$(id -u)" = 0 ]; then
  id postgres >/dev/null 2>&1 || die "the postgres system user is missing" "reinstall the Debian package postgresql"
  as_pg() { runuser -u postgres -- "$@"; }
  PG_OWNER=postgres
else
  as_pg() { "$@"; }
  PG_OWNER="$(id -un)"
fi

running() { as_pg "$BIN/pg_ctl" -D "$DATA_DIR" status >/dev/null 2>&1; }

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null && { exec 3>&- 3<&- 2>/dev/null || true; return 0; }
  return 1
}

init_cluster() {
  mkdir -p "$ROOT/.data"
  if [ -f "$DATA_DIR/PG_VERSION" ]; then return 0; fi
  if [ -d "$DATA_DIR" ] && [ -n "$(ls -A "$DATA_DIR" 2>/dev/null)" ]; then
    die "$DATA_DIR exists but is not a PostgreSQL cluster" "move it aside (it is not deleted automatically), then rerun"
  fi
  local avail
  avail=$(df -Pk "$ROOT/.data" | awk 'NR==2 {print $4}')
  [ "${avail:-0}" -gt 102400 ] || die "less than 100 MB free on the disk holding .data" "free some disk space, then rerun"
  say "initialising a new cluster in .data/postgres"
  mkdir -p "$DATA_DIR"
  chown "$PG_OWNER" "$DATA_DIR" 2>/dev/null || true
  chmod 700 "$DATA_DIR"
  as_pg test -w "$DATA_DIR" || die "the $PG_OWNER user cannot write to $DATA_DIR" "make every folder above the checkout readable and executable by $PG_OWNER (chmod o+x), then rerun"
  as_pg "$BIN/initdb" -D "$DATA_DIR" -U postgres --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >"$ROOT/.data/initdb.log" 2>&1 \
    || die "initdb failed (see .data/initdb.log)" "check free disk space and permissions, then rerun"
  cat >>"$DATA_DIR/postgresql.conf" <<CONF
# Stormledger: loopback only, socket inside the data folder.
listen_addresses = '127.0.0.1'
unix_socket_directories = '$DATA_DIR'
max_connections = 200
shared_buffers = 256MB
fsync = on
CONF
}

start() {
  init_cluster
  if running; then
    say "already running on 127.0.0.1:$(current_port)"
  else
    if port_in_use; then
      die "port $PORT on 127.0.0.1 is taken by another program" "stop that program, or choose another port: STORMLEDGER_PG_PORT=54330 npm start"
    fi
    touch "$LOG"; chown "$PG_OWNER" "$LOG" 2>/dev/null || true
    say "starting on 127.0.0.1:$PORT"
    if ! as_pg "$BIN/pg_ctl" -D "$DATA_DIR" -l "$LOG" -o "-p $PORT" -w -t 60 start >/dev/null; then
      tail -n 15 "$LOG" >&2 || true
      grep -qi 'no space left' "$LOG" && die "the disk is full" "free disk space, then rerun"
      die "PostgreSQL did not start (log above, full log in .data/postgres.log)" "read the log; if another cluster uses the folder, stop it first"
    fi
  fi
  wait_ready
}

current_port() {
  sed -n '4p' "$DATA_DIR/postmaster.pid" 2>/dev/null || echo "$PORT"
}

wait_ready() {
  local port; port=$(current_port)
  for _ in $(seq 1 60); do
    as_pg "$BIN/pg_isready" -h "$DATA_DIR" -p "$port" -q && return 0
    sleep 0.5
  done
  die "PostgreSQL is running but not ready after 30 s" "see .data/postgres.log"
}

psql_admin() { as_pg "$BIN/psql" -h "$DATA_DIR" -p "$(current_port)" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA "$@"; }

ensure_db() {
  local name="$1"
  [[ "$name" =~ ^[a-z_][a-z0-9_]*$ ]] || die "invalid database name '$name'" "use lower-case letters, digits and underscores"
  running || start
  if [ "$(psql_admin -c "SELECT 1 FROM pg_roles WHERE rolname='$APP_ROLE'")" != 1 ]; then
    psql_admin -c "CREATE ROLE $APP_ROLE LOGIN CREATEDB PASSWORD '$APP_PASSWORD'"
  fi
  if [ "$(psql_admin -c "SELECT 1 FROM pg_database WHERE datname='$name'")" != 1 ]; then
    say "creating database $name"
    psql_admin -c "CREATE DATABASE $name OWNER $APP_ROLE"
  fi
}

stop() {
  if [ ! -f "$DATA_DIR/PG_VERSION" ]; then say "no cluster in .data/postgres"; return 0; fi
  if running; then
    say "stopping"
    as_pg "$BIN/pg_ctl" -D "$DATA_DIR" -m fast -w stop >/dev/null
  else
    say "not running"
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then say "running on 127.0.0.1:$(current_port)"; else say "not running"; exit 3; fi ;;
  ensure-db) [ -n "${2:-}" ] || die "ensure-db needs a database name"; ensure_db "$2" ;;
  restart) stop; start ;;
  *) echo "usage: scripts/pg.sh start|stop|status|restart|ensure-db NAME" >&2; exit 2 ;;
esac
