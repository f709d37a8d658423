#!/usr/bin/env bash
# Stops the demo's app, worker, SMTP fake, Redis and MariaDB (or the test profile's: `stop.sh test`).
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
kw_profile "${1:-demo}"
kw_stop_all
log "stopped ($KW_PROFILE)"
