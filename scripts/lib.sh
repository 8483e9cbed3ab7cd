# Shared by start.sh and test.sh (sourced).
ensure_node_modules() {
	# Install when node_modules is missing or older than the lock file.
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		echo "Installing npm packages…"
		npm ci --no-audit --no-fund --loglevel=error
	fi
	node scripts/patch-postgres.mjs >/dev/null # idempotent; see the script for why
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

start_fake_mail() { # start_fake_mail PORT DIR: the local SMTP server that keeps what it receives
	export FAKE_SMTP_PORT=$1 BEAMWARDEN_MAILBOX_DIR=$2 SMTP_HOST=127.0.0.1 SMTP_PORT=$1
	mkdir -p "$2"
	node_modules/.bin/tsx scripts/fake-mail.ts &
	FAKE_MAIL_PID=$!
	for _ in $(seq 1 50); do
		(exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null && return 0
		sleep 0.2
	done
	echo "The local mail server did not start on port $1" >&2
	return 1
}
