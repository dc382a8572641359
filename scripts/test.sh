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
pg_up "$PGHOME" "$TB_TEST_DB_PORT"
pg_createdb "$TB_TEST_DB_PORT" tanglebank_test

# Every step runs even when an earlier one fails, so one run reports everything; any failure fails the run.
status=0
log "Type-checking…"
npx tsc --noEmit -p tsconfig.json || { status=1; log "Type check FAILED"; }
log "Linting…"
npx eslint . --max-warnings=0 || { status=1; log "Lint FAILED"; }
log "Building the client…"
# The production build, as users get it (NODE_ENV=test above would give React's development build).
NODE_ENV=production npx vite build --logLevel warn || { status=1; log "Client build FAILED"; }
log "Running the tests…"
mkdir -p test-artifacts
rm -f test-artifacts/vitest-results.json
projects=()
[ -n "${TB_SKIP_E2E:-}" ] && projects=(--project unit --project server)
npx vitest run "${projects[@]}" --reporter=default --reporter=json --outputFile.json=test-artifacts/vitest-results.json "$@" || status=1
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
