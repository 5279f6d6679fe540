#!/usr/bin/env bash
# npm run bench: speed targets live here, not in timed tests. First the arithmetic (vitest bench),
# then page weights and HTTP load against a fresh bench stack on its own ports (BENCH_PORT…).
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/bootstrap.sh
ensure_node_modules
node node_modules/vitest/vitest.mjs bench --run --project unit "$@"
ensure_mariadb "${BENCH_DATABASE_URL:-}"
ensure_chromium
exec node --import tsx scripts/stack.ts bench
