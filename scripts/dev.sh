#!/usr/bin/env bash
# npm run dev: set up, migrate, seed, then Next.js in development mode on http://127.0.0.1:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
# Next.js telemetry would try to reach the network, which this product never needs.
export NEXT_TELEMETRY_DISABLED=1
bash scripts/setup.sh
node_modules/.bin/tsx scripts/migrate.mts
node_modules/.bin/tsx --conditions=react-server scripts/seed.mts
exec node_modules/.bin/next dev -H 127.0.0.1 -p 3000
