#!/usr/bin/env bash
# npm start: install what is missing, start MariaDB and the fakes, migrate, seed, build, serve.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/bootstrap.sh
ensure_node_modules
ensure_mariadb "${DATABASE_URL:-}"
exec node --import tsx scripts/stack.ts start "$@"
