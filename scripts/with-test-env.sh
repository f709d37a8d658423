#!/usr/bin/env bash
# Runs a command with the test profile's services up and its environment set (for running single test
# files by hand): `bash scripts/with-test-env.sh npx vitest run tests/integration/platform.test.ts`.
# The database is migrated but not wiped; tests create their own data. Stop with `bash scripts/stop.sh test`.
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/env.sh"
kw_test_env_up
"$@"
