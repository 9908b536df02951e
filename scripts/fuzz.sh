#!/usr/bin/env bash
# A longer fuzzing run of the file and input readers than `npm test` makes (fast-check, seeded).
#   FUZZ_RUNS  cases per property (default 1000; npm test uses 40)
#   FUZZ_SEED  the seed (default 20261204); a failure prints the seed and path to replay it
# The unit properties need nothing running; the HTTP ones need the test services and the built
# app (as for the integration tests: APP_URL, or the test port of .env.test).
set -euo pipefail
cd "$(dirname "$0")/.."
export FUZZ_RUNS="${FUZZ_RUNS:-1000}"
npx vitest run --project unit tests/unit/import/readers.fuzz.test.ts tests/unit/csv.test.ts
if [ -f .env.test ]; then
	set -a; . ./.env.test; set +a
	export FRACTILE_ENV_FILE="$PWD/.env.test"
	APP_URL="${APP_URL:-$ORIGIN}" npx vitest run --project integration tests/integration/intake/fuzz-http.test.ts
else
	echo "fuzz: no .env.test, so the HTTP properties were not run (start the test services first)" >&2
fi
