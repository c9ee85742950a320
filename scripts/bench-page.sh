#!/usr/bin/env bash
# `npm run bench:page`: the episode page's JavaScript and first paint, with a throw-away database of its own (or DATABASE_URL).
source "$(dirname "$0")/lib/setup.sh"

ensure_dependencies
export JWT_SECRET=${JWT_SECRET:-bench-secret-that-is-long-enough-for-hs256-signing}
trap close_database EXIT
open_database bench "${GRIDCUE_BENCH_PG_PORT:-5449}" gridcue_bench throwaway
run_tsx scripts/bench-page.ts "$@"
