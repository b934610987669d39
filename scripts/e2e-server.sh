#!/usr/bin/env bash
# Started by Playwright: a fresh demo database for the browser tests, then the built app on port 3100.
set -euo pipefail
cd "$(dirname "$0")/.."
export DATABASE_URL="file:./data/e2e/e2e.db"
export COILYARD_DATA_DIR="data/e2e"
mkdir -p data/e2e
rm -f data/e2e/e2e.db data/e2e/e2e.db-wal data/e2e/e2e.db-shm
npx prisma migrate deploy >/dev/null
npx tsx scripts/prepare-db.ts >/dev/null
npx tsx prisma/seed.ts
exec npx next start -p 3100
