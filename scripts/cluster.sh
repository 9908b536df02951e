#!/usr/bin/env bash
# A three-node Galera cluster of Debian's MariaDB (galera-4) on loopback: every node takes writes
# (docs/scaling.md, "A Galera cluster"). For the test that kills a node under two app processes,
# and for trying that layout.
#   scripts/cluster.sh start|stop|reset|status
#   scripts/cluster.sh kill N        SIGKILL node N (a crash: no shutdown code runs)
#   scripts/cluster.sh start-node N  start node N again; it rejoins the running cluster (IST/SST)
#   scripts/cluster.sh stop-node N   stop node N cleanly
# SQL on 127.0.0.1:3321-3323, group communication 4321-4323, IST 4331-4333, SST 4341-4343
# (GALERA_PORT_N, GALERA_GCOMM_PORT_N, GALERA_IST_PORT_N, GALERA_SST_PORT_N when .env.cluster is
# first written); data under .local/mariadb-galeraN; settings in .env.cluster, whose DB_HOSTS
# lists the nodes for the app.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"

ENV_FILE="$ROOT/.env.cluster"
GALERA_ROOT="$(galera_root)"
PROVIDER=/usr/lib/galera/libgalera_smm.so
# Small buffer pools: the cluster is for correctness tests on a shared machine, not for speed.
export DB_BUFFER_POOL="${CLUSTER_BUFFER_POOL:-128M}"
# Run as root, the rsync daemon that receives a snapshot (SST) switches to `nobody`, which may
# not write the joiner's data folder: the nodes then run as Debian's `mysql` user.
if [ "$(id -u)" -eq 0 ] && id mysql >/dev/null 2>&1; then export DB_OS_USER=mysql; fi

socket_of() { echo "$GALERA_ROOT/mariadb-galera$1/mysqld.sock"; }
on_node() {
	local n="$1"; shift
	mariadb --no-defaults -S "$(socket_of "$n")" -uroot "$@"
}
node_pid() { cat "$GALERA_ROOT/mariadb-galera$1/mysqld.pid" 2>/dev/null || true; }
node_up() { pid_alive "$(node_pid "$1")" && on_node "$1" -e "SELECT 1" >/dev/null 2>&1; }
wsrep_status() { on_node "$1" -N -e "SHOW STATUS LIKE '$2'" 2>/dev/null | cut -f2; }

# The settings every node needs (MariaDB's "Mandatory options" for Galera, and ours):
# - binlog_format=ROW and innodb_autoinc_lock_mode=2: Galera replicates row images and cannot
#   certify statement-based or table-locking auto-increment writes;
# - wsrep_max_ws_rows=0 (no row limit) and wsrep_max_ws_size=2 GB, both set on purpose: an
#   import writes up to 2,000,000 readings in ONE transaction (src/lib/server/import/limits.ts),
#   a write-set of its rows and their summary rows in the hundreds of MB; a lower limit would fail large imports
#   whole (never half: the transaction rolls back), so the limits stay above the import's;
# - wsrep_load_data_splitting stays at its default OFF: ON would commit LOAD DATA every 10,000
#   rows, and an import that then failed would leave part of its readings;
# - gcache.size: write-sets kept for a node that rejoins, so a restart after a short absence
#   needs only the missing write-sets (IST) rather than a full copy (SST by rsync);
# - log_bin_trust_function_creators: the migrations' triggers, created by a user without SUPER.
node_args() {
	local n="$1" gcomm ist sst peers=""
	gcomm="GALERA_GCOMM_PORT_$n"; ist="GALERA_IST_PORT_$n"; sst="GALERA_SST_PORT_$n"
	for m in 1 2 3; do
		local p="GALERA_GCOMM_PORT_$m"
		peers="$peers${peers:+,}127.0.0.1:${!p}"
	done
	printf '%s ' \
		--binlog-format=ROW --innodb-autoinc-lock-mode=2 --default-storage-engine=InnoDB \
		--log-bin-trust-function-creators=1 --innodb-flush-log-at-trx-commit=2 \
		--innodb-log-file-size=64M \
		--wsrep-on=ON --wsrep-provider="$PROVIDER" --wsrep-cluster-name=fractile \
		--wsrep-cluster-address="gcomm://$peers" --wsrep-node-name="node$n" \
		--wsrep-node-address="127.0.0.1:${!gcomm}" \
		--wsrep-node-incoming-address="127.0.0.1:$(port_of "$n")" \
		--wsrep-sst-method=rsync --wsrep-sst-receive-address="127.0.0.1:${!sst}" \
		--wsrep-max-ws-rows=0 --wsrep-max-ws-size=2147483647 --wsrep-slave-threads=2 \
		--wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:${!gcomm};ist.recv_addr=127.0.0.1:${!ist};gcache.size=512M"
}
port_of() { local p="GALERA_PORT_$1"; echo "${!p}"; }

