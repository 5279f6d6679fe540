#!/usr/bin/env bash
# What must exist before any Node code of ours can run: node_modules and the Debian packages.
# Plain bash only: node_modules may not be there yet.
set -euo pipefail

stamp_of_lock() {
  cat package.json package-lock.json | sha256sum | cut -d' ' -f1
}

ensure_node_modules() {
  local stamp_file=node_modules/.pomewright-lock-stamp
  local want
  want=$(stamp_of_lock)
  if [ ! -f "$stamp_file" ] || [ "$(cat "$stamp_file")" != "$want" ]; then
    echo "==> Installing npm packages (npm ci)"
    npm ci --no-audit --no-fund
    echo "$want" > "$stamp_file"
  fi
}

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

apt_updated=0
apt_install() {
  if [ "$(id -u)" != 0 ]; then
    echo "Pomewright needs the Debian packages: $* (run as root, or install them first)." >&2
    exit 1
  fi
  if [ "$apt_updated" = 0 ]; then
    apt-get update -q
    apt_updated=1
  fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -q --no-install-recommends "$@"
}

have_mariadb() {
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]
}

# $1: the database URL this run will use instead of a local server, if any.
ensure_mariadb() {
  if [ -n "${1:-}" ] || have_mariadb; then return 0; fi
  echo "==> Installing MariaDB from Debian's packages"
  local was_listening=0
  port_in_use 3306 && was_listening=1
  # Keep the package's own service from starting: we run our own server on our own port.
  local policy=/usr/sbin/policy-rc.d created_policy=0
  if [ ! -e "$policy" ]; then
    printf '#!/bin/sh\nexit 101\n' > "$policy"; chmod +x "$policy"; created_policy=1
  fi
  apt_install mariadb-server mariadb-client
  [ "$created_policy" = 1 ] && rm -f "$policy"
  if [ "$was_listening" = 0 ] && port_in_use 3306; then
    echo "==> Stopping the system MariaDB service the package started on 3306"
    (service mariadb stop || pkill -f 'mariadbd.*/var/lib/mysql' || true) >/dev/null 2>&1
  fi
}

ensure_chromium() {
  if command -v chromium >/dev/null 2>&1 || [ -n "${CHROMIUM_PATH:-}" ]; then return 0; fi
  echo "==> Installing Chromium from Debian's packages (browser tests)"
  apt_install chromium fonts-liberation
}
