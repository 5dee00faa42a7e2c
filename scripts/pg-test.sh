#!/usr/bin/env bash
# The PostgreSQL tests (tests/pg) against a throwaway cluster: initdb in a temp folder as the postgres
# user, listening on 127.0.0.1 only at a free port, one database, `npx vitest run tests/pg`, then the
# cluster is stopped and its folder removed. Needs Debian's postgresql package (apt-get install -y postgresql).
# Extra arguments go to vitest.
set -euo pipefail
cd "$(dirname "$0")/.."

. scripts/lib/throwaway-pg.sh
pg_bin pg-test

dir=$(mktemp -d /tmp/matchloom-pg-XXXXXX)
port=$(free_port)
cleanup() {
  pg_stop "$dir"
  rm -rf "$dir"
}
trap cleanup EXIT

pg_start "$dir" "$port"
as_pg "$PG_BIN/createdb" -h 127.0.0.1 -p "$port" -U postgres matchloom_test

start=$(date +%s)
status=0
DATABASE_URL="postgres://postgres@127.0.0.1:$port/matchloom_test" npx vitest run tests/pg "$@" || status=$?
echo "pg-test: vitest finished with status $status in $(( $(date +%s) - start )) s"
exit $status
