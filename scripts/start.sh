#!/usr/bin/env bash
# `npm start`: everything from a fresh clone to the app on http://127.0.0.1:3000 with demo data.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"

ensure_node_modules
bash scripts/services.sh start dev
load_env "$ROOT/.env"
export FRACTILE_ENV_FILE="$ROOT/.env"
npx tsx scripts/migrate.ts up
npx tsx scripts/seed.ts --if-empty
say "building the app"
npx vite build >"$LOCAL_DIR/build.log" 2>&1 || { tail -30 "$LOCAL_DIR/build.log"; die "build failed (log: .local/build.log)"; }

APP_PID_FILE="$LOCAL_DIR/run/app.pid"
if pid_alive "$(cat "$APP_PID_FILE" 2>/dev/null || true)"; then
	say "stopping the app started earlier"
	kill "$(cat "$APP_PID_FILE")" 2>/dev/null || true
	sleep 1
fi
say "serving on $ORIGIN (npm run stop stops it and the services)"
say "demo sign-ins, password \"cover-check-demo-2026\": admin@kestrel-lane.example, engineer@kestrel-lane.example,"
say "  surveyor@kestrel-lane.example, owner@northmoor.example, researcher@durability-collective.example"
echo $$ >"$APP_PID_FILE"
exec node --env-file="$ROOT/.env" build
