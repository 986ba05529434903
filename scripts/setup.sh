#!/usr/bin/env bash
# Everything both README commands need before they run: npm packages, the local settings file,
# PostgreSQL, the SMTP fake and migrations. Idempotent; safe to run again at any time.
#   scripts/setup.sh            for npm start (development database)
#   scripts/setup.sh --test     also installs Chromium for the browser tests
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -x node_modules/.bin/next ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "setup: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi

if [ ! -f .env.local ]; then
  secret=$(node -e "console.log(require('node:crypto').randomBytes(32).toString('hex'))")
  cat > .env.local <<ENV
# Made by scripts/setup.sh; never committed.
NEXTAUTH_URL=http://127.0.0.1:3000
NEXTAUTH_SECRET=$secret
ENV
  echo "setup: wrote .env.local with a new NEXTAUTH_SECRET"
fi

if [ "${1:-}" = "--test" ] && ! command -v chromium >/dev/null 2>&1; then
  echo "setup: installing Chromium from Debian's packages for the browser tests"
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
fi

bash scripts/db.sh start
bash scripts/mail.sh start
node scripts/build-worker.mjs
