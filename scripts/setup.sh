#!/usr/bin/env bash
# Installs whatever this machine lacks for Perpend: MariaDB from Debian's packages, node_modules from the
# lock file, and (with --browser) Debian's Chromium plus poppler for the browser and PDF tests.
#   scripts/setup.sh [--browser]
set -euo pipefail
cd "$(dirname "$0")/.."

need_apt=()
command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || need_apt+=(mariadb-server mariadb-client)
if [ "${1:-}" = "--browser" ]; then
  [ -x /usr/bin/chromium ] || need_apt+=(chromium)
  command -v pdftoppm >/dev/null 2>&1 || need_apt+=(poppler-utils)
fi
if [ ${#need_apt[@]} -gt 0 ]; then
  echo "Installing from Debian's packages: ${need_apt[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends "${need_apt[@]}" >/dev/null
fi
export PATH="/usr/sbin:$PATH"

# node_modules is stale when the lock file changed since the last install.
lock_hash="$(sha256sum package-lock.json | cut -d' ' -f1)"
stamp="node_modules/.perpend-lock-sha256"
if [ ! -d node_modules ] || [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$lock_hash" ]; then
  echo "Installing node_modules with npm ci"
  npm ci --no-audit --no-fund
  echo "$lock_hash" > "$stamp"
fi
