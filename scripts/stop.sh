#!/usr/bin/env bash
# `npm run stop`: stops what `npm start` started (the app, the fakes, the private MariaDB).
set -uo pipefail
. "$(dirname "$0")/lib.sh"
APP_PID_FILE="$LOCAL_DIR/run/app.pid"
pid="$(cat "$APP_PID_FILE" 2>/dev/null || true)"
if pid_alive "$pid"; then
	say "stopping the app (pid $pid)"
	kill "$pid" 2>/dev/null || true
fi
rm -f "$APP_PID_FILE"
bash "$ROOT/scripts/services.sh" stop dev
