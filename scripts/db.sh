#!/usr/bin/env bash
# Project-owned PostgreSQL cluster on loopback: scripts/db.sh start|stop|status|env
# Data lives under .data/ (git-ignored; BEAMWARDEN_PGDIR and BEAMWARDEN_PGPORT give a second,
# separate cluster, as the durability test does). The server runs as the `postgres` user because
# PostgreSQL refuses to run as root.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
PGPORT=${BEAMWARDEN_PGPORT:-54329}
DIR=${BEAMWARDEN_PGDIR:-$ROOT/.data}
DATA="$DIR/pg"
SOCK="$DIR/pg-socket"
LOG="$DIR/pg.log"
PG_BIN=${PG_BIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)}

as_pg() {
	if [ "$(id -u)" = 0 ]; then (cd /tmp && runuser -u postgres -- "$@"); else (cd /tmp && "$@"); fi
}

ensure_binaries() {
	if [ -z "$PG_BIN" ] || [ ! -x "$PG_BIN/initdb" ]; then
		echo "PostgreSQL server binaries not found: installing Debian's postgresql package" >&2
		export DEBIAN_FRONTEND=noninteractive
		apt-get update -qq && apt-get install -y -qq postgresql >/dev/null
		PG_BIN=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)
	fi
}

running() { [ -n "$PG_BIN" ] && [ -x "$PG_BIN/pg_isready" ] && "$PG_BIN/pg_isready" -q -h 127.0.0.1 -p "$PGPORT"; }

start() {
	ensure_binaries
	mkdir -p "$ROOT/.data" "$DIR" "$SOCK"
	chmod 755 "$ROOT/.data" "$DIR"
	if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$SOCK"; fi
	if [ ! -s "$DATA/PG_VERSION" ]; then
		mkdir -p "$DATA"
		if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$DATA"; fi
		chmod 700 "$DATA"
		# trust on loopback only: the cluster is local to this checkout
		as_pg "$PG_BIN/initdb" -D "$DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
	fi
	if running; then echo "PostgreSQL already running on 127.0.0.1:$PGPORT"; else
		touch "$LOG"; if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$LOG"; fi
		as_pg "$PG_BIN/pg_ctl" -D "$DATA" -l "$LOG" -w -t 60 \
			-o "-c listen_addresses=127.0.0.1 -p $PGPORT -k $SOCK -c fsync=on" start >/dev/null
		echo "PostgreSQL started on 127.0.0.1:$PGPORT"
	fi
	for db in beamwarden beamwarden_test; do
		psql_admin -tAc "SELECT 1 FROM pg_database WHERE datname = '$db'" | grep -q 1 ||
			psql_admin -qc "CREATE DATABASE $db"
	done
	# The app's own role: it may not rewrite or delete audit rows (grants applied by the migration script).
	psql_admin -qc "DO \$\$ BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = 'beamwarden_app') THEN CREATE ROLE beamwarden_app LOGIN; END IF; END \$\$;"
}

psql_admin() { "$PG_BIN/psql" -X -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres "$@"; }

stop() {
	if [ -s "$DATA/PG_VERSION" ] && running; then
		as_pg "$PG_BIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null && echo "PostgreSQL stopped"
	else echo "PostgreSQL not running"; fi
}

case "${1:-}" in
	start) start ;;
	stop) stop ;;
	status) if running; then echo running; else echo stopped; exit 1; fi ;;
	env)
		echo "DATABASE_OWNER_URL=postgres://postgres@127.0.0.1:$PGPORT/${2:-beamwarden}"
		echo "DATABASE_URL=postgres://beamwarden_app@127.0.0.1:$PGPORT/${2:-beamwarden}" ;;
	*) echo "usage: scripts/db.sh start|stop|status|env [database]" >&2; exit 2 ;;
esac
