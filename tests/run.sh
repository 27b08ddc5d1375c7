#!/usr/bin/env bash
# The whole test suite, as `npm test` and CI run it: types, unit and integration tests, then the
# production build driven in Debian's Chromium.
set -euo pipefail
cd "$(dirname "$0")/.."
bash tests/ensure-tools.sh
echo "== types"
react-router typegen
tsc
echo "== unit and integration tests"
vitest run --project unit
echo "== production build"
react-router build
echo "== browser tests (built app in Chromium)"
vitest run --project e2e
