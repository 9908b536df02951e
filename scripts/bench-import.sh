#!/usr/bin/env bash
# `npm run bench:import`: the import benchmark on the development instance (started if need be).
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
bash scripts/services.sh start dev
export FRACTILE_ENV_FILE="$ROOT/.env"
npx tsx scripts/migrate.ts up
npx tsx scripts/seed.ts --if-empty
say "building the app (the benchmark runs the built server)"
npx vite build >"$LOCAL_DIR/build-bench.log" 2>&1 || { tail -30 "$LOCAL_DIR/build-bench.log"; die "build failed"; }
exec npx tsx tests/bench/import.bench.ts
