#!/usr/bin/env bash
# Installs one of Debian's packages for Kerfbook's own scripts: as root, else through sudo.
#   scripts/apt-install.sh <package>
set -euo pipefail
package=$1
sudo=""
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1; then sudo="sudo"; else
    echo "not root and no sudo: install the '$package' package, then run this again" >&2
    exit 1
  fi
fi
$sudo apt-get update -qq
DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq "$package" >/dev/null
