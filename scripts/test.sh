#!/usr/bin/env bash
# `npm test`: the set-up the tests need (packages, services, a migrated and seeded
# `kerfcast_test` database), then type check, production build and every vitest
# project (unit, integration, e2e). Exits with vitest's code. Arguments go to vitest
# (`npm test -- --project unit`). DATABASE_URL is always the test database here:
# TEST_DATABASE_URL overrides it, a DATABASE_URL from the shell never leaks in.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

export KERFCAST_LOCAL=1
export NEXT_TELEMETRY_DISABLED=1
# The pinned AWS SDK runs on Node 20; its notice about future releases is noise here.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
export KERFCAST_DB_PORT="${KERFCAST_DB_PORT:-3307}"
export APP_URL="${APP_URL:-http://127.0.0.1:3000}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-$APP_URL}"

start=$(date +%s)
bash scripts/setup.sh
bash scripts/services-start.sh
# The install's database password, made by services-start.sh (.data/db-password).
db_password="$(tr -dc 'A-Za-z0-9' <"${KERFCAST_DATA_DIR:-.data}/db-password" 2>/dev/null || true)"
export DATABASE_URL="${TEST_DATABASE_URL:-mysql://kerfcast:${db_password:-kerfcast}@127.0.0.1:$KERFCAST_DB_PORT/kerfcast_test}"
# The test database has its own bucket too: its shop and estimate ids start at 1 like the
# demo database's, so sharing one bucket would let a test overwrite a demo program's objects.
export S3_BUCKET="${TEST_S3_BUCKET:-kerfcast-programs-test}"
npx tsx db/migrate.ts
npx tsx db/seed.ts >/dev/null
echo "[kerfcast] type check (tsc --noEmit)"
npx tsc --noEmit
echo "[kerfcast] production build (next build)"
npx next build
# the estimate worker thread's bundle (the server's piscina pool loads it)
node scripts/build-estimate-worker.mjs
echo "[kerfcast] tests (vitest run: unit, integration, e2e)"
set +e
mkdir -p .data
rm -f .data/vitest-report.json
npx vitest run --reporter=default --reporter=json --outputFile.json=.data/vitest-report.json "$@"
code=$?
# One plain closing line with the counts, whatever the reporter printed above.
node -e '
  const fs = require("node:fs");
  const f = ".data/vitest-report.json";
  if (!fs.existsSync(f)) { console.log("tests: no report written"); process.exit(0); }
  const r = JSON.parse(fs.readFileSync(f, "utf8"));
  const skipped = (r.numPendingTests || 0) + (r.numTodoTests || 0);
  console.log(`tests: ${r.numPassedTests} passed, ${r.numFailedTests} failed, ${skipped} skipped`);
'
set -e
echo "[kerfcast] npm test finished in $(( $(date +%s) - start )) s with exit code $code"
exit "$code"
