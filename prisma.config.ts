import path from "node:path";
import { defineConfig } from "prisma/config";
import { PrismaBetterSQLite3 } from "@prisma/adapter-better-sqlite3";
import { databaseProvider, databaseUrl } from "./lib/config/database-url";
import { createCliPostgresAdapter } from "./prisma/postgresql/cli-adapter";

// The schema's datasource reads DATABASE_URL; give it the embedded default when unset.
const url = databaseUrl();
process.env.DATABASE_URL = url;
const postgres = databaseProvider(url) === "postgresql";

// All Prisma CLI configuration lives here. The JS engine with a driver adapter needs no native Prisma engine
// download, so generate/migrate/db push work offline. DATABASE_URL picks the database: the embedded SQLite file
// (prisma/schema.prisma, prisma/migrations) or PostgreSQL (prisma/postgresql/: the same schema with another
// provider, and its own migrations, since migration SQL is written per database).
export default defineConfig({
  schema: postgres ? path.join("prisma", "postgresql", "schema.prisma") : path.join("prisma", "schema.prisma"),
  migrations: { path: postgres ? path.join("prisma", "postgresql", "migrations") : path.join("prisma", "migrations"), seed: "tsx prisma/seed.ts" },
  experimental: { adapter: true },
  engine: "js",
  async adapter() {
    return postgres ? createCliPostgresAdapter(url) : new PrismaBetterSQLite3({ url });
  },
});
