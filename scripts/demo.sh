#!/usr/bin/env bash
# Sets up and starts the Kitwright demo on this machine: installs what is missing, starts a private MariaDB,
# Redis and the SMTP fake under .data/demo, migrates and seeds, builds and starts the app at
# http://localhost:3000 and the worker. Ctrl-C (or `bash scripts/stop.sh`) stops everything; running it again
# reuses the data. Options: --background (return once started), --no-build (reuse the last build).
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
BACKGROUND=0; BUILD=1
for a in "$@"; do case "$a" in --background) BACKGROUND=1 ;; --no-build) BUILD=0 ;; esac; done

ensure_apt_packages
ensure_node_modules
kw_profile demo
cd "$KW_ROOT"
kw_start_services
create_database "$KW_RUN" "$KW_DB_NAME"
node --import tsx db/migrate.ts
node --conditions=react-server --import tsx db/seed-demo.ts
if [ "$BUILD" = 1 ] || [ ! -f .next/BUILD_ID ]; then log "building the app"; npx next build >"$KW_RUN/build.log" 2>&1 || { tail -30 "$KW_RUN/build.log"; exit 1; }; fi

stop_pidfile "$KW_RUN/app.pid"; stop_pidfile "$KW_RUN/worker.pid"
# on the caught-mail page the demo's owner reads every message (invitations to invented people); others their own
KW_MAIL_PAGE_ALL_TO="$(node --import tsx db/print-demo-accounts.ts --owner-email)"; export KW_MAIL_PAGE_ALL_TO
nohup bash scripts/serve-app.sh -p "$KW_APP_PORT" -H 127.0.0.1 >"$KW_RUN/app.log" 2>&1 & echo $! >"$KW_RUN/app.pid"
# lower priority than the web server: people's requests first, measuring in the gaps (the queue holds the rest)
nohup nice -n 10 node --conditions=react-server --import tsx workers/main.ts >"$KW_RUN/worker.log" 2>&1 & echo $! >"$KW_RUN/worker.pid"
for _ in $(seq 1 100); do curl -fsS "http://127.0.0.1:$KW_APP_PORT/api/health" >/dev/null 2>&1 && break; sleep 0.3; done
curl -fsS "http://127.0.0.1:$KW_APP_PORT/api/health" >/dev/null || { log "the app did not become healthy; see $KW_RUN/app.log"; tail -20 "$KW_RUN/app.log"; exit 1; }

# The demo library is generated, stored and queued; the worker measures it; then the demo kits and layouts
# are built from the catalogue and audited (each step skips what is already there).
node --conditions=react-server --import tsx db/seed-demo-library.ts
node --import tsx db/wait-catalogued.ts --timeout 600
node --conditions=react-server --import tsx db/seed-demo-kits.ts

cat <<MSG

  Kitwright is running at $KW_APP_URL
  Caught mail (verification and invitation links): $KW_APP_URL/mail
    (each person sees their own mail; the owner below sees all of it)
  MariaDB 127.0.0.1:$KW_DB_PORT   Redis 127.0.0.1:$KW_REDIS_PORT   SMTP fake 127.0.0.1:$SMTP_PORT
  Data: $KW_STATE   Logs: $KW_RUN

  Demo accounts (studio "Harbour Lane Studio"):
$(node --import tsx db/print-demo-accounts.ts)

MSG
if [ "$BACKGROUND" = 1 ]; then log "running in the background; stop with: bash scripts/stop.sh"; exit 0; fi
trap 'log "stopping"; kw_stop_all; exit 0' INT TERM
log "press Ctrl-C to stop"
while kill -0 "$(cat "$KW_RUN/app.pid")" 2>/dev/null; do sleep 2; done
log "the app stopped; see $KW_RUN/app.log"; kw_stop_all
