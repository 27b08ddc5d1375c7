#!/usr/bin/env bash
# The whole test suite, as `npm test` and CI run it: lint and format, types, unit and integration tests on SQLite, the
# integration tests again on PostgreSQL, the production build, then the build driven in Debian's Chromium. Every stage runs even when an earlier one failed (the browser tests need the
# build), and the output ends with one line, `N passed, N failed`, summed over all stages by
# tests/support/test-summary.mjs: each test of a vitest stage counts, and each other stage counts as one.
# Exits non-zero when anything failed.
set -uo pipefail
cd "$(dirname "$0")/.."
# Plain text when the output is not a terminal (CI logs, files).
if [ ! -t 1 ]; then
  export NO_COLOR=1
  unset FORCE_COLOR
fi
results="$(mktemp -d)"
trap 'rm -rf "$results"' EXIT
stage_number=0

# stage NAME COMMAND...: runs a stage that is one check (it passes or fails as a whole).
stage() {
  local name=$1
  shift
  stage_number=$((stage_number + 1))
  echo "== $name"
  "$@"
  echo $? >"$results/$stage_number-$name.exit"
}

# vitest_stage NAME PROJECT: runs a vitest project, keeping its JSON report for the summary.
vitest_stage() {
  local name=$1 project=$2
  stage_number=$((stage_number + 1))
  echo "== $name"
  touch "$results/$stage_number-$name.vitest"
  vitest run --project "$project" --reporter=default --reporter=json \
    --outputFile.json="$results/$stage_number-$name.json"
  echo $? >"$results/$stage_number-$name.exit"
}

# not_run NAME REASON: a stage that could not run counts as one failure.
not_run() {
  stage_number=$((stage_number + 1))
  echo "== $1: not run ($2)"
  echo "not run" >"$results/$stage_number-$1.exit"
}

passed() { [ "$(cat "$results"/*-"$1".exit)" = 0 ]; }

stage lint bash -c "eslint -c .eslint.config.js . && prettier --check ."
stage types bash -c "react-router typegen && tsc"
vitest_stage unit unit
tools=ok
bash tests/ensure-tools.sh || tools=missing
# The integration tests again on PostgreSQL (a throwaway server on loopback, stopped at the end).
if [ "$tools" = ok ]; then
  vitest_stage postgres postgres
else
  not_run postgres "PostgreSQL is missing"
fi
stage build react-router build
if ! passed build; then
  not_run e2e "the build failed"
elif [ "$tools" != ok ]; then
  not_run e2e "Chromium, poppler-utils or PostgreSQL is missing"
else
  vitest_stage e2e e2e
fi
node tests/support/test-summary.mjs "$results"
