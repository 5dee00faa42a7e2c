#!/usr/bin/env bash
# The scale-out tests (tests/scale): two Matchloom processes on one PostgreSQL and one Redis. Starts a
# throwaway PostgreSQL cluster (initdb in a temp folder, 127.0.0.1 only, a free port) and a throwaway
# redis-server (127.0.0.1 only, a free port, nothing saved to disk), exports DATABASE_URL and REDIS_URL,
# runs `npx vitest run tests/scale` one file at a time (each file starts its own two processes and makes its
# own database), then stops both and removes their folders. Needs Debian's postgresql and redis-server
# packages (apt-get install -y postgresql redis-server). Extra arguments go to vitest.
set -euo pipefail
cd "$(dirname "$0")/.."

bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then
  echo "scale-test: no PostgreSQL under /usr/lib/postgresql (apt-get install -y postgresql)" >&2
  exit 2
fi
redis=$(command -v redis-server || true)
if [ -z "$redis" ]; then
  echo "scale-test: no redis-server on PATH (apt-get install -y redis-server)" >&2
  exit 2
fi
as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }
free_port() { node -e "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})"; }

dir=$(mktemp -d /tmp/matchloom-scale-XXXXXX)
chmod 755 "$dir"
mkdir "$dir/redis"
[ "$(id -u)" = 0 ] && chown postgres: "$dir"
pg_port=$(free_port)
redis_port=$(free_port)
redis_pid=

cleanup() {
  if [ -n "$redis_pid" ]; then
    kill "$redis_pid" >/dev/null 2>&1 || true
    wait "$redis_pid" 2>/dev/null || true
  fi
  as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >/dev/null 2>&1 || true
  rm -rf "$dir"
}
trap cleanup EXIT

as_pg "$bin/initdb" -D "$dir/data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 \
  || { cat "$dir/initdb.log" >&2; exit 1; }
as_pg "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w \
  -o "-c listen_addresses=127.0.0.1 -c port=$pg_port -c unix_socket_directories=$dir -c fsync=off -c max_connections=200" start >/dev/null \
  || { cat "$dir/server.log" >&2; exit 1; }

(cd "$dir/redis" && exec "$redis" --port "$redis_port" --bind 127.0.0.1 --save '' --appendonly no --daemonize no \
  --dir "$dir/redis" --logfile "$dir/redis/redis.log") &
redis_pid=$!
# Wait for it to answer (redis-cli may be absent: a bare PING over TCP from node).
ready=0
for _ in $(seq 1 100); do
  if node -e "const s=require('net').connect($redis_port,'127.0.0.1',()=>s.write('PING\r\n'));s.on('data',d=>process.exit(String(d).startsWith('+PONG')?0:1));s.on('error',()=>process.exit(1))" 2>/dev/null; then
    ready=1
    break
  fi
  if ! kill -0 "$redis_pid" 2>/dev/null; then break; fi
  sleep 0.1
done
if [ "$ready" != 1 ]; then
  echo "scale-test: redis-server did not start on 127.0.0.1:$redis_port" >&2
  cat "$dir/redis/redis.log" >&2 2>/dev/null || true
  exit 1
fi

start=$(date +%s)
status=0
# One file at a time: Redis pub/sub channels are not scoped by database, and each file runs two servers.
DATABASE_URL="postgres://postgres@127.0.0.1:$pg_port/postgres" REDIS_URL="redis://127.0.0.1:$redis_port" \
  npx vitest run tests/scale --no-file-parallelism "$@" || status=$?
echo "scale-test: vitest finished with status $status in $(( $(date +%s) - start )) s"
exit $status
