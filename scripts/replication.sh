#!/usr/bin/env bash
# A MariaDB primary and one replica on loopback, joined by binary-log replication (GTID), for the
# test that runs two app processes against them and for trying the layout of docs/scaling.md.
#   scripts/replication.sh start|stop|reset|status
# Primary on 127.0.0.1:3311, replica on 127.0.0.1:3312 (read-only), settings in .env.replication.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"

ENV_FILE="$ROOT/.env.replication"
PRIMARY_SOCKET="$LOCAL_DIR/mariadb-primary/mysqld.sock"
REPLICA_SOCKET="$LOCAL_DIR/mariadb-replica/mysqld.sock"
# Small buffer pools: the pair is for correctness tests, not for speed.
export DB_BUFFER_POOL="${REPLICATION_BUFFER_POOL:-128M}"

on_primary() { mariadb --no-defaults -S "$PRIMARY_SOCKET" -uroot "$@"; }
on_replica() { mariadb --no-defaults -S "$REPLICA_SOCKET" -uroot "$@"; }

replica_state() {
	on_replica -e "SHOW SLAVE STATUS\\G" | awk -F': ' '/Slave_IO_Running:|Slave_SQL_Running:/ {printf "%s ", $2}'
}

start() {
	# Triggers (the frozen snapshot of an approved assessment) need this once binary logging is on:
	# the app user may create them without SUPER.
	DB_EXTRA_ARGS="--server-id=1 --log-bin=primary-bin --log-basename=primary --binlog-format=ROW --log-bin-trust-function-creators=1" \
		bash scripts/db.sh start primary
	load_env "$ENV_FILE"
	on_primary <<SQL
CREATE USER IF NOT EXISTS 'replicator'@'127.0.0.1' IDENTIFIED BY '$REPLICATION_PASSWORD';
GRANT REPLICATION SLAVE ON *.* TO 'replicator'@'127.0.0.1';
SQL
	DB_EXTRA_ARGS="--server-id=2 --read-only=1 --log-basename=replica --relay-log=replica-relay" \
		bash scripts/db.sh start replica
	if ! replica_state | grep -q "Yes Yes"; then
		on_replica <<SQL
STOP SLAVE;
CHANGE MASTER TO MASTER_HOST='127.0.0.1', MASTER_PORT=$DB_PORT, MASTER_USER='replicator',
  MASTER_PASSWORD='$REPLICATION_PASSWORD', MASTER_USE_GTID=slave_pos, MASTER_CONNECT_RETRY=1;
START SLAVE;
SQL
	fi
	for _ in $(seq 1 100); do
		if replica_state | grep -q "Yes Yes" && on_replica -e "USE \`$DB_NAME\`" 2>/dev/null; then
			say "replication running: primary 127.0.0.1:$DB_PORT → replica 127.0.0.1:$REPLICA_DB_PORT"
			return 0
		fi
		sleep 0.2
	done
	on_replica -e "SHOW SLAVE STATUS\\G" | grep -E "Running|Error" >&2 || true
	die "the replica did not start replicating"
}

stop() {
	bash scripts/db.sh stop replica
	bash scripts/db.sh stop primary
}

case "${1:-start}" in
	start) start ;;
	stop) stop ;;
	reset) stop; bash scripts/db.sh reset replica; bash scripts/db.sh reset primary; rm -f "$ENV_FILE" ;;
	status) echo "replica threads (IO SQL): $(replica_state)" ;;
	*) die "usage: scripts/replication.sh start|stop|reset|status" ;;
esac
