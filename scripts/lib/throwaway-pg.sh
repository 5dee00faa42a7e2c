# Shared by scripts/pg-test.sh and scripts/scale-test.sh (source it; bash): a throwaway PostgreSQL
# cluster in a temp folder, listening on 127.0.0.1 only, with fsync off.
#   pg_bin NAME            sets $PG_BIN to the newest /usr/lib/postgresql/*/bin, or exits 2 naming NAME
#   free_port              prints a free TCP port on 127.0.0.1
#   pg_start DIR PORT [-c setting=value …]   initdb DIR/data and start it (logs in DIR), or exits 1
#   pg_stop DIR            stops it (never fails)
# DIR must exist; as root, the cluster runs as the postgres user.

as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

free_port() { node -e "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})"; }

pg_bin() {
  PG_BIN=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -z "$PG_BIN" ] || [ ! -x "$PG_BIN/initdb" ]; then
    echo "$1: no PostgreSQL under /usr/lib/postgresql (apt-get install -y postgresql)" >&2
    exit 2
  fi
}

pg_start() {
  local dir=$1 port=$2
  shift 2
  chmod 755 "$dir"
  if [ "$(id -u)" = 0 ]; then chown postgres: "$dir"; fi
  as_pg "$PG_BIN/initdb" -D "$dir/data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 \
    || { cat "$dir/initdb.log" >&2; exit 1; }
  as_pg "$PG_BIN/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w \
    -o "-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories=$dir -c fsync=off $*" start >/dev/null \
    || { cat "$dir/server.log" >&2; exit 1; }
}

pg_stop() { as_pg "$PG_BIN/pg_ctl" -D "$1/data" -m fast -w stop >/dev/null 2>&1 || true; }
