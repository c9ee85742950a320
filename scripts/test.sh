#!/usr/bin/env bash
# `npm test`: the same set-up as `npm start` against a throw-away test database, then every test.
source "$(dirname "$0")/lib/setup.sh"

PG_PORT=${GRIDCUE_TEST_PG_PORT:-5434}
ensure_dependencies
export NODE_ENV=test
export JWT_SECRET=${JWT_SECRET:-test-secret-that-is-long-enough-for-hs256-signing}

STARTED_CLUSTER=
if [ -z "${DATABASE_URL:-}" ]; then
  ensure_cluster test "$PG_PORT" throwaway
  STARTED_CLUSTER=$CLUSTER_DIR
  recreate_database "$PG_PORT" gridcue_test
  export DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/gridcue_test"
else
  log "using the database at DATABASE_URL for tests (it will be emptied)"
fi
cleanup() {
  [ -n "$STARTED_CLUSTER" ] || return 0
  stop_cluster "$STARTED_CLUSTER"
  # a cluster parked in /var/tmp belongs to a checkout the postgres user can't enter (often a temporary clone): don't leave it behind
  case "$STARTED_CLUSTER" in /var/tmp/gridcue-pg-*) rm -rf "$(dirname "$STARTED_CLUSTER")" ;; esac
}
trap cleanup EXIT

if ! command -v chromium >/dev/null 2>&1; then apt_install "Chromium (browser tests)" chromium; fi

log "type checks…"
(cd "$ROOT" && npm run --silent typecheck)
log "building the client…"
(cd "$ROOT" && npx vite build --logLevel warn)

log "running tests…"
set +e
(cd "$ROOT" && npx vitest run --reporter=default --reporter=json --outputFile=.vitest.json)
status=$?
set -e
node -e 'const r=require(process.argv[1]);console.log(`${r.numPassedTests} passed, ${r.numFailedTests} failed`)' "$ROOT/.vitest.json" || true
exit $status
