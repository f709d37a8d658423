#!/usr/bin/env bash
# Fault and hostile-input suites by hand (they also run in CI with the other integration tests):
#   bash scripts/faults.sh            the fault suite and the hostile-upload and decoder tests (about 1 minute)
#   bash scripts/faults.sh --full     also the full 10,000-file corpus through the decoder and through the upload API
# The fault suite starts its own MariaDB (34171) and Redis (64171) in a scratch folder; the test profile's
# services are started (not stopped) for the rest.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/with-test-env.sh npx vitest run --project integration tests/integration/faults tests/integration/hostile
if [ "${1:-}" = "--full" ]; then
  npx tsx tests/hostile/run-corpus.ts --count 10000
  bash scripts/with-test-env.sh node --conditions=react-server --import tsx tests/hostile/upload-corpus.ts --count 10000
fi
