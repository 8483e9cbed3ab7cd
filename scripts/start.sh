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
export HOST=127.0.0.1 PORT ORIGIN=${ORIGIN:-http://127.0.0.1:$PORT}
exec node build