ensure_env() {
	ensure_debian_package mariadbd mariadb-server mariadb-client
	if [ ! -f "$PROVIDER" ]; then
		# galera-4 comes with mariadb-server on Debian 12; a system without it gets it here.
		local sudo=""
		[ "$(id -u)" -ne 0 ] && sudo="sudo"
		DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends galera-4 >/dev/null \
			|| die "apt-get install galera-4 failed"
	fi
	ensure_debian_package rsync rsync
	# Writes .env.cluster's ports and credentials on first use, without starting anything.
	bash scripts/db.sh env galera1
	load_env "$ENV_FILE"
}

# A node that crashed (killed, power lost) leaves no position in grastate.dat (seqno -1): without
# one it would ask for a full copy (SST). Its last committed write-set is in InnoDB, and
# `mariadbd --wsrep-recover` reads it out (what Debian's galera_recovery does under systemd), so
# the node can ask for just the write-sets it missed (IST) while a survivor's gcache holds them.
recovered_position() {
	local n="$1" dir="$GALERA_ROOT/mariadb-galera$1"
	grep -q '^seqno: *-1' "$dir/grastate.dat" 2>/dev/null && [ -d "$dir/mysql" ] || return 0
	mariadbd --no-defaults --datadir="$dir" --user="${DB_OS_USER:-$(id -un)}" --skip-networking \
		--socket="$dir/recover.sock" --pid-file="$dir/recover.pid" \
		--innodb-buffer-pool-size="$DB_BUFFER_POOL" $(node_args "$n") --wsrep-recover \
		--log-error="$dir/recover.log" >/dev/null 2>&1 || true
	{ grep -o 'WSREP: Recovered position: [^ ]*' "$dir/recover.log" 2>/dev/null || true; } | tail -1 | awk '{print $NF}'
}

# Starts node N: `new` bootstraps a new primary component from it, `join` joins the others.
start_node() {
	local n="$1" how="$2" extra
	extra="$(node_args "$n")"
	[ "$how" = new ] && extra="$extra --wsrep-new-cluster"
	local position
	position="$(recovered_position "$n")"
	[ -n "$position" ] && extra="$extra --wsrep-start-position=$position"
	DB_SKIP_PROVISION=1 DB_START_TRIES=600 DB_EXTRA_ARGS="$extra" bash scripts/db.sh start "galera$n"
	wait_synced "$n"
}

wait_synced() {
	for _ in $(seq 1 600); do
		[ "$(wsrep_status "$1" wsrep_local_state_comment)" = Synced ] && return 0
		sleep 0.2
	done
	die "node $1 did not reach Synced, see $GALERA_ROOT/mariadb-galera$1/mysqld.log"
}

primary() { node_up "$1" && [ "$(wsrep_status "$1" wsrep_cluster_status)" = Primary ]; }

# Running nodes, the one that has committed the most write-sets first.
nodes_by_position() {
	for n in 1 2 3; do
		node_up "$n" && echo "$(wsrep_status "$n" wsrep_last_committed) $n"
	done | sort -rn | awk '{print $2}'
}

