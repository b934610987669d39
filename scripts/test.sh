#!/usr/bin/env bash
# The whole test suite: type-check, lint, unit and integration tests (vitest), then the browser
# tests (Playwright in Chromium) against a production build.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  npm ci --no-audit --no-fund
fi
bash scripts/ensure-chromium.sh
npx prisma generate >/dev/null

echo "==> Type-check"
npx tsc --noEmit -p .
echo "==> Lint"
npx eslint --max-warnings=0 .
echo "==> Unit and integration tests"
TZ=America/St_Johns npx vitest run
echo "==> Production build"
npx next build >/tmp/coilyard-build.log 2>&1 || { cat /tmp/coilyard-build.log; exit 1; }
echo "==> Browser tests"
npx playwright test
