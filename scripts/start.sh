#!/usr/bin/env bash
# One command: install what is missing, start MariaDB, the mail receiver, the worker and the
# app at http://127.0.0.1:3000 with demo data. Ctrl-C stops everything it started.
set -euo pipefail
cd "$(dirname "$0")/.."
. scripts/lib.sh

ensure_system_packages
ensure_node_modules

if [ ! -f .env ]; then
  say "writing .env with local defaults (edit it to change settings)"
  secret=$(node -e 'console.log(require("crypto").randomBytes(32).toString("base64url"))')
  sed "s|^AUTH_SECRET=.*|AUTH_SECRET=$secret|" .env.example > .env
fi
set -a; . ./.env; set +a
PORT=${PORT:-3000}
MAIL_HTTP_PORT=${MAIL_HTTP_PORT:-2580}
PAYMENTS_PORT=${PAYMENTS_PORT:-12111}
node_modules/.bin/tsx scripts/check-env.ts || exit 1

require_port "$PORT" "the app" PORT
require_port "$SMTP_PORT" "the mail receiver" SMTP_PORT
require_port "$MAIL_HTTP_PORT" "the mailbox API" MAIL_HTTP_PORT
# The local fake of the payment provider runs unless PAYMENTS_API_URL points elsewhere.
fake_payments=0
[ "${PAYMENTS_API_URL:-http://127.0.0.1:$PAYMENTS_PORT}" = "http://127.0.0.1:$PAYMENTS_PORT" ] && fake_payments=1
[ "$fake_payments" = 1 ] && require_port "$PAYMENTS_PORT" "the local payment provider" PAYMENTS_PORT

pids=()
db_started=0
cleanup() {
  trap - INT TERM EXIT
  say "stopping"
  for p in "${pids[@]}"; do kill -TERM "$p" 2>/dev/null || true; done
  wait 2>/dev/null || true
  [ "$db_started" = 1 ] && scripts/db.sh stop
}
trap cleanup INT TERM EXIT

scripts/db.sh status >/dev/null 2>&1 || db_started=1
scripts/db.sh start
"${TSX_SERVER[@]}" scripts/migrate.ts
# The seed writes as the owner; the app and the worker connect as DATABASE_URL (the app account).
DATABASE_URL=${MIGRATION_DATABASE_URL:-$DATABASE_URL} "${TSX_SERVER[@]}" db/seed.ts

if [ "${SKIP_BUILD:-0}" != 1 ]; then
  say "building the app (next build)"
  npm run --silent build >.data/build.log 2>&1 || { tail -40 .data/build.log; fail "next build failed"; }
fi

MAIL_HTTP_PORT=$MAIL_HTTP_PORT node_modules/.bin/tsx scripts/mail-receiver.ts & pids+=($!)
"${TSX_SERVER[@]}" scripts/worker.ts & pids+=($!)
if [ "$fake_payments" = 1 ]; then
  PAYMENTS_PORT=$PAYMENTS_PORT PAYMENTS_WEBHOOK_URL="http://127.0.0.1:$PORT/api/payments/webhook" node_modules/.bin/tsx scripts/fake-payments.ts & pids+=($!)
fi
node node_modules/next/dist/bin/next start --hostname 127.0.0.1 --port "$PORT" & pids+=($!)
wait_http "http://127.0.0.1:$PORT/sign-in" "the app"

say "Spanproof is running at http://127.0.0.1:$PORT  (demo accounts in README.md; Ctrl-C stops it)"
wait -n "${pids[@]}" || true
