#!/usr/bin/env bash
# The PostgreSQL tests (tests/pg) against a throwaway cluster: initdb in a temp folder as the postgres
# user, listening on 127.0.0.1 only at a free port, one database, `npx vitest run tests/pg`, then the
# cluster is stopped and its folder removed. Needs Debian's postgresql package (apt-get install -y postgresql).
# Extra arguments go to vitest.
set -euo pipefail
cd "$(dirname "$0")/.."

bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then
  echo "pg-test: no PostgreSQL under /usr/lib/postgresql (apt-get install -y postgresql)" >&2
  exit 2
fi
as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

dir=$(mktemp -d /tmp/matchloom-pg-XXXXXX)
chmod 755 "$dir"
[ "$(id -u)" = 0 ] && chown postgres: "$dir"
port=$(node -e "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})")

cleanup() {
  as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >/dev/null 2>&1 || true
  rm -rf "$dir"
}
trap cleanup EXIT

as_pg "$bin/initdb" -D "$dir/data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 \
  || { cat "$dir/initdb.log" >&2; exit 1; }
as_pg "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w \
  -o "-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories=$dir -c fsync=off" start >/dev/null \
  || { cat "$dir/server.log" >&2; exit 1; }
as_pg "$bin/createdb" -h 127.0.0.1 -p "$port" -U postgres matchloom_test

start=$(date +%s)
status=0
DATABASE_URL="postgres://postgres@127.0.0.1:$port/matchloom_test" npx vitest run tests/pg "$@" || status=$?
echo "pg-test: vitest finished with status $status in $(( $(date +%s) - start )) s"
exit $status
