#!/usr/bin/env bash
# Installs the npm dependencies when package-lock.json has changed since the last install.
set -euo pipefail
cd "$(dirname "$0")/.."
stamp=node_modules/.kerfbook-lock
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
  echo "[install] installing npm dependencies (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi
