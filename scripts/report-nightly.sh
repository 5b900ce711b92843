#!/usr/bin/env bash
# Runs the nightly tooling report task now on the app that `npm start` serves, with the task
# token from .env. Only shops whose local report time has passed and that have not had today's
# report are sent one, exactly as the schedule would.
set -euo pipefail
cd "$(dirname "$0")/.."
set -a; . ./.env; set +a
url=${NUXT_PUBLIC_BASE_URL:-http://127.0.0.1:${PORT:-3000}}
node -e "
  fetch(process.argv[1] + '/api/tasks/report-nightly', { method: 'POST', headers: { authorization: 'Bearer ' + process.env.NUXT_TASK_TOKEN } })
    .then(async (r) => { console.log(r.status, JSON.stringify(await r.json(), null, 2)); process.exit(r.ok ? 0 : 1) })
    .catch((e) => { console.error('The app does not answer at ' + process.argv[1] + ': start it with npm start.', e.message); process.exit(1) })
" "$url"
