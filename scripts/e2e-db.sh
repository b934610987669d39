#!/usr/bin/env bash
# A fresh demo database for browser tests: <dir>/e2e.db built from the migrations, switched to WAL mode and
# seeded with the demo club. Used by e2e-server.sh and by the specs that run a server of their own
# (e2e/support/own-server.ts). Usage: e2e-db.sh <dir>
set -euo pipefail
cd "$(dirname "$0")/.."
DIR="${1:?usage: e2e-db.sh <dir>}"
export DATABASE_URL="file:${DIR}/e2e.db"
export COILYARD_DATA_DIR="${DIR}"
mkdir -p "${DIR}"
rm -f "${DIR}"/e2e.db*
npx prisma migrate deploy >/dev/null
npx tsx scripts/prepare-db.ts >/dev/null
npx tsx prisma/seed.ts
