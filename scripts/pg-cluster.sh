#!/usr/bin/env bash
# A throw-away PostgreSQL cluster for the PostgreSQL test tier, from Debian's
# `postgresql` package, run as the `postgres` user on a free loopback port.
#
#   scripts/pg-cluster.sh start   → prints  export CYCLODIAL_TEST_PG_URL=postgres://…
#   scripts/pg-cluster.sh stop    → stops it and removes its folder
#   scripts/pg-cluster.sh status
#
# The cluster lives in $PG_CLUSTER_DIR (default /tmp/cyclodial-pg). It trusts only
# connections from loopback (it is for tests; nothing listens elsewhere). Installs
# the package when initdb is missing (needs root, or sudo).
set -euo pipefail

DIR="${PG_CLUSTER_DIR:-/tmp/cyclodial-pg}"
STATE="$DIR/port"

pg_bin() {
  local v
  for v in $(ls -1 /usr/lib/postgresql 2>/dev/null | sort -rn); do
    if [ -x "/usr/lib/postgresql/$v/bin/initdb" ]; then echo "/usr/lib/postgresql/$v/bin"; return; fi
  done
}

as_postgres() {
  if [ "$(id -un)" = postgres ]; then "$@"
  elif [ "$(id -u)" -eq 0 ]; then
    if command -v runuser >/dev/null 2>&1; then runuser -u postgres -- "$@"; else su postgres -s /bin/sh -c "$(printf '%q ' "$@")"; fi
  else sudo -u postgres "$@"
  fi
}

ensure_installed() {
  if [ -z "$(pg_bin)" ]; then
    echo "--- installing Debian's postgresql" >&2
    local SUDO=""
    if [ "$(id -u)" -ne 0 ] && command -v sudo >/dev/null 2>&1; then SUDO="sudo"; fi
    export DEBIAN_FRONTEND=noninteractive
    $SUDO apt-get install -y --no-install-recommends postgresql >&2 \
      || { $SUDO apt-get update >&2 && $SUDO apt-get install -y --no-install-recommends postgresql >&2; }
  fi
  # Debian's package creates a cluster of its own and may start it: ours is separate
  # and never touches it.
}

free_port() {
  node -e "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})"
}

url_for() { echo "postgres://postgres@127.0.0.1:$1/postgres"; }

start() {
  ensure_installed
  local BIN; BIN="$(pg_bin)"
  if [ -f "$STATE" ] && as_postgres "$BIN/pg_ctl" -D "$DIR/data" status >/dev/null 2>&1; then
    echo "export CYCLODIAL_TEST_PG_URL=$(url_for "$(cat "$STATE")")"
    return
  fi
  rm -rf "$DIR"
  mkdir -p "$DIR"
  chown postgres "$DIR" 2>/dev/null || true
  as_postgres "$BIN/initdb" -D "$DIR/data" -U postgres --auth=trust --encoding=UTF8 --locale=C.UTF-8 >"$DIR/initdb.log" 2>&1 \
    || as_postgres "$BIN/initdb" -D "$DIR/data" -U postgres --auth=trust --encoding=UTF8 --locale=C >"$DIR/initdb.log" 2>&1
  local PORT; PORT="$(free_port)"
  # Test settings: loopback only, no durability (a crash loses a throw-away cluster),
  # enough connections for two instances' pools and the tests' own clients.
  as_postgres "$BIN/pg_ctl" -D "$DIR/data" -l "$DIR/server.log" -w -t 60 start \
    -o "-c listen_addresses=127.0.0.1 -p $PORT -k $DIR -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200" >/dev/null
  echo "$PORT" >"$STATE"
  echo "export CYCLODIAL_TEST_PG_URL=$(url_for "$PORT")"
}

stop() {
  local BIN; BIN="$(pg_bin)"
  if [ -n "$BIN" ] && [ -d "$DIR/data" ]; then
    as_postgres "$BIN/pg_ctl" -D "$DIR/data" -m fast -w stop >/dev/null 2>&1 || true
  fi
  rm -rf "$DIR"
}

status() {
  local BIN; BIN="$(pg_bin)"
  if [ -n "$BIN" ] && [ -f "$STATE" ] && as_postgres "$BIN/pg_ctl" -D "$DIR/data" status >/dev/null 2>&1; then
    echo "running: $(url_for "$(cat "$STATE")")"
  else
    echo "not running"; return 1
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) status ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 2 ;;
esac
