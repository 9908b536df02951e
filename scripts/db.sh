#!/usr/bin/env bash
# Fractile's private MariaDB: install (Debian's package), initialise, start, stop, reset.
# Never touches a system MariaDB: its own data folder, socket, pid file and port, loopback only.
#
#   scripts/db.sh start [dev|test]   start the instance (idempotent), create database and user
#   scripts/db.sh stop  [dev|test]   stop it cleanly
#   scripts/db.sh reset [dev|test]   stop it and delete its data folder
#   scripts/db.sh status [dev|test]
#
# dev:  port $DB_PORT (3307), data in .local/mariadb,      settings in .env
# test: port $TEST_DB_PORT (3308), data in .local/mariadb-test, settings in .env.test (throwaway)
# primary, replica: the replication pair on 3311 and 3312 (scripts/replication.sh drives them;
#       settings in .env.replication)
# galera1, galera2, galera3: the Galera cluster's nodes on 3321-3323 (scripts/cluster.sh drives
#       them with their wsrep settings; settings in .env.cluster)
set -euo pipefail
. "$(dirname "$0")/lib.sh"

action="${1:-start}"
instance="${2:-dev}"

PORT_KEY=DB_PORT
case "$instance" in
	dev) ENV_FILE="$ROOT/.env"; DATA_DIR="$LOCAL_DIR/mariadb"; DEFAULT_PORT="${DB_PORT:-3307}"; DEFAULT_NAME=fractile ;;
	test) ENV_FILE="$ROOT/.env.test"; DATA_DIR="$LOCAL_DIR/mariadb-test"; DEFAULT_PORT="${TEST_DB_PORT:-3308}"; DEFAULT_NAME=fractile_test ;;
	fault)
		# A throwaway instance that the fault tests stop and start under a running app.
		ENV_FILE="$ROOT/.env.fault"; DATA_DIR="$LOCAL_DIR/mariadb-fault"; DEFAULT_PORT="${FAULT_DB_PORT:-3313}"
		DEFAULT_NAME=fractile_fault
		;;
	primary | replica)
		ENV_FILE="$ROOT/.env.replication"; DATA_DIR="$LOCAL_DIR/mariadb-$instance"
		DEFAULT_PORT="${PRIMARY_DB_PORT:-3311}"; DEFAULT_NAME=fractile_replicated
		[ "$instance" = replica ] && PORT_KEY=REPLICA_DB_PORT
		;;
	galera1 | galera2 | galera3)
		ENV_FILE="$ROOT/.env.cluster"; DATA_DIR="$(galera_root)/mariadb-$instance"
		DEFAULT_PORT="${GALERA_PORT_1:-3321}"; DEFAULT_NAME=fractile_cluster
		PORT_KEY="GALERA_PORT_${instance#galera}"
		;;
	*) die "unknown instance '$instance' (dev, test, fault, primary, replica, galera1-3)" ;;
esac

SOCKET="$DATA_DIR/mysqld.sock"
# The system user the server runs as: ours, unless told (the Galera nodes run as `mysql` when
# started by root, because rsync's snapshot transfer would otherwise write as `nobody`).
OS_USER="${DB_OS_USER:-$(id -un)}"
PID_FILE="$DATA_DIR/mysqld.pid"
LOG_FILE="$DATA_DIR/mysqld.log"

write_env_defaults() {
	env_default "$ENV_FILE" DB_HOST 127.0.0.1
	env_default "$ENV_FILE" DB_PORT "$DEFAULT_PORT"
	env_default "$ENV_FILE" DB_NAME "$DEFAULT_NAME"
	env_default "$ENV_FILE" DB_USER fractile
	env_default "$ENV_FILE" DB_PASSWORD "$(random_secret 18)"
	if [ "$ENV_FILE" = "$ROOT/.env.replication" ]; then
		env_default "$ENV_FILE" REPLICA_DB_PORT "${REPLICA_DB_PORT:-3312}"
		env_default "$ENV_FILE" DB_READ_REPLICAS "127.0.0.1:${REPLICA_DB_PORT:-3312}"
		env_default "$ENV_FILE" REPLICATION_PASSWORD "$(random_secret 18)"
	fi
	if [ "$ENV_FILE" = "$ROOT/.env.cluster" ]; then
		# Each node's SQL, group-communication, incremental (IST) and snapshot (SST) ports;
		# overridable before the file is first written, so that checkouts can run side by side.
		local n sql gcomm ist sst hosts=""
		for n in 1 2 3; do
			sql="GALERA_PORT_$n"; gcomm="GALERA_GCOMM_PORT_$n"; ist="GALERA_IST_PORT_$n"; sst="GALERA_SST_PORT_$n"
			env_default "$ENV_FILE" "$sql" "${!sql:-$((3320 + n))}"
			env_default "$ENV_FILE" "$gcomm" "${!gcomm:-$((4320 + n))}"
			env_default "$ENV_FILE" "$ist" "${!ist:-$((4330 + n))}"
			env_default "$ENV_FILE" "$sst" "${!sst:-$((4340 + n))}"
			hosts="$hosts${hosts:+,}127.0.0.1:$(grep "^$sql=" "$ENV_FILE" | cut -d'"' -f2)"
		done
		env_default "$ENV_FILE" DB_HOSTS "$hosts"
		# Where the nodes' data folders are (lib.sh, galera_root), for the cluster test.
		env_default "$ENV_FILE" GALERA_DATA_ROOT "$(galera_root)"
	fi
	load_env "$ENV_FILE"
	LISTEN_PORT="${!PORT_KEY}"
}

