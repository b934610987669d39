/**
 * PostgreSQL runs the same schema as the SQLite file: the copy in prisma/postgresql/ must be exactly what
 * derivePostgresSchema makes of prisma/schema.prisma (run `npm run db:postgres-schema` after editing the schema),
 * and its migrations must be exactly what Prisma would write for that schema from empty.
 */
import { readFileSync, readdirSync } from "node:fs";
import { execFileSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { POSTGRES_SCHEMA, SQLITE_SCHEMA, derivePostgresSchema } from "../prisma/postgresql/derive-schema";
import { databaseProvider } from "@/lib/config/database-url";

// Prisma's diff connects to the configured database even from empty, so this half runs in the PostgreSQL pass.
const onPostgres = databaseProvider(process.env.DATABASE_URL) === "postgresql";

describe("the PostgreSQL schema", () => {
  it("is the SQLite schema with only the provider and client output changed", () => {
    expect(readFileSync(POSTGRES_SCHEMA, "utf8")).toBe(derivePostgresSchema(readFileSync(SQLITE_SCHEMA, "utf8")));
  });

  it("refuses a schema whose provider line it cannot find, rather than writing a wrong copy", () => {
    expect(() => derivePostgresSchema('datasource db {\n  provider = "mysql"\n}\n')).toThrow(/provider = "sqlite"/);
  });

  it.runIf(onPostgres)("has migrations whose statements include every one Prisma writes for that schema from empty", { timeout: 90_000 }, () => {
    // Prisma 6.19 cannot diff from migrations or from the live database with a driver adapter (its shadow-database
    // and datasource diffs are refused), so the check is on the SQL: every statement of the from-empty script must
    // appear in some migration. PostgreSQL migrations are therefore kept additive (new tables, columns, indexes).
    const dir = path.join(path.dirname(POSTGRES_SCHEMA), "migrations");
    const migrations = readdirSync(dir, { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name).sort();
    expect(migrations.length).toBeGreaterThan(0);
    const applied = migrations.map((name) => readFileSync(path.join(dir, name, "migration.sql"), "utf8")).join("\n");
    const fromEmpty = execFileSync(path.resolve("node_modules/.bin/prisma"), ["migrate", "diff", "--from-empty", "--to-schema-datamodel", POSTGRES_SCHEMA, "--script"], {
      env: process.env,
      encoding: "utf8",
      stdio: ["ignore", "pipe", "pipe"],
    });
    const statements = (sql: string) => new Set(sql.split(";").map((s) => s.replace(/--.*$/gm, "").trim()).filter(Boolean));
    expect([...statements(fromEmpty)].filter((s) => !statements(applied).has(s))).toEqual([]);
  });
});
