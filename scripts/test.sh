#!/usr/bin/env bash
# npm test: set up everything on a fresh clone and run every test (typecheck, lint, unit, integration
# against a throwaway PostgreSQL cluster, browser tests in Chromium). Stops what it started, even on failure.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules

export NODE_ENV=test
export TB_TEST_DB_PORT="${TB_TEST_DB_PORT:-54339}"
export TB_DB_PORT="$TB_TEST_DB_PORT"
export DATABASE_URL="postgres://postgres@127.0.0.1:$TB_TEST_DB_PORT/tanglebank_test"
export TB_MAIL_PORT=0
PGHOME="$ROOT/.pg-test"

# Chromium for the browser tests (Debian's package; never a downloaded browser build).
if [ -z "${TB_SKIP_E2E:-}" ] && [ ! -x /usr/bin/chromium ]; then
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
    log "Installing Debian's chromium for the browser tests…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null || die "apt-get install chromium failed"
  else
    die "Chromium is needed for the browser tests: sudo apt-get install chromium (or set TB_SKIP_E2E=1)"
  fi
fi

cleanup() {
  local code=$?
  trap - EXIT INT TERM
  pg_down "$PGHOME"
  rm -rf "$PGHOME"
  exit "$code"
}
trap cleanup EXIT INT TERM

# A throwaway cluster: never the demo data.
pg_down "$PGHOME" 2>/dev/null || true
rm -rf "$PGHOME"
# Thrown away after the run, so it need not survive a crash: commits do not wait for the disk.
pg_up "$PGHOME" "$TB_TEST_DB_PORT" "-c fsync=off -c synchronous_commit=off -c full_page_writes=off"
pg_createdb "$TB_TEST_DB_PORT" tanglebank_test

# Every step runs even when an earlier one fails, so one run reports everything; any failure fails the run.
# The type check, the lint and the client build run side by side (each mostly on one core); each one's output
# is printed whole when all three are done, then its verdict and time.
status=0
STEPS="$(mktemp -d)"
# step NAME CMD… — starts a step in the background; its output goes to $STEPS/NAME.log, "status seconds" to NAME.rc.
step() {
  local name="$1"; shift
  ( set +e; t0=$SECONDS; "$@" >"$STEPS/$name.log" 2>&1; echo "$? $((SECONDS - t0))" >"$STEPS/$name.rc" ) &
}
# report NAME LABEL — prints a finished step's output and verdict.
report() {
  local rc secs
  read -r rc secs <"$STEPS/$1.rc" || { rc=1; secs=?; }
  cat "$STEPS/$1.log"
  if [ "$rc" = 0 ]; then log "$2 passed (${secs} s)"; else status=1; log "$2 FAILED (${secs} s)"; fi
}
log "Type-checking, linting and building the client, side by side…"
step typecheck npx tsc --noEmit -p tsconfig.json
step lint npx eslint . --max-warnings=0
# The production build, as users get it (NODE_ENV=test above would give React's development build).
step build env NODE_ENV=production npx vite build --logLevel warn
wait
report typecheck "Type check"
report lint "Lint"
report build "Client build"
rm -rf "$STEPS"
log "Running the tests…"
mkdir -p test-artifacts
rm -f test-artifacts/vitest-results.json
projects=()
[ -n "${TB_SKIP_E2E:-}" ] && projects=(--project unit --project server)
t0=$SECONDS
npx vitest run "${projects[@]}" --reporter=default --reporter=json --outputFile.json=test-artifacts/vitest-results.json "$@" || status=1
log "Tests ran for $((SECONDS - t0)) s"
# One plain closing line with the counts.
node -e '
  const fs = require("fs");
  try {
    const r = JSON.parse(fs.readFileSync("test-artifacts/vitest-results.json", "utf8"));
    console.log(`Tests: ${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests + (r.numTodoTests ?? 0)} skipped`);
  } catch { console.log("Tests: 0 passed, 1 failed (no test results were written)"); }
' || status=1
[ "$status" = 0 ] && log "All checks passed." || log "Some checks FAILED (see above)."
exit "$status"
