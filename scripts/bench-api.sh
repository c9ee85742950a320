#!/usr/bin/env bash
# `npm run bench:api`: the API load benchmark against a throw-away database of its own (or DATABASE_URL).
source "$(dirname "$0")/lib/setup.sh"

ensure_dependencies
export JWT_SECRET=${JWT_SECRET:-bench-secret-that-is-long-enough-for-hs256-signing}
trap close_database EXIT
open_database bench "${GRIDCUE_BENCH_PG_PORT:-5449}" gridcue_bench throwaway
run_tsx scripts/bench-api.ts "$@"