admin() { mariadb-admin --no-defaults -S "$SOCKET" -uroot "$@"; }
sql() { mariadb --no-defaults -S "$SOCKET" -uroot "$@"; }

running() {
	local pid
	pid="$(cat "$PID_FILE" 2>/dev/null || true)"
	pid_alive "$pid" && admin ping >/dev/null 2>&1
}

# The database and the application user, made to match the env file every time (idempotent).
# The user may also create databases named after its own (DB_NAME_*), for tests of migrations.
# A replica gets both through replication from its primary, so it is left alone.
provision() {
	[ "$instance" = replica ] && return 0
	# A cluster node that joins gets both from the cluster (scripts/cluster.sh provisions node 1).
	[ "${DB_SKIP_PROVISION:-0}" = 1 ] && return 0
	sql <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
CREATE USER IF NOT EXISTS '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`$DB_NAME%\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$DB_NAME%\`.* TO '$DB_USER'@'localhost';
GRANT PROCESS ON *.* TO '$DB_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
}

start() {
	ensure_debian_package mariadbd mariadb-server mariadb-client
	write_env_defaults
	if running; then
		say "MariaDB ($instance) already running on 127.0.0.1:$LISTEN_PORT"
		provision
		return 0
	fi
	# A pid file left by a crash or a killed machine: the process is gone, so the file is stale.
	if [ -f "$PID_FILE" ] && ! pid_alive "$(cat "$PID_FILE" 2>/dev/null)"; then
		rm -f "$PID_FILE" "$SOCKET"
	fi
	if [ ! -d "$DATA_DIR/mysql" ]; then
		say "initialising MariaDB data folder $DATA_DIR"
		mkdir -p "$DATA_DIR"
		chown "$OS_USER" "$DATA_DIR"
		mariadb-install-db --no-defaults --datadir="$DATA_DIR" --user="$OS_USER" \
			--auth-root-authentication-method=normal --skip-test-db >"$DATA_DIR/install.log" 2>&1 \
			|| die "mariadb-install-db failed, see $DATA_DIR/install.log"
	fi
	say "starting MariaDB ($instance) on 127.0.0.1:$LISTEN_PORT"
	# utf8mb4 throughout (a --no-defaults server is latin1 otherwise); local_infile for the
	# import benchmark's LOAD DATA comparison; a larger packet for batched inserts.
	nohup mariadbd --no-defaults --datadir="$DATA_DIR" --socket="$SOCKET" --pid-file="$PID_FILE" \
		--port="$LISTEN_PORT" --bind-address=127.0.0.1 --user="$OS_USER" \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		--local-infile=1 --max-allowed-packet=256M --skip-name-resolve \
		--innodb-buffer-pool-size="${DB_BUFFER_POOL:-512M}" --innodb-log-file-size=256M \
		--innodb-flush-log-at-trx-commit="${DB_FLUSH_AT_COMMIT:-1}" \
		--log-error="$LOG_FILE" ${DB_EXTRA_ARGS:-} >/dev/null 2>&1 &
	local server=$!
	# A Galera node that joins first receives the cluster's data (SST), so it may take longer.
	for _ in $(seq 1 "${DB_START_TRIES:-150}"); do
		running && break
		pid_alive "$server" || break
		sleep 0.2
	done
	running || die "MariaDB did not start, see $LOG_FILE"
	provision
	say "MariaDB ($instance) ready: database $DB_NAME, user $DB_USER"
}

stop() {
	if running; then
		say "stopping MariaDB ($instance)"
		admin shutdown || true
		for _ in $(seq 1 100); do
			pid_alive "$(cat "$PID_FILE" 2>/dev/null || true)" || break
			sleep 0.2
		done
	fi
	rm -f "$PID_FILE"
}

case "$action" in
	start) start ;;
	stop) stop ;;
	reset) stop; rm -rf "$DATA_DIR"; say "removed $DATA_DIR" ;;
	recreate)
		# Empties the instance's database (the test command's throwaway copy) and provisions again.
		start
		sql -e "DROP DATABASE IF EXISTS \`$DB_NAME\`"
		provision
		say "database $DB_NAME recreated empty"
		;;
	env) write_env_defaults ;;
	status) if running; then echo "running"; else echo "stopped"; exit 3; fi ;;
	*) die "usage: scripts/db.sh start|stop|reset|status [dev|test]" ;;
esac
