#!/usr/bin/env bash
# One command from a fresh clone to a running Coilyard with the demo club:
# install, generate the Prisma client, create and migrate the embedded SQLite database,
# load the demo club (only into an empty database), build, and start on http://localhost:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "==> Installing packages (npm ci)"
  npm ci --no-audit --no-fund
fi
echo "==> Preparing the database"
bash scripts/db-setup.sh
echo "==> Loading the demo club (skipped when the database already has users)"
npx tsx prisma/seed.ts
echo "==> Building the app"
npx next build
echo "==> Starting Coilyard on http://localhost:${PORT:-3000}"
echo "    Demo sign-ins: admin@kettlewell.example / demo-admin-pass · steward@kettlewell.example / demo-steward-pass · member@kettlewell.example / demo-member-pass · organisation admin: coordinator@northmoor.example / demo-organisation-pass (README lists the rest)"
exec npx next start -p "${PORT:-3000}"
