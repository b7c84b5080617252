#!/usr/bin/env bash
# Installs what Spoolwright needs on this machine, once: Debian packages (as root, with apt-get)
# and npm packages (npm ci when node_modules is missing or older than package-lock.json).
# Usage: scripts/ensure-deps.sh [--test]   (--test adds the browser and PDF tools the tests use)
set -euo pipefail
cd "$(dirname "$0")/.."

need=()
command -v redis-server >/dev/null 2>&1 || need+=(redis-server)
command -v redis-cli >/dev/null 2>&1 || need+=(redis-tools)
ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || need+=(postgresql)
command -v runuser >/dev/null 2>&1 || need+=(util-linux)
if [[ "${1:-}" == "--test" ]]; then
  command -v chromium >/dev/null 2>&1 || need+=(chromium)
  command -v pdftotext >/dev/null 2>&1 || need+=(poppler-utils)
  command -v zbarimg >/dev/null 2>&1 || need+=(zbar-tools)
fi

if ((${#need[@]})); then
  if [[ $(id -u) -ne 0 ]]; then
    echo "spoolwright: missing Debian packages: ${need[*]} — install them (sudo apt-get install ${need[*]}) and run again." >&2
    exit 1
  fi
  echo "spoolwright: installing Debian packages: ${need[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq >/dev/null
  apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi

# The Debian package starts its own cluster on 5432; ours runs separately, so leave that one alone.

stamp=node_modules/.spoolwright-lock
if [[ ! -d node_modules || ! -f $stamp ]] || ! cmp -s package-lock.json "$stamp"; then
  echo "spoolwright: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
  cp package-lock.json "$stamp"
fi
