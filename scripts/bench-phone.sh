#!/usr/bin/env bash
# `npm run bench:phone`: how the cutter page feels on an operator's phone on a shop's network.
# Installs what is needed, starts a PostgreSQL of its own, builds the app when .output is missing
# or older than the sources, and runs scripts/bench-phone.ts (Chromium through playwright-core on a
# phone profile, then Lighthouse's mobile score). Stops everything it started when it ends.
# Settings: KERFBOOK_PHONE_PG_PORT (55453), KERFBOOK_PHONE_APP_PORT (3355), KERFBOOK_PHONE_RUNS (5),
#           KERFBOOK_CHROMIUM (/usr/bin/chromium), KERFBOOK_PHONE_LIGHTHOUSE (1; 0 skips it).
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install.sh
if [ ! -x "${KERFBOOK_CHROMIUM:-/usr/bin/chromium}" ]; then
  echo "[phone] Chromium not found: installing Debian's chromium package"
  bash scripts/apt-install.sh chromium
fi

export KERFBOOK_PHONE_PG_PORT=${KERFBOOK_PHONE_PG_PORT:-55453}
export KERFBOOK_PG_PORT=$KERFBOOK_PHONE_PG_PORT
export KERFBOOK_PG_FAST=1
trap 'bash scripts/pg.sh stop >/dev/null 2>&1 || true' EXIT
bash scripts/pg.sh start

stamp=.output/nitro.json
if [ ! -f "$stamp" ] || [ -n "$(find app.vue error.vue nuxt.config.ts tailwind.config.ts package-lock.json assets components composables \
    layouts middleware pages plugins public server shared stores utils -newer "$stamp" -type f -print -quit 2>/dev/null)" ]; then
  echo "[phone] building the app"
  mkdir -p .data
  npx nuxt build >.data/phone-build.log 2>&1 || { tail -n 40 .data/phone-build.log; exit 1; }
fi

node --import tsx scripts/bench-phone.ts
