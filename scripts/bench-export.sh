#!/usr/bin/env bash
# `npm run bench:export`: the research export benchmark on the test instance's MariaDB, against
# a fresh build. Starts the test services if they are not running and stops them if it did.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules

started=""
if ! bash scripts/db.sh status test >/dev/null 2>&1; then
	bash scripts/services.sh start test
	started=1
fi
cleanup() { [ -n "$started" ] && bash scripts/services.sh stop test >/dev/null 2>&1 || true; }
trap cleanup EXIT INT TERM

say "building the app"
npx vite build >"$LOCAL_DIR/build-bench.log" 2>&1 || { tail -30 "$LOCAL_DIR/build-bench.log"; die "build failed"; }
FRACTILE_ENV_FILE="$ROOT/.env.test" npx tsx tests/bench/export.bench.ts
