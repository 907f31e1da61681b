#!/usr/bin/env bash
# `npm test`: the same set-up as `npm start`, then lint, types, one build and every test project.
# Exits non-zero on the first failure and stops what it started.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/setup.sh --browser
source scripts/env.sh
export PATH="/usr/sbin:$PATH"

started_db=0
if ! bash scripts/db.sh status >/dev/null 2>&1; then started_db=1; fi
bash scripts/db.sh start
cleanup() { [ "$started_db" = 1 ] && bash scripts/db.sh stop || true; }
trap cleanup EXIT

# A separate database for tests, recreated on every run.
export NUXT_DB_NAME="${PERPEND_TEST_DB:-perpend_test}"
bash scripts/db.sh recreate "$NUXT_DB_NAME"
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
# Test mail goes nowhere unless a test starts its own catcher and points the server at it.
export NUXT_MAIL_URL="${PERPEND_TEST_MAIL_URL:-smtp://127.0.0.1:1}"
# Reminder sweeps only where a test turns them on (they would mail the seeded waiting enquiries).
export NUXT_REMINDER_SWEEP_MS=0
export NUXT_UPLOAD_DIR="$PERPEND_VAR/test-uploads"
rm -rf "$NUXT_UPLOAD_DIR" test-output
mkdir -p test-output

echo "== lint"; npx eslint .
echo "== typecheck"; npx nuxt typecheck
echo "== build"; npx nuxt build > test-output/build.log 2>&1 || { tail -40 test-output/build.log; exit 1; }
# One project after another: API and browser servers share the test database and its outbox.
echo "== unit tests"; npx vitest run --project unit
echo "== api tests"; npx vitest run --project api
echo "== browser tests"; npx vitest run --project browser
echo "== security tests"; npx vitest run --project security --passWithNoTests
echo "== fault tests"; npx vitest run --project faults --passWithNoTests
