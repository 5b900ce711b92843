#!/usr/bin/env bash
# `npm run bench`: the log-a-cut benchmark. Installs what is needed, starts a PostgreSQL of its
# own with durable commits (fsync and synchronous_commit on, as in production; KERFBOOK_PG_FAST
# is switched off here), builds the app when .output is missing or older than the sources, and
# runs scripts/bench-cuts.ts: the route over HTTP with autocannon, then the same statements
# straight to PostgreSQL with pgbench. Stops everything it started when it ends.
# Settings: KERFBOOK_BENCH_PG_PORT (55450), KERFBOOK_BENCH_APP_PORT (3350), KERFBOOK_BENCH_SECONDS (15),
#           KERFBOOK_BENCH_WARMUP_SECONDS (3), KERFBOOK_BENCH_CONNECTIONS (32), KERFBOOK_BENCH_CUTTERS (256),
#           KERFBOOK_BENCH_MACHINES (4), KERFBOOK_BENCH_PGBENCH_MODE (prepared), NUXT_DATABASE_POOL_SIZE.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install.sh

export KERFBOOK_BENCH_PG_PORT=${KERFBOOK_BENCH_PG_PORT:-55450}
export KERFBOOK_PG_PORT=$KERFBOOK_BENCH_PG_PORT
unset KERFBOOK_PG_FAST
trap 'bash scripts/pg.sh stop >/dev/null 2>&1 || true' EXIT
bash scripts/pg.sh start

# Rebuild when anything the build reads is newer than the last build.
stamp=.output/nitro.json
if [ ! -f "$stamp" ] || [ -n "$(find app.vue error.vue nuxt.config.ts tailwind.config.ts package-lock.json assets components composables \
    layouts middleware pages plugins public server shared stores utils -newer "$stamp" -type f -print -quit 2>/dev/null)" ]; then
  echo "[bench] building the app"
  mkdir -p .data
  npx nuxt build >.data/bench-build.log 2>&1 || { tail -n 40 .data/bench-build.log; exit 1; }
fi

node --import tsx scripts/bench-cuts.ts
