#!/usr/bin/env bash
# Generate both Prisma clients: lib/db/generated (SQLite, prisma/schema.prisma) and lib/db/generated-postgresql
# (PostgreSQL, prisma/postgresql/schema.prisma). The app picks one at start-up from DATABASE_URL (lib/db/client.ts).
# Each run gets a URL of its own provider: Prisma checks the datasource URL's scheme even when only generating.
set -euo pipefail
cd "$(dirname "$0")/.."
DATABASE_URL="file:./data/generate-only.db" npx prisma generate --schema prisma/schema.prisma >/dev/null
DATABASE_URL="postgresql://generate-only@127.0.0.1:5432/unused" npx prisma generate --schema prisma/postgresql/schema.prisma >/dev/null
echo "Generated the Prisma clients (SQLite and PostgreSQL)"
