#!/usr/bin/env bash
# Local PostgreSQL for development, demo and tests.
#
#   bash db/postgres.sh start    # idempotent: init the cluster if needed, start it, create the app database
#   bash db/postgres.sh stop     # idempotent
#   bash db/postgres.sh status
#   bash db/postgres.sh url      # prints the DATABASE_URL of the local cluster (the runtime role)
#
# Roles (see README, "Database roles"):
#   ringlet        the cluster's superuser; only this script and the test harness use it, to create
#                  roles and databases
#   ringlet_owner  owns the app database and every table in it; migrations and the demo seed run as it
#   ringlet_app    the running server: SELECT/INSERT/UPDATE/DELETE only, no superuser, no DDL
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
owner_role=ringlet_owner
app_role=ringlet_app
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

url() { printf 'postgres://%s:%s@127.0.0.1:%s/%s\n' "$app_role" "$app_role" "$port" "$db_name"; }

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
    psql_su() { "$bin/psql" -h 127.0.0.1 -p "$port" -U "$db_user" -v ON_ERROR_STOP=1 -q "$@"; }
    # The owner and runtime roles (local passwords = role names; the cluster listens on loopback only).
    psql_su -d postgres >/dev/null <<SQL
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$owner_role') THEN
    CREATE ROLE $owner_role LOGIN PASSWORD '$owner_role' NOSUPERUSER NOCREATEDB NOCREATEROLE;
  END IF;
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$app_role') THEN
    CREATE ROLE $app_role LOGIN PASSWORD '$app_role' NOSUPERUSER NOCREATEDB NOCREATEROLE NOINHERIT;
  END IF;
END \$\$;
SQL
    if ! psql_su -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$db_name'" | grep -q 1; then
      psql_su -d postgres -c "CREATE DATABASE $db_name OWNER $owner_role" >/dev/null
      log "created database $db_name"
    fi
    # A database made before the roles existed: hand it and its objects to the owner role.
    psql_su -d "$db_name" >/dev/null <<SQL
ALTER DATABASE $db_name OWNER TO $owner_role;
DO \$\$ DECLARE r record; BEGIN
  FOR r IN SELECT n.nspname AS s, c.relname AS t FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
           WHERE n.nspname IN ('public', 'pgboss') AND c.relkind IN ('r', 'p', 'v', 'm')
             AND pg_get_userbyid(c.relowner) = '$db_user' LOOP
    EXECUTE format('ALTER TABLE %I.%I OWNER TO $owner_role', r.s, r.t);
  END LOOP;
  FOR r IN SELECT n.nspname AS s, c.relname AS t FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
           WHERE n.nspname IN ('public', 'pgboss') AND c.relkind = 'S' AND pg_get_userbyid(c.relowner) = '$db_user'
             AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = c.oid AND d.deptype IN ('a', 'i')) LOOP
    EXECUTE format('ALTER SEQUENCE %I.%I OWNER TO $owner_role', r.s, r.t);
  END LOOP;
  FOR r IN SELECT p.oid::regprocedure AS f FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
           WHERE n.nspname IN ('public', 'pgboss') AND pg_get_userbyid(p.proowner) = '$db_user'
             AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = p.oid AND d.deptype = 'e') LOOP
    EXECUTE format('ALTER ROUTINE %s OWNER TO $owner_role', r.f);
  END LOOP;
  FOR r IN SELECT t.oid::regtype AS ty FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
           WHERE n.nspname IN ('public', 'pgboss') AND t.typtype IN ('e', 'd', 'c') AND t.typrelid = 0
             AND pg_get_userbyid(t.typowner) = '$db_user'
             AND NOT EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = t.oid AND d.deptype = 'e') LOOP
    EXECUTE format('ALTER TYPE %s OWNER TO $owner_role', r.ty);
  END LOOP;
  IF EXISTS (SELECT 1 FROM pg_namespace WHERE nspname = 'pgboss' AND pg_get_userbyid(nspowner) = '$db_user') THEN
    ALTER SCHEMA pgboss OWNER TO $owner_role;
  END IF;
END \$\$;
SQL
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
