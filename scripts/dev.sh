#!/usr/bin/env bash
# `npm run dev`: Vite's dev server with hot reload, and the API restarting on change.
source "$(dirname "$0")/lib/setup.sh"

PG_PORT=${GRIDCUE_PG_PORT:-5433}
ensure_dependencies
ensure_jwt_secret
if [ -z "${DATABASE_URL:-}" ]; then
  ensure_cluster main "$PG_PORT"
  ensure_database "$PG_PORT" gridcue
  export DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/gridcue"
fi
run_tsx scripts/migrate.ts --seed
export NODE_ENV=development
cd "$ROOT"
trap 'kill 0' INT TERM EXIT
npx tsx watch --clear-screen=false server/index.ts &
npx vite --host 127.0.0.1
