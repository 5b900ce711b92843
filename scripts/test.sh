#!/usr/bin/env bash
# `npm test`: installs what is needed (Chromium for the browser journeys in tests/e2e too), starts a PostgreSQL
# of its own (port 55433, separate data folder), type-checks, lints, builds, and runs every test.
# Ends with the test runner's summary.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install.sh

# The browser journeys drive Debian's Chromium (playwright-core brings no browser of its own).
if [ ! -x /usr/bin/chromium ]; then
  echo "[test] /usr/bin/chromium not found: installing Debian's chromium package"
  bash scripts/apt-install.sh chromium
fi

export KERFBOOK_PG_PORT=${KERFBOOK_TEST_PG_PORT:-55433}
export KERFBOOK_PG_FAST=1
export KERFBOOK_TEST_ADMIN_URL=postgres://postgres@127.0.0.1:$KERFBOOK_PG_PORT/postgres
trap 'bash scripts/pg.sh stop >/dev/null 2>&1 || true' EXIT
bash scripts/pg.sh start

echo "[test] type-checking"
npx nuxt typecheck
echo "[test] linting"
npx eslint .
echo "[test] building the app under test"
mkdir -p .data
npx nuxt build >.data/test-build.log 2>&1 || { tail -n 40 .data/test-build.log; exit 1; }

npx vitest run "$@"
