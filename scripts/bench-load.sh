#!/usr/bin/env bash
# `npm run bench:load`: the built app under mixed load on loopback (tests/bench/load.bench.ts).
# Uses the test instance (a fresh database with the demo scenario), builds the app, starts it on
# the test port, runs the bench, and stops what it started. BENCH_SECONDS sets the 20- and 50-user
# runs' length, BENCH_LONG_SECONDS the 100-user run's, BENCH_RUNS picks runs (users:seconds,...).
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"

cleanup() {
	local code=$?
	if pid_alive "${APP_PID:-}"; then kill "$APP_PID" 2>/dev/null || true; wait "$APP_PID" 2>/dev/null || true; fi
	bash scripts/services.sh stop test >/dev/null 2>&1 || true
	exit "$code"
}
trap cleanup EXIT INT TERM

bash scripts/db.sh recreate test
bash scripts/services.sh start test
load_env "$ROOT/.env.test"
export FRACTILE_ENV_FILE="$ROOT/.env.test"
npx tsx scripts/migrate.ts up >/dev/null
npx tsx scripts/seed.ts --reset >/dev/null
say "building the app"
npx vite build >"$LOCAL_DIR/build-bench.log" 2>&1 || { tail -30 "$LOCAL_DIR/build-bench.log"; die "build failed"; }
WEB_CONCURRENCY="${WEB_CONCURRENCY:-1}" node --env-file="$ROOT/.env.test" scripts/serve.mjs >"$LOCAL_DIR/app-bench.log" 2>&1 &
APP_PID=$!
wait_for_port "$PORT" "the built app"
export APP_URL="$ORIGIN" BENCH_APP_PID="$APP_PID"
npx tsx tests/bench/load.bench.ts
