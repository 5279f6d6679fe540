#!/usr/bin/env bash
# npm test [-- pattern]: the same set-up on a test database and ports, then every test.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/bootstrap.sh
ensure_node_modules
ensure_mariadb "${TEST_DATABASE_URL:-}"
ensure_chromium
exec node --import tsx scripts/stack.ts test "$@"
