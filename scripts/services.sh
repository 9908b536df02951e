#!/usr/bin/env bash
# Starts or stops everything the app needs beside itself, for one instance (dev or test):
# the private MariaDB, the mail fake and the storage fake, all on 127.0.0.1.
#   scripts/services.sh start|stop [dev|test]
set -euo pipefail
. "$(dirname "$0")/lib.sh"

action="${1:-start}"
instance="${2:-dev}"
if [ "$instance" = test ]; then
	# Overridable so two checkouts on one machine can each run their own suite.
	ENV_FILE="$ROOT/.env.test"; SMTP_DEFAULT="${TEST_SMTP_PORT:-2526}"; S3_DEFAULT="${TEST_S3_PORT:-4570}"
	APP_DEFAULT="${TEST_APP_PORT:-3100}"; SUFFIX=-test
else
	ENV_FILE="$ROOT/.env"; SMTP_DEFAULT="${SMTP_PORT:-2525}"; S3_DEFAULT="${S3_FAKE_PORT:-4569}"
	APP_DEFAULT="${PORT:-3000}"; SUFFIX=
fi
RUN_DIR="$LOCAL_DIR/run$SUFFIX"
mkdir -p "$RUN_DIR"

write_app_env() {
	env_default "$ENV_FILE" ORIGIN "http://127.0.0.1:$APP_DEFAULT"
	env_default "$ENV_FILE" PORT "$APP_DEFAULT"
	env_default "$ENV_FILE" HOST 127.0.0.1
	env_default "$ENV_FILE" SESSION_SECRET "$(random_secret 32)"
	env_default "$ENV_FILE" RESEARCH_ID_SECRET "$(random_secret 32)"
	env_default "$ENV_FILE" SMTP_HOST 127.0.0.1
	env_default "$ENV_FILE" SMTP_PORT "$SMTP_DEFAULT"
	env_default "$ENV_FILE" MAIL_FROM "Fractile <no-reply@fractile.example>"
	env_default "$ENV_FILE" MAIL_FAKE_DIR "$LOCAL_DIR/mail$SUFFIX"
	env_default "$ENV_FILE" DEV_OUTBOX 1
	env_default "$ENV_FILE" S3_ENDPOINT "http://127.0.0.1:$S3_DEFAULT"
	env_default "$ENV_FILE" S3_FAKE_PORT "$S3_DEFAULT"
	env_default "$ENV_FILE" S3_FAKE_DIR "$LOCAL_DIR/s3$SUFFIX"
	env_default "$ENV_FILE" S3_BUCKET fractile
	env_default "$ENV_FILE" S3_REGION us-east-1
	env_default "$ENV_FILE" S3_ACCESS_KEY_ID S3RVER
	env_default "$ENV_FILE" S3_SECRET_ACCESS_KEY S3RVER
	env_default "$ENV_FILE" BODY_SIZE_LIMIT 64M
	# A staging folder per instance: batch ids are per database, so two checkouts (or dev and
	# test) sharing the OS temp folder would overwrite each other's batch-<id>.upload files.
	env_default "$ENV_FILE" IMPORT_STAGING_DIR "$LOCAL_DIR/imports$SUFFIX"
	# adapter-node's HTTP timeouts, in seconds (docs/scaling.md, "Timeouts").
	env_default "$ENV_FILE" KEEP_ALIVE_TIMEOUT 65
	env_default "$ENV_FILE" HEADERS_TIMEOUT 66
	env_default "$ENV_FILE" SHUTDOWN_TIMEOUT 30
	# The suite makes many API calls as a few demo users; its own rate-limit test sets a low limit.
	env_default "$ENV_FILE" API_RATE_LIMIT "$([ "$instance" = test ] && echo 100000 || echo 300)"
	# Every suite request comes from 127.0.0.1; the throttling test starts its own app with the
	# default per-address limit of new-password requests.
	if [ "$instance" = test ]; then env_default "$ENV_FILE" RESET_LIMIT_PER_ADDRESS 100000; fi
}

start_fake() {
	local name="$1" script="$2" port="$3"
	local pid_file="$RUN_DIR/$name.pid"
	if pid_alive "$(cat "$pid_file" 2>/dev/null || true)"; then
		return 0
	fi
	# `cd` apart from the backgrounded command, so that $! is node's own pid and not a subshell's.
	cd "$ROOT"
	nohup node --import tsx "$script" >"$RUN_DIR/$name.log" 2>&1 &
	echo $! >"$pid_file"
	wait_for_port "$port" "the $name fake"
	say "$name fake on 127.0.0.1:$port"
}

stop_pid_file() {
	local pid_file="$1" pid
	pid="$(cat "$pid_file" 2>/dev/null || true)"
	if pid_alive "$pid"; then
		kill "$pid" 2>/dev/null || true
		for _ in $(seq 1 50); do pid_alive "$pid" || break; sleep 0.1; done
		pid_alive "$pid" && kill -9 "$pid" 2>/dev/null || true
	fi
	rm -f "$pid_file"
}

case "$action" in
	start)
		bash "$ROOT/scripts/db.sh" start "$instance"
		write_app_env
		load_env "$ENV_FILE"
		start_fake mail scripts/fakes/mail.ts "$SMTP_PORT"
		start_fake storage scripts/fakes/storage.ts "$S3_FAKE_PORT"
		;;
	stop)
		for f in "$RUN_DIR"/*.pid; do [ -e "$f" ] && stop_pid_file "$f"; done
		bash "$ROOT/scripts/db.sh" stop "$instance"
		;;
	*) die "usage: scripts/services.sh start|stop [dev|test]" ;;
esac
