#!/usr/bin/env bash
# A private MariaDB for Spanproof: Debian's mariadb-server, data inside the project
# (git-ignored), listening on 127.0.0.1 only, started and stopped by its own pid file.
#
#   scripts/db.sh start|stop|status|sql [DB]
#
# Settings (environment): DB_DIR (default .data/db), DB_PORT (3307), DB_NAME (spanproof),
# DB_TEST_NAME (spanproof_test), DB_USER (spanproof, the owner: migrations, seed, backup),
# DB_PASSWORD (spanproof-local), DB_APP_USER (spanproof_app, what the app and worker connect as;
# scripts/migrate.ts gives it table-level grants), DB_APP_PASSWORD (spanproof-app-local).
set -euo pipefail
cd "$(dirname "$0")/.."
. scripts/db-accounts.sh

DB_DIR=${DB_DIR:-.data/db}
DB_PORT=${DB_PORT:-3307}
mkdir -p "$DB_DIR"
DB_DIR=$(cd "$DB_DIR" && pwd)
SOCK="$DB_DIR/mysqld.sock"
PIDF="$DB_DIR/mysqld.pid"

log() { printf '[db] %s\n' "$*"; }
die() { printf '[db] error: %s\n' "$*" >&2; exit 1; }

# A killed server stays a zombie until init reaps it (seconds in some containers): not running.
alive() { kill -0 "$1" 2>/dev/null && [[ "$(ps -o stat= -p "$1" 2>/dev/null)" != Z* ]]; }
running() { [ -f "$PIDF" ] && alive "$(cat "$PIDF")"; }
port_busy() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
as_root() { mariadb --no-defaults --socket="$SOCK" -uroot "$@"; }

ensure_installed() {
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] && return 0
  log "mariadb-server is not installed; installing Debian's package (needs root)"
  [ "$(id -u)" = 0 ] || die "run as root or install it yourself: apt-get install -y mariadb-server"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq && apt-get install -y -qq mariadb-server >/dev/null \
    || die "apt-get install mariadb-server failed"
  # Debian starts its own system instance on install; ours is separate, so stop that one.
  (service mariadb stop || true) >/dev/null 2>&1
}

start() {
  ensure_installed
  export PATH="$PATH:/usr/sbin"
  if running; then log "already running on 127.0.0.1:$DB_PORT (pid $(cat "$PIDF"))"; provision; return 0; fi
  if port_busy "$DB_PORT"; then
    die "port $DB_PORT on 127.0.0.1 is taken by another program; stop it or choose another port with DB_PORT=<port>"
  fi
  if [ ! -d "$DB_DIR/mysql/mysql" ]; then
    log "initialising a new data directory in $DB_DIR/mysql"
    mariadb-install-db --no-defaults --datadir="$DB_DIR/mysql" --user="$(id -un)" \
      --auth-root-authentication-method=socket --skip-test-db >"$DB_DIR/install.log" 2>&1 \
      || { cat "$DB_DIR/install.log" >&2; die "mariadb-install-db failed"; }
  fi
  # Durability is explicit: every commit flushed to the redo log, doublewrite on, binary log off
  # (if it is ever switched on, sync_binlog=1 must go with it).
  mariadbd --no-defaults --datadir="$DB_DIR/mysql" --socket="$SOCK" --pid-file="$PIDF" \
    --port="$DB_PORT" --bind-address=127.0.0.1 --user="$(id -un)" --log-error="$DB_DIR/mysqld.err" \
    --skip-name-resolve --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-flush-log-at-trx-commit=1 --innodb-doublewrite=1 --skip-log-bin --sync-binlog=1 \
    --innodb-buffer-pool-size=256M --max-connections=300 --performance-schema=OFF \
    >/dev/null 2>&1 &
  for _ in $(seq 1 150); do
    if mariadb-admin --no-defaults --socket="$SOCK" -uroot ping >/dev/null 2>&1; then break; fi
    sleep 0.2
  done
  mariadb-admin --no-defaults --socket="$SOCK" -uroot ping >/dev/null 2>&1 \
    || { tail -20 "$DB_DIR/mysqld.err" >&2; die "MariaDB did not start (log: $DB_DIR/mysqld.err)"; }
  log "running on 127.0.0.1:$DB_PORT (pid $(cat "$PIDF"))"
  provision
}

provision() {
  { accounts_sql; echo "FLUSH PRIVILEGES;"; } | as_root
}

stop() {
  if ! running; then log "not running"; return 0; fi
  local pid; pid=$(cat "$PIDF")
  kill -TERM "$pid"
  for _ in $(seq 1 100); do alive "$pid" || { log "stopped"; return 0; }; sleep 0.1; done
  die "MariaDB (pid $pid) did not stop within 10 s"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then log "running on 127.0.0.1:$DB_PORT (pid $(cat "$PIDF"))"; else log "not running"; exit 1; fi ;;
  sql) shift; as_root "${1:-$DB_NAME}" ;;
  *) echo "usage: scripts/db.sh start|stop|status|sql [DB]" >&2; exit 2 ;;
esac
