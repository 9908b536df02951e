# Shared helpers for Fractile's scripts. Sourced, never run directly.
# Everything the scripts start lives under .local/ (git-ignored) in the project folder.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
LOCAL_DIR="$ROOT/.local"
mkdir -p "$LOCAL_DIR"

say() { printf '\033[1;36m[fractile]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[fractile]\033[0m %s\n' "$*" >&2; exit 1; }

# npm ci when node_modules is missing or older than the lockfile.
ensure_node_modules() {
	if [ ! -d "$ROOT/node_modules" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
		say "installing npm packages (npm ci)"
		(cd "$ROOT" && npm ci --no-audit --no-fund) || die "npm ci failed"
	fi
}

# Debian packages the project needs, installed when a command is missing.
# Usage: ensure_debian_package COMMAND PACKAGE...
ensure_debian_package() {
	local cmd="$1"; shift
	if ! command -v "$cmd" >/dev/null 2>&1; then
		say "installing Debian package(s) $* (for $cmd)"
		local sudo=""
		[ "$(id -u)" -ne 0 ] && sudo="sudo"
		$sudo apt-get update -qq || die "apt-get update failed"
		DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "$@" >/dev/null \
			|| die "apt-get install $* failed"
	fi
}

random_secret() { node -e "process.stdout.write(require('crypto').randomBytes(${1:-24}).toString('base64url'))"; }

# Adds KEY=value to an env file unless the key is already there.
env_default() {
	local file="$1" key="$2" value="$3"
	touch "$file"
	grep -q "^${key}=" "$file" || printf '%s="%s"\n' "$key" "$value" >>"$file"
}

# Loads an env file into the current shell (exported).
load_env() {
	[ -f "$1" ] || return 0
	set -a
	# shellcheck disable=SC1090
	. "$1"
	set +a
}

# Waits until a TCP port on 127.0.0.1 accepts connections.
wait_for_port() {
	local port="$1" what="$2" tries="${3:-100}"
	for _ in $(seq 1 "$tries"); do
		if node -e "require('net').connect($port,'127.0.0.1').on('connect',()=>process.exit(0)).on('error',()=>process.exit(1))" 2>/dev/null; then
			return 0
		fi
		sleep 0.2
	done
	die "$what did not answer on 127.0.0.1:$port"
}

pid_alive() { [ -n "${1:-}" ] && kill -0 "$1" 2>/dev/null; }

# Where the Galera nodes keep their data. They run as the `mysql` user when started by root
# (rsync's snapshot transfer writes as `nobody` otherwise), and that user must be able to reach
# the folder: a checkout under a private folder (mktemp's 0700, as a CI clone may be) is out of
# its reach, so the data then lives in /var/tmp under a name made from this checkout's path.
galera_root() {
	if [ "$(id -u)" -eq 0 ] && id mysql >/dev/null 2>&1 \
		&& ! runuser -u mysql -- test -x "$LOCAL_DIR" 2>/dev/null; then
		echo "/var/tmp/fractile-galera-$(printf '%s' "$ROOT" | sha1sum | cut -c1-12)"
	else
		echo "$LOCAL_DIR"
	fi
}
