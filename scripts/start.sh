#!/usr/bin/env bash
# `npm start`: everything the demo needs, from a fresh clone, then the app on http://127.0.0.1:3000.
# Installs dependencies, starts PostgreSQL and the mail catcher, migrates, seeds the demo shop
# into an empty database, builds and serves. Ctrl-C stops all of it, PostgreSQL included.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install.sh

# A session password of our own, made once and kept out of git.
touch .env
if ! grep -q '^NUXT_SESSION_PASSWORD=' .env; then
  echo "NUXT_SESSION_PASSWORD=$(node -e 'console.log(require("crypto").randomBytes(32).toString("hex"))')" >> .env
fi
if ! grep -q '^NUXT_TASK_TOKEN=' .env; then
  echo "NUXT_TASK_TOKEN=$(node -e 'console.log(require("crypto").randomBytes(24).toString("hex"))')" >> .env
fi
set -a; . ./.env; set +a

export KERFBOOK_PG_PORT=${KERFBOOK_PG_PORT:-55432}
export NUXT_DATABASE_URL=${NUXT_DATABASE_URL:-postgres://postgres@127.0.0.1:$KERFBOOK_PG_PORT/kerfbook}
export KERFBOOK_SMTP_PORT=${KERFBOOK_SMTP_PORT:-2525}
export KERFBOOK_MAIL_WEB_PORT=${KERFBOOK_MAIL_WEB_PORT:-2580}
export NUXT_SMTP_HOST=${NUXT_SMTP_HOST:-127.0.0.1}
export NUXT_SMTP_PORT=${NUXT_SMTP_PORT:-$KERFBOOK_SMTP_PORT}
export NUXT_SMTP_FROM=${NUXT_SMTP_FROM:-Kerfbook <kerfbook@example.com>}
export HOST=${HOST:-127.0.0.1}
export PORT=${PORT:-3000}
export NUXT_PUBLIC_BASE_URL=${NUXT_PUBLIC_BASE_URL:-http://$HOST:$PORT}
export KERFBOOK_MAIL_DIR=${KERFBOOK_MAIL_DIR:-.data/mail}

children=()
cleanup() {
  trap - EXIT INT TERM
  for pid in "${children[@]}"; do kill "$pid" 2>/dev/null || true; done
  wait 2>/dev/null || true
  bash scripts/pg.sh stop || true
}
trap cleanup EXIT INT TERM

mkdir -p .data
bash scripts/pg.sh start kerfbook
node --import tsx scripts/migrate.ts latest
shops=$(node --import tsx -e "
  import('./server/db/connect.ts').then(async ({ connect }) => {
    const db = connect(process.env.NUXT_DATABASE_URL, 1)
    const r = await db.selectFrom('shops').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()
    console.log(r.n); await db.destroy()
  })")
if [ "$shops" = 0 ]; then node --import tsx scripts/seed.ts; fi

# Waits until a URL answers; fails when the process serving it has exited.
wait_http() {
  local url=$1 pid=$2 what=$3
  for _ in $(seq 1 300); do
    if ! kill -0 "$pid" 2>/dev/null; then echo "[start] the $what stopped at start-up (see above)" >&2; exit 1; fi
    node -e "fetch(process.argv[1]).then(() => process.exit(0), () => process.exit(1))" "$url" && return 0
    sleep 0.3
  done
  echo "[start] the $what did not answer at $url" >&2
  exit 1
}

node --import tsx scripts/mail-catcher.ts &
children+=($!)
wait_http "http://127.0.0.1:$KERFBOOK_MAIL_WEB_PORT/messages.json" "$!" "mail catcher"

echo "[build] building the app"
npx nuxt build >.data/build.log 2>&1 || { tail -n 40 .data/build.log; exit 1; }

node .output/server/index.mjs &
children+=($!)
wait_http "http://$HOST:$PORT/login" "$!" "app"

cat <<TXT

  Kerfbook is running:      $NUXT_PUBLIC_BASE_URL
  Demo sign-ins (password kerfbook-demo):
    owner@example.com       owner
    crib@example.com        crib manager
    operator@example.com    operator (also operator2@ and operator3@)
  Caught e-mail:            http://127.0.0.1:$KERFBOOK_MAIL_WEB_PORT/  (and .eml files in $KERFBOOK_MAIL_DIR)
  Nightly report by hand:   npm run report:nightly
  Stop with Ctrl-C.

TXT
wait -n "${children[@]}"
