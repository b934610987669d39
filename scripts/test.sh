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
bash scripts/generate-clients.sh >/dev/null

echo "==> Type-check"
npx tsc --noEmit -p .
echo "==> Lint"
npx eslint --max-warnings=0 .
echo "==> Unit and integration tests (integration on the SQLite file)"
TZ=America/St_Johns npx vitest run

# The integration tests again on PostgreSQL: COILYARD_TEST_POSTGRES_URL names an expendable database (it is
# emptied), or scripts/ensure-postgres.sh installs/starts a local server when it can. CI must have both databases.
PG_URL="${COILYARD_TEST_POSTGRES_URL:-}"
if [ -z "$PG_URL" ]; then PG_URL="$(bash scripts/ensure-postgres.sh 2>/tmp/coilyard-pg.log)" || PG_URL=""; fi
if [ -n "$PG_URL" ]; then
  echo "==> Integration tests on PostgreSQL"
  COILYARD_TEST_POSTGRES_URL="$PG_URL" bash scripts/test-postgres.sh
elif [ -n "${CI:-}" ]; then
  cat /tmp/coilyard-pg.log >&2; echo "CI needs PostgreSQL for the integration tests (see scripts/ensure-postgres.sh)." >&2; exit 1
else
  echo "==> Integration tests on PostgreSQL: SKIPPED (no server; set COILYARD_TEST_POSTGRES_URL or see README)"
  cat /tmp/coilyard-pg.log
fi
echo "==> Production build"
npx next build >/tmp/coilyard-build.log 2>&1 || { cat /tmp/coilyard-build.log; exit 1; }
echo "==> Browser tests"
# With a PostgreSQL server at hand, the multi-instance spec runs too (it creates a database of its own there).
COILYARD_TEST_POSTGRES_URL="$PG_URL" npx playwright test
