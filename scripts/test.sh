#!/usr/bin/env bash
# Runs every Kitwright test on this machine, as on a new one: installs what is missing, starts its own
# MariaDB, Redis and SMTP fake under .data/test (other ports than the demo), creates a fresh test database,
# then: type check, unit tests, integration tests, a production build, the scale test (tests/scale: two app and two
# worker processes on that build) and the browser tests.
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
export KW_NEED_BROWSER=1 KW_NEED_SOX=1
ensure_apt_packages
ensure_node_modules
cd "$KW_ROOT"
kw_profile test
kw_stop_all >/dev/null 2>&1 || true
rm -rf "$KW_STATE" && kw_profile test
trap 'kw_stop_all' EXIT
kw_start_services
create_database "$KW_RUN" "$KW_DB_NAME" fresh
node --import tsx db/migrate.ts

step() { log "── $1"; }
# the type check (one core) runs beside the corpus build (the other core); its output is shown when it fails
step "type check (in the background) and the corpus of real recordings (npm run corpus; reused when up to date)"
npx tsc --noEmit -p . >"$KW_RUN/tsc.log" 2>&1 & tsc_pid=$!
npm run -s corpus
wait "$tsc_pid" || { cat "$KW_RUN/tsc.log"; log "type check failed"; exit 1; }
step "unit tests"; npx vitest run --project unit
step "integration tests"; npx vitest run --project integration
step "build"; npx next build >"$KW_RUN/build.log" 2>&1 || { tail -40 "$KW_RUN/build.log"; exit 1; }
step "scale test (two apps, two workers, the S3 fake; KW_SCALE_FILES=${KW_SCALE_FILES:-200})"; npx vitest run --project scale
step "start app and worker"
nohup bash scripts/serve-app.sh -p "$KW_APP_PORT" -H 127.0.0.1 >"$KW_RUN/app.log" 2>&1 & echo $! >"$KW_RUN/app.pid"
nohup node --conditions=react-server --import tsx workers/main.ts >"$KW_RUN/worker.log" 2>&1 & echo $! >"$KW_RUN/worker.pid"
for _ in $(seq 1 100); do curl -fsS "http://127.0.0.1:$KW_APP_PORT/api/health" >/dev/null 2>&1 && break; sleep 0.3; done
step "browser tests"; npx vitest run --project e2e
# the page screenshots of tests/e2e/pages.test.ts stay for CI to keep as artefacts (wiped only when the next run starts)
log "screenshots: $KW_STATE/screenshots and test-results/screens"
log "all tests passed"
