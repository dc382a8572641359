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

stop_all() {
  trap - INT TERM EXIT
  [ -n "${APP_PID:-}" ] && kill -TERM "$APP_PID" 2>/dev/null && wait "$APP_PID" 2>/dev/null
  log "Stopping PostgreSQL…"
  pg_down "$PGHOME"
  log "Stopped."
}
trap stop_all INT TERM EXIT

log "Building the client…"
npx vite build --logLevel warn || die "client build failed"

npx tsx scripts/run.ts &
APP_PID=$!
wait "$APP_PID"
