#!/usr/bin/env bash
# Shared set-up for `npm start`, `npm run dev` and `npm test`: dependencies, a project-local
# PostgreSQL on loopback (unless DATABASE_URL points elsewhere), and the JWT secret. Sourced, not run.
set -euo pipefail

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
# the newest PostgreSQL Debian installed (15 on Debian 12, 17 on Debian 13); PG_BIN overrides
newest_pg_bin() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }
PG_BIN=${PG_BIN:-$(newest_pg_bin)}
DATA_ROOT="$ROOT/.data"
mkdir -p "$DATA_ROOT"

log() { printf '\033[36m[gridcue]\033[0m %s\n' "$*"; }
die() { printf '\033[31m[gridcue] %s\033[0m\n' "$*" >&2; exit 1; }

# npm ci only when node_modules is missing or older than the lock file, so a warm start skips it.
ensure_dependencies() {
  local stamp="$ROOT/node_modules/.gridcue-installed"
  if [ ! -f "$stamp" ] || [ "$ROOT/package-lock.json" -nt "$stamp" ]; then
    log "installing dependencies (npm ci)…"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    touch "$stamp"
  fi
}

# apt_install WHAT PACKAGE…: one apt call for every package given
apt_install() {
  local what=$1
  shift
  [ "$(id -u)" = 0 ] || die "$what is missing. Install it first: sudo apt-get install -y $*"
  log "installing $* from Debian's packages…"
  DEBIAN_FRONTEND=noninteractive apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

# ffmpeg and ffprobe read and convert recordings, pocketsphinx with its English model hears a take's
# audio, espeak-ng and sox make the test recordings: whichever are missing come in one apt call.
ensure_media_tools() {
  local missing=()
  command -v ffprobe >/dev/null 2>&1 && command -v ffmpeg >/dev/null 2>&1 || missing+=(ffmpeg)
  command -v pocketsphinx_continuous >/dev/null 2>&1 || missing+=(pocketsphinx)
  [ -f /usr/share/pocketsphinx/model/en-us/cmudict-en-us.dict ] || missing+=(pocketsphinx-en-us)
  command -v espeak-ng >/dev/null 2>&1 || missing+=(espeak-ng)
  command -v sox >/dev/null 2>&1 || missing+=(sox)
  [ "${#missing[@]}" = 0 ] || apt_install "Part of the media tools (${missing[*]})" "${missing[@]}"
}

ensure_postgres_binaries() {
  if [ ! -x "$PG_BIN/initdb" ]; then
    apt_install "PostgreSQL (initdb)" postgresql
    PG_BIN=$(newest_pg_bin)
  fi
  [ -x "$PG_BIN/initdb" ] || die "PostgreSQL binaries not found under /usr/lib/postgresql (set PG_BIN to the folder holding initdb)"
}

# Runs a PostgreSQL server tool as the user that owns the cluster (PostgreSQL refuses root).
as_pg_user() {
  # from / so the tools don't complain about a working folder the postgres user cannot enter
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# The cluster lives in .data/ unless the postgres user cannot reach the checkout (e.g. under /root
# or a mode-700 temp folder); then it moves to a /var/tmp folder named after the checkout.
cluster_dir() {
  local name=$1 dir="$DATA_ROOT/$1"
  if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$DATA_ROOT"; then
    local hash
    hash=$(printf '%s' "$ROOT" | sha1sum | cut -c1-10)
    dir="/var/tmp/gridcue-pg-$hash/$name"
  fi
  printf '%s' "$dir"
}

# ensure_cluster NAME PORT [throwaway]: initialise once, start if not running. Sets CLUSTER_DIR,
# and CLUSTER_STARTED=yes when this call started it (no when it was already running).
ensure_cluster() {
  local name=$1 port=$2 throwaway=${3:-}
  ensure_postgres_binaries
  local dir
  dir=$(cluster_dir "$name")
  if [ ! -f "$dir/PG_VERSION" ]; then
    log "creating PostgreSQL cluster in $dir"
    mkdir -p "$dir"
    [ "$(id -u)" = 0 ] && chown -R postgres:postgres "$(dirname "$dir")"
    chmod 700 "$dir"
    as_pg_user "$PG_BIN/initdb" -D "$dir" -U postgres --auth=trust --encoding=UTF8 --locale=C.UTF-8 >/dev/null
    {
      echo "listen_addresses = '127.0.0.1'"
      echo "unix_socket_directories = ''"
      if [ "$throwaway" = throwaway ]; then
        # test data is recreated on every run, so durability only costs time here
        echo "fsync = off"; echo "synchronous_commit = off"; echo "full_page_writes = off"
      fi
    } >>"$dir/postgresql.conf"
  fi
  CLUSTER_STARTED=no
  if as_pg_user "$PG_BIN/pg_ctl" -D "$dir" status >/dev/null 2>&1; then
    log "PostgreSQL ($name) already running on 127.0.0.1:$port; it stays running afterwards"
  else
    if "$PG_BIN/pg_isready" -q -h 127.0.0.1 -p "$port" 2>/dev/null; then
      die "port $port is taken by another server; set GRIDCUE_PG_PORT to a free port or DATABASE_URL to use that server"
    fi
    log "starting PostgreSQL ($name) on 127.0.0.1:$port"
    as_pg_user "$PG_BIN/pg_ctl" -D "$dir" -l "$dir/server.log" -o "-p $port" -w -t 60 start >/dev/null \
      || die "PostgreSQL did not start; see $dir/server.log"
    CLUSTER_STARTED=yes
  fi
  CLUSTER_DIR=$dir
}

stop_cluster() {
  local dir=$1
  as_pg_user "$PG_BIN/pg_ctl" -D "$dir" -m fast -w stop >/dev/null 2>&1 || true
}

# open_database NAME PORT DB [throwaway]: the database start, dev and test run against. With
# DATABASE_URL set, that server is used and none started. Otherwise the project cluster NAME runs on
# 127.0.0.1:PORT with database DB (a throwaway cluster skips fsync and gets DB afresh every time) and
# DATABASE_URL is exported. Pair it with close_database on exit.
open_database() {
  local name=$1 port=$2 db=$3 throwaway=${4:-}
  OPENED_CLUSTER= OPENED_THROWAWAY=$throwaway
  if [ -n "${DATABASE_URL:-}" ]; then
    log "using the database at DATABASE_URL; starting no PostgreSQL${throwaway:+ (the tests empty it)}"
    return 0
  fi
  ensure_cluster "$name" "$port" "$throwaway"
  # a cluster that was already running belongs to whoever started it (another npm start, dev or test)
  [ "$CLUSTER_STARTED" = yes ] && OPENED_CLUSTER=$CLUSTER_DIR
  if [ "$throwaway" = throwaway ]; then recreate_database "$port" "$db"; else ensure_database "$port" "$db"; fi
  export DATABASE_URL="postgres://postgres@127.0.0.1:$port/$db"
}

# Stops the cluster open_database started, if it did; safe to call more than once.
close_database() {
  [ -n "${OPENED_CLUSTER:-}" ] || return 0
  log "stopping PostgreSQL"
  stop_cluster "$OPENED_CLUSTER"
  # a throwaway cluster parked in /var/tmp belongs to a checkout the postgres user can't enter (often a
  # temporary clone): don't leave it behind
  if [ "$OPENED_THROWAWAY" = throwaway ]; then
    case "$OPENED_CLUSTER" in /var/tmp/gridcue-pg-*) rm -rf "$(dirname "$OPENED_CLUSTER")" ;; esac
  fi
  OPENED_CLUSTER=
}

# What npm start and npm run dev share: dependencies, the JWT secret, the project database (stopped on
# exit if this run started it), migrations and the demo seed.
prepare_app_database() {
  ensure_dependencies
  ensure_jwt_secret
  trap close_database EXIT
  open_database main "${GRIDCUE_PG_PORT:-5433}" gridcue
  run_tsx scripts/migrate.ts --seed
}

ensure_database() {
  local port=$1 db=$2
  if ! "$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U postgres -tAc "select 1 from pg_database where datname='$db'" | grep -q 1; then
    "$PG_BIN/createdb" -h 127.0.0.1 -p "$port" -U postgres "$db"
  fi
}

recreate_database() {
  local port=$1 db=$2
  PGOPTIONS="-c client_min_messages=warning" "$PG_BIN/dropdb" -h 127.0.0.1 -p "$port" -U postgres --if-exists --force "$db"
  "$PG_BIN/createdb" -h 127.0.0.1 -p "$port" -U postgres "$db"
}

# A random secret made once per checkout, so tokens survive restarts but never ship in git.
ensure_jwt_secret() {
  local file="$DATA_ROOT/jwt-secret"
  [ -s "$file" ] || { head -c 48 /dev/urandom | base64 | tr -d '\n=' >"$file"; chmod 600 "$file"; }
  JWT_SECRET=${JWT_SECRET:-$(cat "$file")}
  export JWT_SECRET
}

run_tsx() { (cd "$ROOT" && node --import tsx "$@"); }

# start_fake_s3_when_asked NAME PORT [throwaway]: with STORAGE=s3 and no S3_ENDPOINT of your own, runs the
# local fake S3 server (s3rver, scripts/fake-s3.ts) on 127.0.0.1:PORT with its objects in .data/NAME (emptied
# first when throwaway) and points the S3 settings at it; no hosted account is needed. Pair with stop_fake_s3.
start_fake_s3_when_asked() {
  [ "${STORAGE:-disk}" = s3 ] || return 0
  # the SDK warns on every start that its releases from 2027 need Node 22; the pinned one runs on Node 20
  export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
  if [ -n "${S3_ENDPOINT:-}" ]; then
    log "STORAGE=s3: recordings go to the S3 store at $S3_ENDPOINT"
    return 0
  fi
  local name=$1 port=$2 throwaway=${3:-} dir="$DATA_ROOT/$1"
  if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
    die "port $port is taken; set GRIDCUE_S3_PORT (npm start, dev) or GRIDCUE_TEST_S3_PORT (npm test) to a free port"
  fi
  [ "$throwaway" = throwaway ] && rm -rf "$dir"
  log "STORAGE=s3: starting the fake S3 server on 127.0.0.1:$port (objects in $dir)"
  (cd "$ROOT" && exec node --import tsx scripts/fake-s3.ts "$dir" "$port" gridcue-recordings >/dev/null) &
  FAKE_S3_PID=$!
  local waited=0
  until (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; do
    kill -0 "$FAKE_S3_PID" 2>/dev/null || die "the fake S3 server did not start"
    [ $((waited += 1)) -le 300 ] || die "the fake S3 server did not answer within 30 s"
    sleep 0.1
  done
  export S3_ENDPOINT="http://127.0.0.1:$port" S3_BUCKET=gridcue-recordings S3_REGION=us-east-1 S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
}

# Stops the fake S3 server start_fake_s3_when_asked started, if it did; safe to call more than once.
stop_fake_s3() {
  [ -n "${FAKE_S3_PID:-}" ] || return 0
  kill "$FAKE_S3_PID" 2>/dev/null || true
  wait "$FAKE_S3_PID" 2>/dev/null || true
  FAKE_S3_PID=
}
