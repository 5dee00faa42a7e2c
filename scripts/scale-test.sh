#!/usr/bin/env bash
# The scale-out tests (tests/scale): two Matchloom processes on one PostgreSQL and one Redis. Starts a
# throwaway PostgreSQL cluster (initdb in a temp folder, 127.0.0.1 only, a free port) and a throwaway
# redis-server (127.0.0.1 only, a free port, nothing saved to disk), exports DATABASE_URL and REDIS_URL,
# runs `npx vitest run tests/scale` one file at a time (each file starts its own two processes and makes its
# own database), then stops both and removes their folders. Needs Debian's postgresql and redis-server
# packages (apt-get install -y postgresql redis-server). Extra arguments go to vitest.
set -euo pipefail
cd "$(dirname "$0")/.."

. scripts/lib/throwaway-pg.sh
pg_bin scale-test
redis=$(command -v redis-server || true)
if [ -z "$redis" ]; then
  echo "scale-test: no redis-server on PATH (apt-get install -y redis-server)" >&2
  exit 2
fi

dir=$(mktemp -d /tmp/matchloom-scale-XXXXXX)
mkdir "$dir/redis"
pg_port=$(free_port)
redis_port=$(free_port)
redis_pid=

cleanup() {
  if [ -n "$redis_pid" ]; then
    kill "$redis_pid" >/dev/null 2>&1 || true
    wait "$redis_pid" 2>/dev/null || true
  fi
  pg_stop "$dir"
  rm -rf "$dir"
}
trap cleanup EXIT

pg_start "$dir" "$pg_port" -c max_connections=200

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
