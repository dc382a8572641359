#!/usr/bin/env bash
# Shared shell helpers for `npm start` and `npm test`: dependency install and the project's own
# PostgreSQL cluster on 127.0.0.1 (Debian's PostgreSQL binaries; initdb and postgres refuse root, so they
# run as the `postgres` system user when we are root).
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

log() { printf '\033[1;32m[tanglebank]\033[0m %s\n' "$*" >&2; }
die() { printf '\033[1;31m[tanglebank]\033[0m %s\n' "$*" >&2; exit 1; }

ensure_node_modules() {
  if [ ! -d "$ROOT/node_modules" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "Installing dependencies (npm ci)…"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error) || die "npm ci failed"
  fi
}

find_pgbin() {
  local d
  for d in /usr/lib/postgresql/*/bin; do
    if [ -x "$d/initdb" ] && [ -x "$d/pg_ctl" ]; then PGBIN="$d"; fi
  done
  if [ -z "${PGBIN:-}" ]; then
    if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
      log "PostgreSQL server binaries not found; installing Debian's postgresql package…"
      apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null || die "apt-get install postgresql failed"
      for d in /usr/lib/postgresql/*/bin; do [ -x "$d/initdb" ] && PGBIN="$d"; done
    fi
  fi
  [ -n "${PGBIN:-}" ] || die "PostgreSQL server binaries not found. Install them with: sudo apt-get install postgresql"
  export PGBIN
}

# as_pg CMD… — run a PostgreSQL server command as the cluster owner.
as_pg() {
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# pg_up DIR PORT [OPTIONS] — create (if needed) and start a cluster whose data lives in DIR/data; OPTIONS are
# more server settings ("-c name=value …").
pg_up() {
  local home="$1" port="$2" extra="${3:-}"
  find_pgbin
  local data="$home/data"
  mkdir -p "$home"
  if [ "$(id -u)" = 0 ]; then
    chown postgres:postgres "$home"; chmod 700 "$home"
    if ! runuser -u postgres -- test -x "$home"; then
      die "The postgres user cannot reach $home (a parent folder is not traversable). Clone the project into a folder others can traverse."
    fi
  fi
  if [ ! -s "$data/PG_VERSION" ]; then
    log "Creating the PostgreSQL cluster in $data…"
    as_pg "$PGBIN/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 --no-sync >"$home/initdb.log" 2>&1 \
      || { cat "$home/initdb.log" >&2; die "initdb failed"; }
  fi
  if ! as_pg "$PGBIN/pg_ctl" -D "$data" status >/dev/null 2>&1; then
    as_pg "$PGBIN/pg_ctl" -D "$data" -l "$home/server.log" -w -t 60 \
      -o "-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories='' -c max_connections=200 $extra" start >/dev/null \
      || { tail -20 "$home/server.log" >&2; die "PostgreSQL did not start on port $port (is the port taken? set TB_DB_PORT)"; }
  fi
  local i
  for i in $(seq 1 60); do "$PGBIN/pg_isready" -q -h 127.0.0.1 -p "$port" -U postgres && return 0; sleep 0.5; done
  die "PostgreSQL on 127.0.0.1:$port is not ready"
}

pg_down() {
  local home="$1"
  find_pgbin
  if as_pg "$PGBIN/pg_ctl" -D "$home/data" status >/dev/null 2>&1; then
    as_pg "$PGBIN/pg_ctl" -D "$home/data" -m fast -w -t 60 stop >/dev/null || true
  fi
}

# pg_createdb PORT NAME — create the database if missing.
pg_createdb() {
  local port="$1" name="$2"
  if ! "$PGBIN/psql" -h 127.0.0.1 -p "$port" -U postgres -tAc "SELECT 1 FROM pg_database WHERE datname='$name'" | grep -q 1; then
    "$PGBIN/createdb" -h 127.0.0.1 -p "$port" -U postgres "$name"
  fi
}
