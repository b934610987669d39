#!/usr/bin/env bash
# Generate the Prisma client and bring the database (DATABASE_URL, default data/coilyard.db) up to
# the committed migrations. Safe to run again: applied migrations are skipped.
set -euo pipefail
cd "$(dirname "$0")/.."
mkdir -p data
bash scripts/generate-clients.sh >/dev/null
npx prisma migrate deploy
npx tsx scripts/prepare-db.ts
npx tsx scripts/backfill-session-fits.ts
