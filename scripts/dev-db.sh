#!/usr/bin/env bash
# For developers running single test files while working: ensures a long-lived development test cluster
# (.pg-devtest, port 54349) and a database of the given name, then prints its DATABASE_URL.
#   export DATABASE_URL=$(bash scripts/dev-db.sh tanglebank_test_mine)
#   npx vitest run --project server tests/server/api/users/users.test.ts
source "$(dirname "$0")/lib.sh"
name="${1:-tanglebank_test_dev}"
case "$name" in tanglebank_test*) ;; *) die "database name must start with tanglebank_test";; esac
port="${TB_DEVTEST_DB_PORT:-54349}"
exec 9>"/tmp/tanglebank-devdb.lock"; flock 9
# fd 9 (the lock) must not be inherited by the PostgreSQL server, or the lock is never released.
pg_up "$ROOT/.pg-devtest" "$port" >/dev/null 9>&-
pg_createdb "$port" "$name" >/dev/null 9>&-
echo "postgres://postgres@127.0.0.1:$port/$name"
