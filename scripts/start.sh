#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, migrate, load demo data into an empty
# database, build and serve Beamwarden on http://127.0.0.1:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

PORT=${PORT:-3000}
ensure_node_modules
bash scripts/db.sh start
use_database beamwarden
npx svelte-kit sync
npx tsx scripts/migrate.ts
npx tsx seed/load.ts --if-empty
echo "Building…"
npx vite build --logLevel warn

cat <<MSG

  Beamwarden is running on http://127.0.0.1:$PORT  (Ctrl-C stops it)

  Demo sign-ins (local demo data only; never use these anywhere else):
$(npx tsx seed/signins.ts)

MSG
export HOST=127.0.0.1 PORT ORIGIN=${ORIGIN:-http://127.0.0.1:$PORT} APP_URL=${APP_URL:-http://127.0.0.1:$PORT}
# Photos up to 10 MB each, a few at once.
export BODY_SIZE_LIMIT=${BODY_SIZE_LIMIT:-40M}
start_fake_mail "${FAKE_SMTP_PORT:-2525}" "${BEAMWARDEN_MAILBOX_DIR:-.data/mailbox}"
echo "  Mail goes to the local test mail server on 127.0.0.1:$FAKE_SMTP_PORT; admins read it under Sent mail."
trap 'kill "$FAKE_MAIL_PID" 2>/dev/null' EXIT
node build
