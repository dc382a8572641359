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
#
# The app is supervised: if it stops on its own (a crash, an out-of-memory kill, the database unreachable
# for two minutes at start), PostgreSQL is NOT stopped: it is started again if it went down too, and the
# app is started again after a pause (1 s, doubling up to 30 s while it keeps failing within a minute of
# starting). Exit status 78 from the app means a start-up failure a restart cannot cure (a bad setting, a
# port in use, a failed migration): then everything stops.
APP_PID=""
STOPPING=""
on_exit() {
  trap - EXIT
  log "Stopping PostgreSQL…"
  pg_down "$PGHOME"
  log "Stopped."
}
trap on_exit EXIT
trap 'STOPPING=1; [ -n "$APP_PID" ] && kill -TERM "$APP_PID" 2>/dev/null' TERM
trap 'STOPPING=1' INT   # the app handles Ctrl-C itself; this script waits for it

log "Building the client…"
npx vite build --logLevel warn || die "client build failed"

pause=1
while :; do
  node --import tsx scripts/run.ts &
  APP_PID=$!
  started=$SECONDS
  code=0
  while :; do
    wait "$APP_PID" || code=$?
    kill -0 "$APP_PID" 2>/dev/null && continue   # woken by a signal trap; the app is still running
    # The app has ended; if the wait above was cut short by a trap, this one reports its real status.
    late=0; wait "$APP_PID" 2>/dev/null || late=$?
    [ "$late" != 127 ] && code=$late
    break
  done
  APP_PID=""
  [ -n "$STOPPING" ] && break
  [ "$code" = 0 ] && break
  [ "$code" = 78 ] && die "The server could not start (see above); stopping."
  [ $((SECONDS - started)) -ge 60 ] && pause=1
  log "The server stopped unexpectedly (exit status $code); starting it again in ${pause} s. PostgreSQL keeps running."
  sleep "$pause" || true
  [ -n "$STOPPING" ] && break
  pause=$((pause * 2 > 30 ? 30 : pause * 2))
  pg_up "$PGHOME" "$TB_DB_PORT"   # starts PostgreSQL again if it went down too
done
