import path from "node:path";
import { defineConfig } from "prisma/config";
import { PrismaBetterSQLite3 } from "@prisma/adapter-better-sqlite3";
import { databaseUrl } from "./lib/config/database-url";

// The schema's datasource reads DATABASE_URL; give it the embedded default when unset.
process.env.DATABASE_URL = databaseUrl();

// All Prisma CLI configuration lives here. The JS engine with the better-sqlite3 driver adapter
// needs no native Prisma engine download, so generate/migrate/db push work offline.
export default defineConfig({
  schema: path.join("prisma", "schema.prisma"),
  migrations: { path: path.join("prisma", "migrations"), seed: "tsx prisma/seed.ts" },
  experimental: { adapter: true },
  engine: "js",
  async adapter() {
    return new PrismaBetterSQLite3({ url: databaseUrl() });
  },
});
