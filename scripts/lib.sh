# Shared by start.sh and test.sh (sourced).
ensure_node_modules() {
	# Install when node_modules is missing or older than the lock file.
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		echo "Installing npm packages…"
		npm ci --no-audit --no-fund --loglevel=error
	fi
}

ensure_chromium() {
	if [ ! -x /usr/bin/chromium ]; then
		echo "Installing Debian's chromium for the browser tests…"
		export DEBIAN_FRONTEND=noninteractive
		apt-get update -qq && apt-get install -y -qq chromium >/dev/null
	fi
}

use_database() { # use_database NAME: exports DATABASE_URL and DATABASE_OWNER_URL for it
	eval "$(bash scripts/db.sh env "$1")"
	export DATABASE_URL DATABASE_OWNER_URL
}
