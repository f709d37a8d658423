#!/usr/bin/env bash
# Load test (by hand, not in CI): the test profile's MariaDB and Redis, a production server on port 3500 and
# one worker, then tests/load/drive.ts for 60 s: signed-in browsing and audit runs at about 200 requests/s
# (autocannon) plus 50 concurrent uploaders; every uploaded file must end catalogued or rejected with a reason.
# Prints p50/p95/p99 and errors and writes them into bench/RESULTS.md. Needs a build: `npx next build` first
# (the script builds only when .next has none). Exit code 0 = pass (zero errors, zero lost samples).
# Options are passed to the driver: bash scripts/load.sh --seconds 60 --rate 200 --uploaders 50
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
kw_test_env_up

PORT="${KW_LOAD_PORT:-3500}"
export KW_APP_URL="http://127.0.0.1:$PORT" NEXTAUTH_URL="http://127.0.0.1:$PORT"
RUN="$KW_RUN/load"; mkdir -p "$RUN"
if [ ! -f .next/BUILD_ID ]; then log "no production build: building (slow)"; npx next build >"$RUN/build.log" 2>&1 || { tail -30 "$RUN/build.log"; exit 1; }; fi

APP_PID=""; WORKER_PID=""
cleanup() {
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null || true
  [ -n "$WORKER_PID" ] && kill "$WORKER_PID" 2>/dev/null || true
  sleep 1
  [ -n "$APP_PID" ] && kill -9 "$APP_PID" 2>/dev/null || true
  [ -n "$WORKER_PID" ] && kill -9 "$WORKER_PID" 2>/dev/null || true
}
trap cleanup EXIT
KW_APP_NODE_FLAGS="${KW_LOAD_NODE_FLAGS:-}" bash scripts/serve-app.sh -p "$PORT" -H 127.0.0.1 >"$RUN/app.log" 2>&1 & APP_PID=$!
# the worker runs at a lower priority, as scripts/demo.sh starts it: requests first, measuring in the gaps
nice -n 10 node --conditions=react-server --import tsx workers/main.ts >"$RUN/worker.log" 2>&1 & WORKER_PID=$!
for _ in $(seq 1 150); do curl -fsS "http://127.0.0.1:$PORT/api/health" >/dev/null 2>&1 && break; sleep 0.2; done
curl -fsS "http://127.0.0.1:$PORT/api/health" >/dev/null || { log "server did not start"; tail -20 "$RUN/app.log"; exit 1; }
log "server (pid $APP_PID) and worker (pid $WORKER_PID) up; driving load"
set +e
node --import tsx tests/load/drive.ts --base "http://127.0.0.1:$PORT" "$@"
rc=$?
set -e
log "server log: $RUN/app.log; worker log: $RUN/worker.log"
exit $rc
