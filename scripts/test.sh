#!/usr/bin/env bash
# `npm test`: the same set-up as `npm start` against a throw-away test database, then every check:
# type checks, lint, dead code, client build and every test. Each stage fails the run.
source "$(dirname "$0")/lib/setup.sh"

PG_PORT=${GRIDCUE_TEST_PG_PORT:-5434}
ensure_dependencies
export NODE_ENV=test
export JWT_SECRET=${JWT_SECRET:-test-secret-that-is-long-enough-for-hs256-signing}

trap 'stop_fake_s3; close_database' EXIT
open_database test "$PG_PORT" gridcue_test throwaway
start_fake_s3_when_asked s3-test "${GRIDCUE_TEST_S3_PORT:-5442}" throwaway

if ! command -v chromium >/dev/null 2>&1; then apt_install "Chromium (browser tests)" chromium; fi
ensure_media_tools

# stage NAME COMMAND…: runs one stage from the checkout and logs how long it took; a failure ends the run.
stage() {
  local name=$1 started=$SECONDS status=0
  shift
  log "$name…"
  (cd "$ROOT" && "$@") || status=$?
  if [ "$status" != 0 ]; then die "$name failed after $((SECONDS - started)) s"; fi
  log "$name: $((SECONDS - started)) s"
}

# quick checks first, so a mistake they catch costs seconds rather than the whole test run
stage "type checks" npm run --silent typecheck
stage "lint" npm run --silent lint
stage "unused files, exports and dependencies" npm run --silent knip
stage "client build" npx vite build --logLevel warn

log "running tests…"
started=$SECONDS
set +e
(cd "$ROOT" && npx vitest run --reporter=default --reporter=json --outputFile=.vitest.json)
status=$?
set -e
log "tests: $((SECONDS - started)) s"
node -e 'const r=require(process.argv[1]);console.log(`${r.numPassedTests} passed, ${r.numFailedTests} failed`)' "$ROOT/.vitest.json" || true
exit $status
