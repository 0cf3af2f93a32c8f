# Shared by start.sh and test.sh: install what a fresh Debian machine with only Node.js lacks.
# shellcheck shell=bash

say() { printf '\n\033[1m[spanproof] %s\033[0m\n' "$*"; }
fail() { printf '[spanproof] error: %s\n' "$*" >&2; exit 1; }

apt_install() {
  [ "$(id -u)" = 0 ] || fail "missing Debian packages ($*); run as root or: sudo apt-get install -y $*"
  export DEBIAN_FRONTEND=noninteractive
  if [ -z "${APT_UPDATED:-}" ]; then apt-get update -qq >/dev/null || fail "apt-get update failed"; APT_UPDATED=1; fi
  apt-get install -y -qq "$@" >/dev/null || fail "apt-get install $* failed"
}

ensure_system_packages() {
  local need=()
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || need+=(mariadb-server)
  if [ "${WITH_BROWSER:-0}" = 1 ]; then command -v chromium >/dev/null 2>&1 || need+=(chromium); fi
  if [ "${WITH_CLUSTER:-0}" = 1 ]; then
    [ -f /usr/lib/galera/libgalera_smm.so ] || need+=(galera-4)
    command -v rsync >/dev/null 2>&1 || need+=(rsync)
    command -v socat >/dev/null 2>&1 || need+=(socat)
  fi
  if [ ${#need[@]} -gt 0 ]; then
    say "installing Debian packages: ${need[*]}"
    apt_install "${need[@]}"
    (service mariadb stop || true) >/dev/null 2>&1
  fi
}

ensure_node_modules() {
  node -e 'const [a,b]=process.versions.node.split(".").map(Number); process.exit(a>20||(a===20&&b>=19)?0:1)' \
    || fail "Node.js 20.19 or newer is needed (found $(node -v))"
  local stamp=node_modules/.spanproof-lock
  if [ ! -f "$stamp" ] || ! cmp -s package-lock.json "$stamp"; then
    say "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error || fail "npm ci failed"
    cp package-lock.json "$stamp"
  fi
}

port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
require_port() { port_free "$1" || fail "port $1 on 127.0.0.1 is taken ($2); stop whatever uses it or set $3 to another port"; }

wait_http() {
  local url=$1 what=$2
  for _ in $(seq 1 150); do
    if node -e "fetch('$url').then(r=>process.exit(r.status<500?0:1)).catch(()=>process.exit(1))" 2>/dev/null; then return 0; fi
    sleep 0.4
  done
  fail "$what did not answer at $url"
}

TSX_SERVER=(node_modules/.bin/tsx --conditions=react-server)
