#!/usr/bin/env bash
# `npm test`: the whole suite on a throwaway database, from a fresh clone if need be.
# Order: install, services (test instance), migrations, type check, format check and lint, unit tests,
# build, the built app on its test port, integration and browser tests. Stops what it started.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
ensure_debian_package chromium chromium
ensure_debian_package pdftotext poppler-utils

cleanup() {
	local code=$?
	if pid_alive "${APP_PID:-}"; then
		kill "$APP_PID" 2>/dev/null || true
		# A graceful stop takes a moment; one that does not come within 15 s is forced.
		for _ in $(seq 1 75); do pid_alive "$APP_PID" || break; sleep 0.2; done
		pid_alive "$APP_PID" && kill -9 "$APP_PID" 2>/dev/null || true
	fi
	bash scripts/services.sh stop test >/dev/null 2>&1 || true
	bash scripts/replication.sh stop >/dev/null 2>&1 || true
	bash scripts/cluster.sh stop >/dev/null 2>&1 || true
	exit "$code"
}
trap cleanup EXIT INT TERM

# A fresh database each run: nothing from an earlier run can make a test pass.
bash scripts/db.sh recreate test
bash scripts/services.sh start test
load_env "$ROOT/.env.test"
export FRACTILE_ENV_FILE="$ROOT/.env.test"
rm -rf "$MAIL_FAKE_DIR"/*
npx tsx scripts/migrate.ts up
# The demo scenario is the integration tests' fixture: the same invented data a newcomer sees.
npx tsx scripts/seed.ts --reset >/dev/null

say "type check (svelte-check)"
npm run --silent check
say "format check (prettier) and lint (eslint)"
npm run --silent lint

say "unit tests"
npx vitest run --project unit

say "building the app"
npx vite build >"$LOCAL_DIR/build-test.log" 2>&1 || { tail -30 "$LOCAL_DIR/build-test.log"; die "build failed"; }
node --env-file="$ROOT/.env.test" build >"$LOCAL_DIR/app-test.log" 2>&1 &
APP_PID=$!
wait_for_port "$PORT" "the built app"
export APP_URL="$ORIGIN"

# The primary/replica pair for the test of several app processes (docs/scaling.md).
bash scripts/replication.sh start
# The three-node Galera cluster for the test of a node killed under two app processes.
bash scripts/cluster.sh start

say "integration tests (real MariaDB, the built app over HTTP)"
npx vitest run --project integration
if compgen -G "tests/browser/*.test.ts" >/dev/null; then
	say "browser tests (Debian's chromium)"
	npx vitest run --project browser
fi
say "all tests passed"
