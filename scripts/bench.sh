#!/usr/bin/env bash
# npm run bench: speed targets live here, not in timed tests.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/bootstrap.sh
ensure_node_modules
exec node node_modules/vitest/vitest.mjs bench --run --project unit "$@"
