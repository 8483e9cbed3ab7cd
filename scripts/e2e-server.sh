#!/usr/bin/env bash
# The server the end-to-end tests drive: the built app on its own port and its own fresh
# database with the demo data, so tests never touch the demo database.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
bash scripts/db.sh start >/dev/null
[ -f build/index.js ] || npx vite build --logLevel error
npx tsx scripts/prepare-db.ts beamwarden_e2e --fresh --seed
use_database beamwarden_e2e
export HOST=127.0.0.1 PORT=${E2E_PORT:-3100} ORIGIN=http://127.0.0.1:${E2E_PORT:-3100} APP_URL=http://127.0.0.1:${E2E_PORT:-3100} BODY_SIZE_LIMIT=40M
rm -rf .data/mailbox-e2e
start_fake_mail "${E2E_SMTP_PORT:-2727}" .data/mailbox-e2e
trap 'kill "$FAKE_MAIL_PID" 2>/dev/null' EXIT
node build
