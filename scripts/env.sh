# Environment of one Kitwright profile: "demo" (persistent, under .data/demo) or "test" (fresh each run,
# under .data/test, other ports so the two can run side by side). Sourced after lib.sh.
kw_profile() {
  local profile="$1"
  export NEXT_TELEMETRY_DISABLED=1
  export KW_PROFILE="$profile"
  case "$profile" in
    demo)
      export KW_STATE="${KW_STATE:-$KW_ROOT/.data/demo}" KW_RUN="${KW_RUN:-$KW_ROOT/.run/demo}"
      export KW_DB_PORT="${KW_DB_PORT:-33061}" KW_REDIS_PORT="${KW_REDIS_PORT:-63791}" SMTP_PORT="${SMTP_PORT:-2525}"
      export KW_APP_PORT="${KW_APP_PORT:-3000}" KW_DB_NAME="${KW_DB_NAME:-kitwright}" ;;
    test)
      export KW_STATE="${KW_STATE:-$KW_ROOT/.data/test}" KW_RUN="${KW_RUN:-$KW_ROOT/.run/test}"
      export KW_DB_PORT="${KW_DB_PORT:-33071}" KW_REDIS_PORT="${KW_REDIS_PORT:-63801}" SMTP_PORT="${SMTP_PORT:-2535}"
      export KW_APP_PORT="${KW_APP_PORT:-3100}" KW_DB_NAME="${KW_DB_NAME:-kitwright_test}" ;;
    *) log "unknown profile $profile"; return 1 ;;
  esac
  export KW_DB_HOST=127.0.0.1 KW_DB_USER=kitwright KW_DB_PASSWORD="${KW_DB_PASSWORD:-kitwright-local}"
  export KW_REDIS_URL="redis://127.0.0.1:$KW_REDIS_PORT"
  export KW_STORAGE_DIR="$KW_STATE/storage"
  # the SMTP fake keeps the mail; KW_MAIL_PAGE=1 lets the production build show it at /mail (each person their own)
  export SMTP_HOST=127.0.0.1 KW_MAIL_FAKE_DIR="$KW_STATE/mail" KW_MAIL_PAGE=1
  export KW_APP_URL="${KW_APP_URL:-http://localhost:$KW_APP_PORT}" NEXTAUTH_URL="${KW_APP_URL:-http://localhost:$KW_APP_PORT}"
  mkdir -p "$KW_STATE" "$KW_RUN"
  if [ ! -f "$KW_STATE/secret" ]; then head -c 32 /dev/urandom | base64 | tr -d '\n' >"$KW_STATE/secret"; fi
  NEXTAUTH_SECRET="$(cat "$KW_STATE/secret")"; export NEXTAUTH_SECRET
}

kw_start_services() {
  start_mariadb "$KW_STATE" "$KW_RUN" "$KW_DB_PORT"
  start_redis "$KW_STATE" "$KW_RUN" "$KW_REDIS_PORT"
  start_smtp_fake "$KW_STATE" "$KW_RUN" "$SMTP_PORT"
}

# The test profile with its services up and its database created and migrated, run from the repository root
# (with-test-env.sh, load.sh).
kw_test_env_up() {
  kw_profile test
  cd "$KW_ROOT"
  kw_start_services
  create_database "$KW_RUN" "$KW_DB_NAME"
  node --import tsx db/migrate.ts >/dev/null
}

kw_stop_all() {
  stop_pidfile "$KW_RUN/app.pid"
  stop_pidfile "$KW_RUN/worker.pid"
  stop_pidfile "$KW_RUN/smtp.pid"
  stop_redis "$KW_RUN" "$KW_REDIS_PORT"
  stop_mariadb "$KW_RUN"
}
