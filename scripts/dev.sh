#!/usr/bin/env bash
# `npm run dev`: Vite's dev server with hot reload, and the API restarting on change. Ctrl-C stops both,
# and the database if this run started it. Arguments go to Vite (`npm run dev -- --port 5190`).
source "$(dirname "$0")/lib/setup.sh"

ensure_media_tools
prepare_app_database
trap 'stop_fake_s3; close_database' EXIT
start_fake_s3_when_asked s3 "${GRIDCUE_S3_PORT:-5441}"

export NODE_ENV=development
cd "$ROOT"
# Both run in the background so a signal reaches this script at once (a foreground child would hold
# it back until that child ends); Vite keeps the terminal's input for its key shortcuts.
node_modules/.bin/tsx watch --clear-screen=false server/index.ts &
SERVER_PIDS=($!)
node_modules/.bin/vite --host 127.0.0.1 "$@" <&0 &
SERVER_PIDS+=($!)

stop() {
  trap - INT TERM
  kill "${SERVER_PIDS[@]}" 2>/dev/null
  # before the wait below, which waits for every job of this shell
  stop_fake_s3
  wait
  exit "${STATUS:-0}"
}
trap stop INT TERM
# when either server ends on its own, stop the other one with it
STATUS=0
wait -n || STATUS=$?
stop
