#!/usr/bin/env bash
# `npm start`: dependencies, PostgreSQL on loopback (or DATABASE_URL), migrations, demo seed, client build, server.
source "$(dirname "$0")/lib/setup.sh"

ensure_media_tools
prepare_app_database
trap 'stop_fake_s3; close_database' EXIT
start_fake_s3_when_asked s3 "${GRIDCUE_S3_PORT:-5441}"

# Rebuild the client only when a source file is newer than the last build.
if [ ! -f "$ROOT/dist/index.html" ] || [ -n "$(find "$ROOT/src" "$ROOT/shared" "$ROOT/index.html" "$ROOT/vite.config.ts" -newer "$ROOT/dist/index.html" -print -quit)" ]; then
  log "building the client…"
  (cd "$ROOT" && npx vite build --logLevel warn)
fi

stop() {
  [ -n "${SERVER_PID:-}" ] && kill "$SERVER_PID" 2>/dev/null && wait "$SERVER_PID" 2>/dev/null
  exit "${STATUS:-0}"
}
trap stop INT TERM
export NODE_ENV=${NODE_ENV:-production}
(cd "$ROOT" && exec node --import tsx server/index.ts) &
SERVER_PID=$!
# the server may also end on its own (a port in use): stop the database with it either way
STATUS=0
wait "$SERVER_PID" || STATUS=$?
SERVER_PID=
stop
