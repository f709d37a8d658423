#!/usr/bin/env bash
# Several processes, larger: `bash scripts/scale.sh [files]` (default 2000). On the test profile's services
# (scripts/env.sh; started if needed, left running: stop them with `bash scripts/stop.sh test`), it runs the scale
# test (tests/scale/scale.test.ts: two app processes and two workers sharing MariaDB, Redis and the S3 fake, one of
# each killed mid-way, every file and the catalogues and audits checked against the command line) with that many
# files, then prints the figures (bench/scale.ts): upload files/s through two apps, measure-and-sort files/s with one
# and with two workers, and each process's peak memory. Builds the app first when there is no build, or when a
# source file is newer than it (KW_SCALE_BUILD=1 forces a build). Scratch data goes to the database
# `kitwright_scale`, Redis database 7 and a temporary folder, made fresh by each run.
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
FILES="${1:-2000}"
ensure_apt_packages
ensure_node_modules
cd "$KW_ROOT"
kw_profile test
kw_start_services
if [ "${KW_SCALE_BUILD:-0}" = 1 ] || [ ! -f .next/BUILD_ID ] || [ -n "$(find app lib components next.config.ts -newer .next/BUILD_ID -type f -print -quit)" ]; then
  log "building the app (npx next build)"
  npx next build >"$KW_RUN/build.log" 2>&1 || { tail -40 "$KW_RUN/build.log"; exit 1; }
fi
log "scale test with $FILES files"
KW_SCALE_FILES="$FILES" npx vitest run --project scale
log "figures with $FILES files"
node --conditions=react-server --import tsx bench/scale.ts --files "$FILES"
