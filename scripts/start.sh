#!/usr/bin/env bash
# `npm start`: installs what is missing, starts MariaDB and the fakes, migrates and
# seeds the `kerfcast` database, builds, and serves on http://127.0.0.1:3000.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

# Production build served on loopback: lib/env.ts may use its local defaults.
export KERFCAST_LOCAL=1
export APP_URL="${APP_URL:-http://127.0.0.1:3000}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-$APP_URL}"
export NEXT_TELEMETRY_DISABLED=1
# The pinned AWS SDK runs on Node 20; its notice about future releases is noise here.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true

bash scripts/setup.sh
bash scripts/services-start.sh
npx tsx db/migrate.ts
npx tsx db/seed.ts >/dev/null
echo "[kerfcast] building the app (next build)"
npx next build
# the estimate worker thread's bundle (the server's piscina pool loads it)
node scripts/build-estimate-worker.mjs

echo
echo "Kerfcast is starting on $APP_URL"
npx tsx scripts/print-logins.ts
echo "Stop the services afterwards with: npm run stop"
echo
exec npx next start -H 127.0.0.1 -p 3000
