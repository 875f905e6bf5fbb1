#!/usr/bin/env bash
# Local PostgreSQL for development, demo and tests.
#
#   bash db/postgres.sh start    # idempotent: init the cluster if needed, start it, create the app database
#   bash db/postgres.sh stop     # idempotent
#   bash db/postgres.sh status
#   bash db/postgres.sh url      # prints the DATABASE_URL of the local cluster
#
# Uses Debian's PostgreSQL binaries (installs the `postgresql` package when missing and run as root).
# Listens on 127.0.0.1 only (port RINGLET_PG_PORT, default 5433). PostgreSQL refuses to run as root,
# so as root the server runs as the `postgres` user. When DATABASE_URL is set, nothing is started:
# that server is used as it is.
set -euo pipefail

cmd=${1:-start}
repo=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
port=${RINGLET_PG_PORT:-5433}
db_user=ringlet
db_password=ringlet
db_name=${RINGLET_PG_DB:-ringlet}

log() { printf '[postgres] %s\n' "$*" >&2; }

if [ -n "${DATABASE_URL:-}" ] && [ "$cmd" != url ]; then
  log "DATABASE_URL is set; using that server, starting nothing."
  exit 0
fi

find_bin() {
  local dir
  dir=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -z "$dir" ] || [ ! -x "$dir/pg_ctl" ]; then
    if [ "$(id -u)" = 0 ]; then
      log "PostgreSQL not found; installing Debian's postgresql package."
      (apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql) >&2
      dir=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)
    else
      log "PostgreSQL not found. Install it with: sudo apt-get install postgresql"
      exit 1
    fi
  fi
  printf '%s' "$dir"
}

# Run a command as the cluster's owner: ourselves, or `postgres` when we are root.
as_owner() {
  # (from / so that postgres need not reach the caller's working directory)
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# Where the cluster lives: .data/postgres in the repo, unless the `postgres` user cannot reach it
# (a clone under a root-only home), then a folder under /var/tmp named after the repo path.
data_dir() {
  local dir="$repo/.data/postgres"
  if [ "$(id -u)" = 0 ]; then
    mkdir -p "$dir"
    chown postgres:postgres "$dir"
    if ! (cd / && runuser -u postgres -- test -w "$dir"); then
      local hash
      hash=$(printf '%s' "$repo" | sha1sum | cut -c1-12)
      dir="/var/tmp/ringlet-pg-$hash"
      mkdir -p "$dir"
      chown postgres:postgres "$dir"
      chmod 700 "$dir"
    fi
  else
    mkdir -p "$dir"
  fi
  printf '%s' "$dir"
}

url() { printf 'postgres://%s:%s@127.0.0.1:%s/%s\n' "$db_user" "$db_password" "$port" "$db_name"; }

case "$cmd" in
  url) url; exit 0 ;;
esac

bin=$(find_bin)
dir=$(data_dir)
pgdata="$dir/cluster"

case "$cmd" in
  start)
    if [ ! -f "$pgdata/PG_VERSION" ]; then
      log "creating a cluster in $pgdata"
      pwfile=$(mktemp)
      printf '%s\n' "$db_password" >"$pwfile"
      chmod 644 "$pwfile"
      as_owner "$bin/initdb" -D "$pgdata" -U "$db_user" --pwfile="$pwfile" \
        --auth-local=scram-sha-256 --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
      rm -f "$pwfile"
    fi
    if as_owner "$bin/pg_ctl" -D "$pgdata" status >/dev/null 2>&1; then
      log "already running on 127.0.0.1:$port"
    else
      as_owner "$bin/pg_ctl" -D "$pgdata" -l "$dir/server.log" -w -t 60 start \
        -o "-c listen_addresses=127.0.0.1 -p $port -k $dir -c synchronous_commit=off -c max_connections=200" >/dev/null
      log "started on 127.0.0.1:$port (data in $pgdata)"
    fi
    export PGPASSWORD=$db_password
    if ! "$bin/psql" -h 127.0.0.1 -p "$port" -U "$db_user" -d postgres -tAc \
      "SELECT 1 FROM pg_database WHERE datname = '$db_name'" | grep -q 1; then
      "$bin/psql" -h 127.0.0.1 -p "$port" -U "$db_user" -d postgres -qc "CREATE DATABASE $db_name" >/dev/null
      log "created database $db_name"
    fi
    ;;
  stop)
    if as_owner "$bin/pg_ctl" -D "$pgdata" status >/dev/null 2>&1; then
      as_owner "$bin/pg_ctl" -D "$pgdata" -m fast -w stop >/dev/null
      log "stopped"
    else
      log "not running"
    fi
    ;;
  status)
    as_owner "$bin/pg_ctl" -D "$pgdata" status || true
    ;;
  *)
    echo "usage: bash db/postgres.sh start|stop|status|url" >&2
    exit 2
    ;;
esac
