#!/usr/bin/env bash
# npm start: set up everything, migrate, seed the demo, build, and serve on http://127.0.0.1:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
# Next.js telemetry would try to reach the network, which this product never needs.
export NEXT_TELEMETRY_DISABLED=1
bash scripts/setup.sh
node_modules/.bin/tsx scripts/migrate.mts
node_modules/.bin/tsx --conditions=react-server scripts/seed.mts
echo "start: building the app"
node_modules/.bin/next build
echo "start: serving Denudata on http://127.0.0.1:3000 (Ctrl+C stops it)"
exec node_modules/.bin/next start -H 127.0.0.1 -p 3000
