#!/usr/bin/env bash
# `npm run bench:site`: on-site entry's figures on the development instance (started if need be):
# the site page's JavaScript (gzipped) and a sync of 5,000 readings beside the CSV import path.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
bash scripts/services.sh start dev
export FRACTILE_ENV_FILE="${FRACTILE_ENV_FILE:-$ROOT/.env}"
npx tsx scripts/migrate.ts up
npx tsx scripts/seed.ts --if-empty
if [ "${BENCH_SKIP_BUILD:-}" != 1 ]; then
	say "building the app (the benchmark runs the built server and measures its client chunks)"
	npx vite build >"$LOCAL_DIR/build-bench.log" 2>&1 || { tail -30 "$LOCAL_DIR/build-bench.log"; die "build failed"; }
fi
exec npx tsx tests/bench/site.bench.ts
