#!/usr/bin/env bash
# Runs Kerfbook's own PostgreSQL on loopback: installs Debian's server package where it is
# missing, creates a cluster in a data folder of its own, and starts, stops or reports it.
#   scripts/pg.sh start [database]   start (safe to run twice) and create the database if missing
#   scripts/pg.sh stop               stop cleanly
#   scripts/pg.sh status             say whether it runs
# Settings: KERFBOOK_PG_PORT (55432), KERFBOOK_PG_DIR (/var/tmp/kerfbook-pg/<port> for root,
#           /var/tmp/kerfbook-pg-<user>/<port> for anyone else),
#           KERFBOOK_PG_FAST=1 turns off durable commits (tests only).
set -euo pipefail

cmd=${1:-status}
database=${2:-}
port=${KERFBOOK_PG_PORT:-55432}
if [ "$(id -u)" -eq 0 ]; then default_base=/var/tmp/kerfbook-pg; else default_base=/var/tmp/kerfbook-pg-$(id -un); fi
base=${KERFBOOK_PG_DIR:-$default_base/$port}
data="$base/data"
sockets="$base/run"
log="$base/server.log"

say() { echo "[postgres] $*"; }

find_bin() {
  local dir
  dir=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -n "$dir" ] && [ -x "$dir/initdb" ]; then echo "$dir"; fi
}

install_server() {
  say "server binaries not found: installing Debian's postgresql package"
  bash "$(dirname "$0")/apt-install.sh" postgresql
}

bin=$(find_bin)
if [ -z "$bin" ] && [ "$cmd" = start ]; then
  install_server
  bin=$(find_bin)
fi
if [ -z "$bin" ]; then
  say "no PostgreSQL server installed"
  [ "$cmd" = start ] && exit 1 || exit 0
fi

# As root the server runs as the postgres user (initdb refuses root); otherwise as ourselves.
if [ "$(id -u)" -eq 0 ]; then
  owner=postgres
  as_owner() { runuser -u postgres -- "$@"; }
else
  owner=$(id -un)
  as_owner() { "$@"; }
fi

running() { [ -f "$data/PG_VERSION" ] && as_owner "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; }

psql_admin() { "$bin/psql" -h 127.0.0.1 -p "$port" -U postgres -d postgres -v ON_ERROR_STOP=1 -qAt "$@"; }

start() {
  mkdir -p "$base"
  if [ "$(id -u)" -eq 0 ]; then
    # The postgres user must reach the folder: every parent has to be traversable.
    chown "$owner" "$base"
    chmod 755 "$base" "$(dirname "$base")"
  fi
  if [ ! -f "$data/PG_VERSION" ]; then
    say "creating a cluster in $data"
    as_owner mkdir -p "$data" "$sockets"
    as_owner "$bin/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$base/initdb.log" 2>&1 \
      || { cat "$base/initdb.log" >&2; exit 1; }
  fi
  as_owner mkdir -p "$sockets"
  if running; then
    say "already running on 127.0.0.1:$port"
  else
    local opts="-c listen_addresses=127.0.0.1 -p $port -k $sockets -c max_connections=200"
    if [ "${KERFBOOK_PG_FAST:-0}" = 1 ]; then
      opts="$opts -c fsync=off -c synchronous_commit=off -c full_page_writes=off"
    fi
    as_owner "$bin/pg_ctl" -D "$data" -l "$log" -o "$opts" -w -t 60 start >/dev/null \
      || { tail -n 20 "$log" >&2; exit 1; }
    say "started on 127.0.0.1:$port (data in $data)"
  fi
  if [ -n "$database" ]; then
    if [ "$(psql_admin -c "select 1 from pg_database where datname = '$database'")" != 1 ]; then
      psql_admin -c "create database \"$database\""
      say "created database $database"
    fi
  fi
}

stop() {
  if running; then
    as_owner "$bin/pg_ctl" -D "$data" -m fast -w stop >/dev/null
    say "stopped (127.0.0.1:$port)"
  else
    say "not running (127.0.0.1:$port)"
  fi
}

case "$cmd" in
  start) start ;;
  stop) stop ;;
  status) if running; then say "running on 127.0.0.1:$port"; else say "not running"; exit 3; fi ;;
  *) echo "usage: scripts/pg.sh start [database] | stop | status" >&2; exit 2 ;;
esac
