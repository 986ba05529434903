#!/usr/bin/env bash
# npm test: does all of its own set-up, runs every suite, and ends with "N passed, N failed".
#  0. the gates: TypeScript (tsc --noEmit) and ESLint (as npm run lint: --max-warnings 0); each counts as one
#     test in the summary line; any error in either, or any lint warning, fails the run (the suites still
#     run, so one run shows everything)
#  1. unit and integration tests (vitest, real PostgreSQL test database)
#  2. the app built into .next-test and served on 127.0.0.1:$DENUDATA_TEST_PORT (default 3100),
#     then the API and browser tests (vitest driving Debian's headless Chromium)
# A running `npm start` on port 3000 and its database are never touched.
# Parallel runs (one per developer) set DENUDATA_DB, DENUDATA_TEST_PORT, DENUDATA_TEST_SMTP_PORT and
# DENUDATA_TEST_DIST_DIR to values of their own. Extra arguments go to both vitest runs as filters.
set -uo pipefail
cd "$(dirname "$0")/.."
# Next.js telemetry would try to reach the network, which this product never needs.
export NEXT_TELEMETRY_DISABLED=1

export DENUDATA_TEST_PORT="${DENUDATA_TEST_PORT:-3100}"
export DENUDATA_SMTP_PORT="${DENUDATA_TEST_SMTP_PORT:-2526}"
export DENUDATA_MAIL_DIR="$PWD/.denudata/mail-test-$DENUDATA_TEST_PORT"
export DENUDATA_DB="${DENUDATA_DB:-denudata}_test"
export DENUDATA_DIST_DIR="${DENUDATA_TEST_DIST_DIR:-.next-test}"
export NEXTAUTH_URL="http://127.0.0.1:$DENUDATA_TEST_PORT"
export NEXTAUTH_SECRET="$(node -e "console.log(require('node:crypto').randomBytes(32).toString('hex'))")"
export DENUDATA_APP_URL="$NEXTAUTH_URL"
unset DATABASE_URL

# The SMTP fake of this run is stopped when the run ends, however it ends.
trap 'bash scripts/mail.sh stop >/dev/null 2>&1 || true' EXIT

bash scripts/setup.sh --test || { echo "test: set-up failed"; echo "0 passed, 1 failed"; exit 1; }
mkdir -p .denudata
rm -rf "$DENUDATA_MAIL_DIR" && mkdir -p "$DENUDATA_MAIL_DIR"

status=0
gate() { # gate <name> <command...>: one pass or one failure in a vitest-shaped report
  local name="$1"; shift
  local report=".denudata/report-$name-$DENUDATA_TEST_PORT.json"
  if "$@" > ".denudata/$name-$DENUDATA_TEST_PORT.log" 2>&1; then
    echo "test: $name passed"
    echo '{"numPassedTests":1,"numFailedTests":0}' > "$report"
  else
    status=1
    echo "test: $name FAILED"
    tail -60 ".denudata/$name-$DENUDATA_TEST_PORT.log"
    echo '{"numPassedTests":0,"numFailedTests":1}' > "$report"
  fi
}
gate typecheck node_modules/.bin/tsc --noEmit
gate lint node_modules/.bin/eslint . --max-warnings 0

echo "test: unit and integration suites"
node_modules/.bin/vitest run "$@" --passWithNoTests --reporter=default --reporter=json --outputFile.json=.denudata/report-unit-$DENUDATA_TEST_PORT.json || status=1

echo "test: building the app for the browser and API suites"
if node_modules/.bin/next build > .denudata/test-build-$DENUDATA_TEST_PORT.log 2>&1; then
  echo "test: API and browser suites"
  node_modules/.bin/vitest run "$@" --config vitest.server.config.ts --passWithNoTests --reporter=default --reporter=json \
    --outputFile.json=.denudata/report-server-$DENUDATA_TEST_PORT.json || status=1
else
  status=1
  tail -40 .denudata/test-build-$DENUDATA_TEST_PORT.log
  echo '{"numPassedTests":0,"numFailedTests":1}' > .denudata/report-server-$DENUDATA_TEST_PORT.json
fi

node scripts/test-summary.mjs .denudata/report-typecheck-$DENUDATA_TEST_PORT.json .denudata/report-lint-$DENUDATA_TEST_PORT.json \
  .denudata/report-unit-$DENUDATA_TEST_PORT.json .denudata/report-server-$DENUDATA_TEST_PORT.json || status=1
exit $status
