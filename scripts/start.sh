#!/usr/bin/env bash
# npm start: set up everything on a fresh clone and run Tanglebank (see README.md).
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules

export TB_DB_PORT="${TB_DB_PORT:-54329}"
export TB_DB_NAME="${TB_DB_NAME:-tanglebank}"
export DATABASE_URL="${DATABASE_URL:-postgres://postgres@127.0.0.1:$TB_DB_PORT/$TB_DB_NAME}"
PGHOME="$ROOT/.pg"

pg_up "$PGHOME" "$TB_DB_PORT"
pg_createdb "$TB_DB_PORT" "$TB_DB_NAME"

# Ctrl-C reaches the whole foreground process group: the app stops itself cleanly, then the EXIT trap
# stops PostgreSQL. A SIGTERM sent to this script alone is forwarded to the app.
APP_PID=""
on_exit() {
  trap - EXIT
  log "Stopping PostgreSQL…"
  pg_down "$PGHOME"
  log "Stopped."
}
trap on_exit EXIT
trap '[ -n "$APP_PID" ] && kill -TERM "$APP_PID" 2>/dev/null' TERM
trap '' INT   # the app handles Ctrl-C itself; this script waits for it

log "Building the client…"
npx vite build --logLevel warn || die "client build failed"

node --import tsx scripts/run.ts &
APP_PID=$!
while kill -0 "$APP_PID" 2>/dev/null; do wait "$APP_PID" || true; done
