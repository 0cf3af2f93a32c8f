#!/usr/bin/env bash
# A private three-node MariaDB Galera cluster for Spanproof on 127.0.0.1: Debian's mariadb-server
# and galera-4, data inside the project (git-ignored), each node started by its own option file.
#
#   scripts/cluster.sh start|stop|status|kill N|restart N|sql N [DB]
#
# start      fresh: initialise node 1, bootstrap it, let nodes 2 and 3 copy it (rsync state
#            transfer); existing data: bootstrap from the node that may (safe_to_bootstrap, or the
#            most advanced one after a crash of all) and let the others catch up
# stop       graceful, node 1 last (so node 1 is the one that may bootstrap next time)
# kill N     kill -9 node N (for crash tests)
# restart N  stop N if it runs; after a crash recover its position (--wsrep-recover) and start
#            with --wsrep-start-position so it catches up incrementally (IST); waits until Synced
# sql N      a root client on node N's socket
#
# Settings (environment): CLUSTER_DIR (.data/cluster), CLUSTER_SQL_PORTS (3431,3432,3433),
# CLUSTER_GCOMM_PORTS (4567,4577,4587; IST listens on gcomm+1, rsync state transfer on gcomm+2),
# DB_NAME (spanproof), DB_TEST_NAME (spanproof_test), DB_USER (spanproof, the owner), DB_PASSWORD
# (spanproof-local), DB_APP_USER (spanproof_app, what the app connects as), DB_APP_PASSWORD (spanproof-app-local)
# — the same accounts as scripts/db.sh.
set -euo pipefail
cd "$(dirname "$0")/.."
. scripts/db-accounts.sh
ROOT=$(pwd)

CLUSTER_DIR=${CLUSTER_DIR:-.data/cluster}
IFS=, read -r -a SQL_PORTS <<<"${CLUSTER_SQL_PORTS:-3431,3432,3433}"
IFS=, read -r -a GCOMM_PORTS <<<"${CLUSTER_GCOMM_PORTS:-4567,4577,4587}"
PROVIDER=/usr/lib/galera/libgalera_smm.so
NODES=(1 2 3)
export PATH="$PATH:/usr/sbin"

log() { printf '[cluster] %s\n' "$*"; }
die() { printf '[cluster] error: %s\n' "$*" >&2; exit 1; }

