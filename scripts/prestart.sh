#!/usr/bin/env bash
# Runs before anything needs node_modules: installs npm packages and MariaDB when they are missing.
set -euo pipefail
cd "$(dirname "$0")/.."

stamp=node_modules/.tightloop-lock
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -d node_modules ] || [ "$(cat "$stamp" 2>/dev/null || true)" != "$want" ]; then
  echo "Installing npm packages…"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; else
    echo "Tightloop needs '$*' but is not running as root." >&2
    echo "Install it yourself (as root), or set DATABASE_URL to an existing MariaDB." >&2
    exit 1
  fi
}

need_pkg() { # need_pkg <binary path> <debian package>
  local bin=$1 pkg=$2
  if ! command -v "$bin" >/dev/null 2>&1 && [ ! -e "$bin" ]; then
    echo "Installing Debian package $pkg…"
    if [ -z "${TIGHTLOOP_APT_UPDATED:-}" ]; then as_root apt-get update -qq; export TIGHTLOOP_APT_UPDATED=1; fi
    as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$pkg" >/dev/null
  fi
}

if [ -z "${DATABASE_URL:-}" ] || [ "${1:-}" = "--test" ]; then
  need_pkg /usr/sbin/mariadbd mariadb-server
fi
if [ "${1:-}" = "--test" ]; then
  need_pkg /usr/bin/chromium chromium
fi
# `npm run cluster` and `test:cluster`: Galera (with mariadb-server), rsync and ss for its state transfers, HAProxy.
if [ "${1:-}" = "--cluster" ]; then
  need_pkg /usr/sbin/mariadbd mariadb-server
  need_pkg /usr/lib/galera/libgalera_smm.so galera-4
  need_pkg rsync rsync
  need_pkg ss iproute2
  need_pkg /usr/sbin/haproxy haproxy
fi
