#!/usr/bin/env bash
# Started by Playwright: a fresh demo database for the browser tests, then the built app.
# Usage: e2e-server.sh [port]   (default 3100)
set -euo pipefail
cd "$(dirname "$0")/.."
PORT="${1:-3100}"
bash scripts/e2e-db.sh "data/e2e-${PORT}"
export DATABASE_URL="file:data/e2e-${PORT}/e2e.db"
export COILYARD_DATA_DIR="data/e2e-${PORT}"
exec npx next start -p "$PORT"
