#!/usr/bin/env bash
# Starts the production web server (`next start`; needs a `next build`) with the app's Node settings. Every
# script that serves the app (demo, tests, load, bench) starts it through here; extra arguments go to
# `next start` (-p PORT -H HOST), extra Node flags come from KW_APP_NODE_FLAGS.
#
# --heap-growing-percent=100: V8 lets the old generation grow at most to twice what the last full collection
# kept (its own rule allows up to four times while collections are cheap). A long upload turns thousands of
# short-lived stream objects into old garbage; this rule leaves much less of it uncollected, at the same speed
# and with a handful of extra full collections (bench/RESULTS.md, finding 8).
set -euo pipefail
cd "$(dirname "$0")/.."
# shellcheck disable=SC2086 # KW_APP_NODE_FLAGS is a list of flags
exec node --heap-growing-percent=100 --require ./scripts/serve-guard-preload.cjs ${KW_APP_NODE_FLAGS:-} node_modules/next/dist/bin/next start "$@"
