#!/usr/bin/env bash
# `npm test`: the whole suite, ending with one line per stage and `N passed, N failed`.
# Setup stages (install, environment, database, test migrations) stop the run when they
# fail; check stages (typecheck, lint, vitest, build, e2e) all run and are all reported.
# Counted cases: every vitest and e2e test, plus typecheck and lint as one case each,
# plus one failure for any stage that could not run or crashed without a count.
set -uo pipefail
cd "$(dirname "$0")/.."
# shellcheck source=scripts/common.sh
. scripts/common.sh

ART=tests/.artifacts
mkdir -p "$ART"
SUMMARY=()
PASSED=0
FAILED=0
DB_STARTED_HERE=""

cleanup() {
  if [ -n "$DB_STARTED_HERE" ]; then bash scripts/db.sh stop >/dev/null 2>&1 || true; fi
}
trap cleanup EXIT
trap 'echo "test: interrupted" >&2; exit 130' INT TERM

stage_line() { SUMMARY+=("$(printf '%-10s %-7s %s' "$1" "$2" "$3")"); }

finish() {
  echo
  echo "================ summary ================"
  local l
  for l in "${SUMMARY[@]}"; do echo "$l"; done
  echo "========================================="
  echo "$PASSED passed, $FAILED failed"
  if [ "$FAILED" -gt 0 ]; then exit 1; fi
  exit 0
}

# Runs a setup step; on failure records it and ends the run.
setup() {
  local name=$1; shift
  local t0=$SECONDS
  echo
  echo "── $name ──"
  if "$@"; then
    stage_line "$name" ok "$((SECONDS - t0)) s"
  else
    stage_line "$name" FAILED "$((SECONDS - t0)) s — later stages not run"
    FAILED=$((FAILED + 1))
    finish
  fi
}

# Runs a check counted as one case.
check() {
  local name=$1; shift
  local t0=$SECONDS
  echo
  echo "── $name ──"
  if "$@"; then
    stage_line "$name" ok "$((SECONDS - t0)) s"
    PASSED=$((PASSED + 1))
  else
    stage_line "$name" FAILED "$((SECONDS - t0)) s"
    FAILED=$((FAILED + 1))
  fi
}

# Reads {passed, failed} from a JSON report: vitest's (numPassedTests…) or the e2e runner's.
read_counts() {
  node -e '
    const fs = require("node:fs");
    try {
      const r = JSON.parse(fs.readFileSync(process.argv[1], "utf8"));
      const p = r.numPassedTests ?? r.passed, f = r.numFailedTests ?? r.failed;
      if (typeof p !== "number" || typeof f !== "number") process.exit(1);
      console.log(p + " " + f);
    } catch { process.exit(1); }' "$1"
}

# Runs a test stage that writes a JSON report; adds its case counts.
suite() {
  local name=$1 report=$2; shift 2
  local t0=$SECONDS rc counts p f
  echo
  echo "── $name ──"
  rm -f "$report"
  "$@"
  rc=$?
  if counts=$(read_counts "$report"); then
    p=${counts% *}; f=${counts#* }
    PASSED=$((PASSED + p)); FAILED=$((FAILED + f))
    if [ "$rc" -ne 0 ] && [ "$f" -eq 0 ]; then
      FAILED=$((FAILED + 1))
      stage_line "$name" FAILED "$p passed, exit code $rc ($((SECONDS - t0)) s)"
    elif [ "$f" -gt 0 ]; then
      stage_line "$name" FAILED "$p passed, $f failed ($((SECONDS - t0)) s)"
    else
      stage_line "$name" ok "$p passed ($((SECONDS - t0)) s)"
    fi
  else
    FAILED=$((FAILED + 1))
    stage_line "$name" FAILED "no report (exit code $rc) — see the output above"
  fi
}

install_all() {
  check_node && ensure_node_modules && ensure_apt mariadb-server chromium poppler-utils
}

start_db() {
  if ! bash scripts/db.sh status >/dev/null 2>&1; then DB_STARTED_HERE=1; fi
  bash scripts/db.sh start
}

setup install install_all
setup env node scripts/ensure-env.mjs
setup database start_db
setup migrate timeout 300 node --import tsx scripts/migrate.ts --test

check typecheck timeout 900 node node_modules/typescript/bin/tsc --noEmit -p tsconfig.json
check lint timeout 900 node node_modules/eslint/bin/eslint.js .
suite vitest "$ART/vitest.json" timeout --kill-after=30 1800 \
  node node_modules/vitest/vitest.mjs run --reporter=default --reporter=json --outputFile.json="$ART/vitest.json"

t0=$SECONDS
echo
echo "── build ──"
if timeout 1200 bash -c '. scripts/common.sh && build_if_changed'; then
  stage_line build ok "$((SECONDS - t0)) s"
  suite e2e "$ART/e2e.json" timeout --kill-after=30 1800 node --import tsx tests/e2e/run.ts --report "$ART/e2e.json"
else
  stage_line build FAILED "$((SECONDS - t0)) s"
  FAILED=$((FAILED + 1))
  stage_line e2e "not run" "the production build failed"
  FAILED=$((FAILED + 1))
fi

finish
