#!/usr/bin/env bash
# npm test: everything the tests need is installed and started here (npm packages, PostgreSQL,
# Chromium); then the type check, unit, integration and end-to-end tests.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

ensure_node_modules
ensure_chromium
bash scripts/db.sh start

echo "== type check"
npm run -s check
echo "== unit tests"
npx vitest run --project unit
echo "== integration tests (PostgreSQL)"
npx vitest run --project integration
echo "== build"
npx vite build --logLevel error
echo "== end-to-end tests (Chromium)"
npx playwright test
echo "== two app instances on one PostgreSQL"
npx playwright test -c playwright.scale.config.ts
