#!/usr/bin/env bash
# The integration tests on PostgreSQL (see DEVELOPERS.md): COILYARD_TEST_POSTGRES_URL, or a local server that
# scripts/ensure-postgres.sh installs and starts when it can.
set -euo pipefail
cd "$(dirname "$0")/.."
URL="${COILYARD_TEST_POSTGRES_URL:-$(bash scripts/ensure-postgres.sh)}"
COILYARD_TEST_DATABASE=postgresql COILYARD_TEST_POSTGRES_URL="$URL" TZ=America/St_Johns exec npx vitest run --project integration "$@"