[ ${#SQL_PORTS[@]} = 3 ] || die "CLUSTER_SQL_PORTS must list three ports, e.g. 3431,3432,3433 (got '${CLUSTER_SQL_PORTS:-}')"
[ ${#GCOMM_PORTS[@]} = 3 ] || die "CLUSTER_GCOMM_PORTS must list three ports, e.g. 4567,4577,4587 (got '${CLUSTER_GCOMM_PORTS:-}')"
for p in "${SQL_PORTS[@]}" "${GCOMM_PORTS[@]}"; do
  [[ "$p" =~ ^[0-9]+$ ]] && [ "$p" -ge 1024 ] && [ "$p" -le 65533 ] || die "'$p' is not a usable port (1024–65533)"
done

mkdir -p "$CLUSTER_DIR"
CLUSTER_DIR=$(cd "$CLUSTER_DIR" && pwd)

valid_node() { [[ "${1:-}" =~ ^[123]$ ]] || die "node must be 1, 2 or 3 (got '${1:-}')"; }
ndir() { echo "$CLUSTER_DIR/n$1"; }
cnf() { echo "$(ndir "$1")/my.cnf"; }
sock() { echo "$(ndir "$1")/mysqld.sock"; }
pidf() { echo "$(ndir "$1")/mysqld.pid"; }
datadir() { echo "$(ndir "$1")/data"; }
sqlport() { echo "${SQL_PORTS[$(($1 - 1))]}"; }
gport() { echo "${GCOMM_PORTS[$(($1 - 1))]}"; }
pid_of() { [ -f "$(pidf "$1")" ] && cat "$(pidf "$1")"; }
# A killed server stays a zombie until init reaps it (seconds in some containers): not running.
alive() { kill -0 "$1" 2>/dev/null && [[ "$(ps -o stat= -p "$1" 2>/dev/null)" != Z* ]]; }
running() { local p; p=$(pid_of "$1" 2>/dev/null) && [ -n "$p" ] && alive "$p"; }
port_busy() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
as_root() { local n=$1; shift; mariadb --no-defaults --socket="$(sock "$n")" -uroot "$@"; }
status_var() { as_root "$1" -N -B -e "SHOW GLOBAL STATUS LIKE '$2'" 2>/dev/null | awk '{print $2}'; }

# Debian's mariadb-server, galera-4, rsync and socat (state transfer), installed when missing.
ensure_installed() {
  # shellcheck source=scripts/lib.sh
  . "$ROOT/scripts/lib.sh"
  WITH_CLUSTER=1 ensure_system_packages
}

write_cnf() {
  local n=$1 g; g=$(gport "$n")
  local members="127.0.0.1:${GCOMM_PORTS[0]},127.0.0.1:${GCOMM_PORTS[1]},127.0.0.1:${GCOMM_PORTS[2]}"
  mkdir -p "$(datadir "$n")" "$(ndir "$n")/tmp"
  cat >"$(cnf "$n")" <<CNF
# Written by scripts/cluster.sh; regenerated on every start.
[mysqld]
user=mysql
datadir=$(datadir "$n")
socket=$(sock "$n")
pid-file=$(pidf "$n")
# Its own temporary folder: names in a shared /tmp can collide with other instances on the machine.
tmpdir=$(ndir "$n")/tmp
log-error=$(ndir "$n")/mysqld.err
port=$(sqlport "$n")
bind-address=127.0.0.1
skip-name-resolve
performance-schema=OFF
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
max-connections=300
innodb-buffer-pool-size=64M
innodb-flush-log-at-trx-commit=1
binlog-format=ROW
default-storage-engine=InnoDB
# Galera needs interleaved auto-increment locks; ids then step by the cluster size.
innodb-autoinc-lock-mode=2
wsrep-on=ON
wsrep-provider=$PROVIDER
wsrep-cluster-name=spanproof
wsrep-node-name=n$n
wsrep-cluster-address=gcomm://$members
wsrep-node-address=127.0.0.1:$g
# Short suspect timeout: a killed node stalls writes on the others ≈ 3–4 s, not the default 5–15 s.
wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:$g;ist.recv_addr=127.0.0.1:$((g + 1));gcache.size=32M;evs.suspect_timeout=PT3S;evs.inactive_timeout=PT6S"
wsrep-sst-method=rsync
wsrep-sst-receive-address=127.0.0.1:$((g + 2))

[sst]
sst-log-archive=0
CNF
  chmod 644 "$(cnf "$n")"
  # The state-transfer scripts run as mysql (rsync refuses to run as root): every parent must be traversable.
  chown -R mysql: "$(ndir "$n")"
  local d; d=$(ndir "$n")
  while [ "$d" != / ]; do chmod o+x "$d" 2>/dev/null || true; d=$(dirname "$d"); done
}

# Starts mariadbd detached; extra arguments go to it. Waits until it answers on its socket.
launch() {
  local n=$1; shift
  local p; p=$(sqlport "$n")
  if port_busy "$p"; then die "port $p on 127.0.0.1 (node $n) is taken by another program; choose others with CLUSTER_SQL_PORTS=a,b,c"; fi
  local g; g=$(gport "$n")
  for q in "$g" $((g + 1)) $((g + 2)); do
    port_busy "$q" && die "port $q on 127.0.0.1 (node $n gcomm/IST/state transfer) is taken; choose others with CLUSTER_GCOMM_PORTS=a,b,c"
  done
  setsid mariadbd --defaults-file="$(cnf "$n")" "$@" </dev/null >/dev/null 2>&1 &
  local child=$!
  for _ in $(seq 1 600); do
    if mariadb-admin --no-defaults --socket="$(sock "$n")" -uroot ping >/dev/null 2>&1; then return 0; fi
    alive "$child" || break
    sleep 0.2
  done
  tail -25 "$(ndir "$n")/mysqld.err" >&2 || true
  die "node $n did not start (log: $(ndir "$n")/mysqld.err)"
}

wait_synced() {
  local n=$1 state=""
  for _ in $(seq 1 600); do
    state=$(status_var "$n" wsrep_local_state_comment || true)
    if [ "$state" = Synced ] && [ "$(status_var "$n" wsrep_ready)" = ON ]; then return 0; fi
    running "$n" || break
    sleep 0.2
  done
  tail -25 "$(ndir "$n")/mysqld.err" >&2 || true
  die "node $n did not reach Synced (state '${state:-none}'; log: $(ndir "$n")/mysqld.err)"
}

# After a crash grastate.dat says seqno -1: ask InnoDB for the last committed position.
recover_position() {
  local n=$1 rlog; rlog="$(ndir "$n")/recover.log"
  rm -f "$rlog"
  mariadbd --defaults-file="$(cnf "$n")" --wsrep-recover --log-error="$rlog" </dev/null >/dev/null 2>&1 || true
  local pos; pos=$(grep -o 'Recovered position: [^ ]*' "$rlog" 2>/dev/null | tail -1 | awk '{print $3}')
  [ -n "$pos" ] || { tail -20 "$rlog" >&2 || true; die "node $n: --wsrep-recover found no position (log: $rlog)"; }
  echo "$pos"
}

grastate() { sed -n "s/^$2:[[:space:]]*//p" "$(datadir "$1")/grastate.dat" 2>/dev/null; }

# A node that stopped cleanly has its seqno in grastate.dat; one that crashed needs recovery.
start_args() {
  local n=$1
  if [ -f "$(datadir "$n")/grastate.dat" ] && [ "$(grastate "$n" seqno)" = -1 ]; then
    echo "--wsrep-start-position=$(recover_position "$n")"
  fi
}

cluster_size() { status_var "$1" wsrep_cluster_size; }

any_running() { for n in "${NODES[@]}"; do running "$n" && return 0; done; return 1; }

start() {
  ensure_installed
  for n in "${NODES[@]}"; do write_cnf "$n"; done
  if ! any_running; then
    local boot=""
    if [ ! -d "$(datadir 1)/mysql" ]; then
      log "initialising node 1 in $(datadir 1)"
      for n in 2 3; do rm -rf "$(datadir "$n")" && mkdir -p "$(datadir "$n")" && chown mysql: "$(datadir "$n")"; done
      mariadb-install-db --no-defaults --datadir="$(datadir 1)" --tmpdir="$(ndir 1)/tmp" --user=mysql \
        --auth-root-authentication-method=socket --skip-test-db >"$(ndir 1)/install.log" 2>&1 \
        || { cat "$(ndir 1)/install.log" >&2; rm -rf "$(datadir 1)"; die "mariadb-install-db failed (log above); nothing was kept, run start again"; }
      boot=1
      log "bootstrapping a new cluster from node 1"
      launch 1 --wsrep-new-cluster
    else
      boot=$(pick_bootstrap)
      local bargs; bargs=$(start_args "$boot")
      log "bootstrapping the cluster again from node $boot"
      # shellcheck disable=SC2086
      launch "$boot" --wsrep-new-cluster $bargs
    fi
    wait_synced "$boot"
    provision "$boot"
  fi
  for n in "${NODES[@]}"; do
    if running "$n"; then continue; fi
    local nargs; nargs=$(start_args "$n")
    log "starting node $n${nargs:+ ($nargs)}"
    # shellcheck disable=SC2086
    launch "$n" $nargs
  done
  for n in "${NODES[@]}"; do wait_synced "$n"; done
  local first; first=$(first_running)
  provision "$first"
  log "running: $(describe)"
}

# The node that may bootstrap: the one marked safe_to_bootstrap (the last one stopped), or,
# when every node crashed, the one with the highest recovered seqno.
pick_bootstrap() {
  for n in "${NODES[@]}"; do
    if [ "$(grastate "$n" safe_to_bootstrap)" = 1 ]; then echo "$n"; return; fi
  done
  local best="" bestseq=-2
  for n in "${NODES[@]}"; do
    [ -d "$(datadir "$n")/mysql" ] || continue
    local seq; seq=$(grastate "$n" seqno)
    if [ "$seq" = -1 ] || [ -z "$seq" ]; then seq=$(recover_position "$n" | sed 's/.*://'); fi
    if [ "$seq" -gt "$bestseq" ]; then best=$n; bestseq=$seq; fi
  done
  [ -n "$best" ] || die "no node has data to bootstrap from; remove $CLUSTER_DIR to start afresh"
  sed -i 's/^safe_to_bootstrap:.*/safe_to_bootstrap: 1/' "$(datadir "$best")/grastate.dat"
  echo "$best"
}

first_running() { for n in "${NODES[@]}"; do running "$n" && { echo "$n"; return; }; done; die "no node is running"; }

provision() {
  # Users and grants are replicated (total order isolation), so one node is enough.
  # The cluster checks of the tests and the benchmark read wsrep status variables.
  { accounts_sql; echo "GRANT PROCESS, REPLICATION CLIENT ON *.* TO '$DB_USER'@'127.0.0.1';"; echo "FLUSH PRIVILEGES;"; } | as_root "$1"
}

stop_node() {
  local n=$1
  running "$n" || return 0
  local pid; pid=$(pid_of "$n")
  kill -TERM "$pid"
  for _ in $(seq 1 300); do alive "$pid" || { log "node $n stopped"; return 0; }; sleep 0.1; done
  die "node $n (pid $pid) did not stop within 30 s"
}

stop() {
  any_running || { log "not running"; return 0; }
  for n in 3 2 1; do stop_node "$n"; done
}

kill_node() {
  local n=$1
  running "$n" || die "node $n is not running"
  local pid; pid=$(pid_of "$n")
  kill -9 "$pid"
  for _ in $(seq 1 100); do alive "$pid" || { log "node $n killed (pid $pid)"; return 0; }; sleep 0.05; done
  die "node $n (pid $pid) survived kill -9"
}

restart_node() {
  local n=$1
  [ -d "$(datadir "$n")/mysql" ] || die "node $n has no data yet; run scripts/cluster.sh start first"
  stop_node "$n"
  local others=0
  for m in "${NODES[@]}"; do [ "$m" != "$n" ] && running "$m" && others=1; done
  [ "$others" = 1 ] || die "no other node is running for node $n to join; use scripts/cluster.sh start"
  write_cnf "$n"
  local args; args=$(start_args "$n")
  log "starting node $n${args:+ ($args)}"
  local before; before=$(wc -l <"$(ndir "$n")/mysqld.err" 2>/dev/null || echo 0)
  # shellcheck disable=SC2086
  launch "$n" $args
  wait_synced "$n"
  local fresh how="up to date, nothing to transfer"
  fresh=$(tail -n +"$((before + 1))" "$(ndir "$n")/mysqld.err")
  if grep -q "rsync SST completed on joiner" <<<"$fresh"; then how="full state transfer"
  elif grep -q "IST received" <<<"$fresh"; then how="incremental state transfer"; fi
  log "node $n Synced again ($how); $(describe)"
}

describe() {
  local out=()
  for n in "${NODES[@]}"; do
    if running "$n"; then
      out+=("n$n 127.0.0.1:$(sqlport "$n") $(status_var "$n" wsrep_local_state_comment)")
    else
      out+=("n$n 127.0.0.1:$(sqlport "$n") down")
    fi
  done
  local size=""
  for n in "${NODES[@]}"; do running "$n" && { size=$(cluster_size "$n"); break; }; done
  local IFS=';'
  echo "${out[*]}; cluster size ${size:-0}"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) log "$(describe)"; any_running || exit 1 ;;
  kill) valid_node "${2:-}"; kill_node "$2" ;;
  restart) valid_node "${2:-}"; ensure_installed; restart_node "$2" ;;
  sql) valid_node "${2:-}"; running "$2" || die "node $2 is not running"; as_root "$2" "${3:-$DB_NAME}" ;;
  *) echo "usage: scripts/cluster.sh start|stop|status|kill N|restart N|sql N [DB]" >&2; exit 2 ;;
esac
