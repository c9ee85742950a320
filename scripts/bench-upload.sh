#!/usr/bin/env bash
# `npm run bench:upload`: a 1 GB recording upload against each storage driver, with a throw-away database of its own (or DATABASE_URL).
source "$(dirname "$0")/lib/setup.sh"

ensure_dependencies
export JWT_SECRET=${JWT_SECRET:-bench-secret-that-is-long-enough-for-hs256-signing}
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
trap close_database EXIT
open_database bench "${GRIDCUE_BENCH_PG_PORT:-5449}" gridcue_bench throwaway
run_tsx scripts/bench-upload.ts "$@"