# The node a stopped cluster must start from: the one that stopped last (grastate.dat says so);
# after a crash of every node none does, and node 1 is taken (its last write-sets may be behind
# another's: a cluster that lost every node at once is a recovery by hand in production).
bootstrap_node() {
	for n in 1 2 3; do
		grep -q '^safe_to_bootstrap: 1' "$GALERA_ROOT/mariadb-galera$n/grastate.dat" 2>/dev/null && { echo "$n"; return; }
	done
	[ -f "$GALERA_ROOT/mariadb-galera1/grastate.dat" ] \
		&& sed -i 's/^safe_to_bootstrap: 0/safe_to_bootstrap: 1/' "$GALERA_ROOT/mariadb-galera1/grastate.dat"
	echo 1
}

start() {
	ensure_env
	local first=""
	for n in 1 2 3; do primary "$n" && { first="$n"; break; }; done
	if [ -z "$first" ]; then
		# Nodes running but none in a primary component: the cluster lost its quorum (two of the
		# three nodes died at once). The survivor with the most write-sets is made the primary
		# component again; the others then rejoin it. In production this is a person's decision,
		# made once the other nodes are known to be down (two halves both made primary diverge).
		for n in $(nodes_by_position); do
			node_up "$n" || continue
			say "the cluster has no quorum: node $n becomes the primary component again (pc.bootstrap)"
			on_node "$n" -e "SET GLOBAL wsrep_provider_options='pc.bootstrap=YES'"
			wait_synced "$n"
			first="$n"
			break
		done
	fi
	if [ -z "$first" ]; then
		first="$(bootstrap_node)"
		say "bootstrapping the cluster from node $first"
		start_node "$first" new
	fi
	for n in 1 2 3; do
		if [ "$n" != "$first" ] && pid_alive "$(node_pid "$n")"; then
			# A node still waiting to join (it started while there was no quorum) joins now.
			wait_synced "$n"
		else
			node_up "$n" || start_node "$n" join
		fi
	done
	# The database and user, made on one node; Galera replicates both to the others.
	DB_EXTRA_ARGS="" bash scripts/db.sh start "galera$first" >/dev/null
	say "migrating the cluster's database"
	FRACTILE_ENV_FILE="$ENV_FILE" npx tsx scripts/migrate.ts up
	say "cluster of $(wsrep_status "$first" wsrep_cluster_size) nodes ready: DB_HOSTS=$DB_HOSTS"
}

stop() {
	[ -f "$ENV_FILE" ] && load_env "$ENV_FILE"
	# Node 1 last, so that it is the one marked safe to bootstrap the next start from.
	for n in 3 2 1; do bash scripts/db.sh stop "galera$n"; done
}

status() {
	ensure_env
	for n in 1 2 3; do
		if node_up "$n"; then
			echo "node $n (127.0.0.1:$(port_of "$n")): $(wsrep_status "$n" wsrep_local_state_comment), cluster size $(wsrep_status "$n" wsrep_cluster_size), $(wsrep_status "$n" wsrep_cluster_status)"
		else
			echo "node $n (127.0.0.1:$(port_of "$n")): down"
		fi
	done
}

node_arg() {
	case "${1:-}" in 1 | 2 | 3) echo "$1" ;; *) die "name a node: 1, 2 or 3" ;; esac
}

case "${1:-start}" in
	start) start ;;
	stop) stop ;;
	reset)
		stop
		for n in 1 2 3; do bash scripts/db.sh reset "galera$n"; done
		rm -f "$ENV_FILE"
		;;
	status) status ;;
	kill)
		n="$(node_arg "${2:-}")"
		pid="$(node_pid "$n")"
		pid_alive "$pid" && kill -9 "$pid"
		for _ in $(seq 1 50); do pid_alive "$pid" || break; sleep 0.1; done
		say "node $n killed (SIGKILL)"
		;;
	start-node) ensure_env; start_node "$(node_arg "${2:-}")" join ;;
	stop-node) ensure_env; bash scripts/db.sh stop "galera$(node_arg "${2:-}")" ;;
	*) die "usage: scripts/cluster.sh start|stop|reset|status|kill N|start-node N|stop-node N" ;;
esac
