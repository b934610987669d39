/**
 * PostgreSQL runs the same schema as the SQLite file: the copy in prisma/postgresql/ must be exactly what
 * derivePostgresSchema makes of prisma/schema.prisma (run `npm run db:postgres-schema` after editing the schema),
 * and its migrations, applied in order, must build exactly the schema Prisma would create for it from empty.
 */
import { readFileSync } from "node:fs";
import { execFileSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { POSTGRES_SCHEMA, SQLITE_SCHEMA, derivePostgresSchema } from "../prisma/postgresql/derive-schema";
import pg from "pg";
import { databaseProvider } from "@/lib/config/database-url";

async function withClient<T>(url: string, run: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await run(client);
  } finally {
    await client.end();
  }
}

/** A new, empty database beside the test database, named for its purpose; dropped first if a run left it. */
async function scratchDatabase(purpose: string): Promise<string> {
  const url = new URL(process.env.DATABASE_URL!);
  const name = `${url.pathname.slice(1)}_${purpose}`;
  await withClient(url.toString(), async (client) => {
    await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await client.query(`CREATE DATABASE "${name}"`);
  });
  url.pathname = `/${name}`;
  return url.toString();
}

/** The public schema as sorted lines of text: every column, constraint, index and enum label. */
async function describeSchema(url: string): Promise<string[]> {
  return withClient(url, async (client) => {
    const queries = [
      `SELECT format('column %s.%s %s %s default %s', table_name, column_name, data_type, is_nullable, coalesce(column_default, '-')) AS line
         FROM information_schema.columns WHERE table_schema = 'public' AND table_name <> '_prisma_migrations'`,
      `SELECT format('constraint %s %s %s', conrelid::regclass, conname, pg_get_constraintdef(oid)) AS line
         FROM pg_constraint WHERE connamespace = 'public'::regnamespace AND conrelid::regclass::text <> '_prisma_migrations'`,
      `SELECT format('index %s', indexdef) AS line FROM pg_indexes WHERE schemaname = 'public' AND tablename <> '_prisma_migrations'`,
      `SELECT format('enum %s %s %s', t.typname, e.enumsortorder, e.enumlabel) AS line
         FROM pg_enum e JOIN pg_type t ON t.oid = e.enumtypid JOIN pg_namespace n ON n.oid = t.typnamespace WHERE n.nspname = 'public'`,
    ];
    const lines: string[] = [];
    for (const query of queries) lines.push(...(await client.query<{ line: string }>(query)).rows.map((r) => r.line));
    return lines.sort();
  });
}

// Prisma's diff connects to the configured database even from empty, so this half runs in the PostgreSQL pass.
const onPostgres = databaseProvider(process.env.DATABASE_URL) === "postgresql";

describe("the PostgreSQL schema", () => {
  it("is the SQLite schema with only the provider and client output changed", () => {
    expect(readFileSync(POSTGRES_SCHEMA, "utf8")).toBe(derivePostgresSchema(readFileSync(SQLITE_SCHEMA, "utf8")));
  });

  it("refuses a schema whose provider line it cannot find, rather than writing a wrong copy", () => {
    expect(() => derivePostgresSchema('datasource db {\n  provider = "mysql"\n}\n')).toThrow(/provider = "sqlite"/);
  });

  it.runIf(onPostgres)("has migrations that build exactly the schema Prisma would create for it from empty", { timeout: 120_000 }, async () => {
    // Prisma 6.19 cannot diff from migrations or from a live database through a driver adapter (its shadow-database
    // and datasource diffs are refused), so the check is done by hand: two scratch databases, one built by
    // `migrate deploy` from prisma/postgresql/migrations, one by Prisma's from-empty script for the schema, and
    // their catalogs (columns, defaults, constraints, indexes, enums) compared.
    const fromEmpty = execFileSync(path.resolve("node_modules/.bin/prisma"), ["migrate", "diff", "--from-empty", "--to-schema-datamodel", POSTGRES_SCHEMA, "--script"], {
      env: process.env,
      encoding: "utf8",
      stdio: ["ignore", "pipe", "pipe"],
    });
    const [migrated, scripted] = [await scratchDatabase("migrated"), await scratchDatabase("scripted")];
    execFileSync(path.resolve("node_modules/.bin/prisma"), ["migrate", "deploy"], { env: { ...process.env, DATABASE_URL: migrated }, stdio: "pipe" });
    await withClient(scripted, (client) => client.query(fromEmpty));
    const [built, expected] = [await describeSchema(migrated), await describeSchema(scripted)];
    expect(built.length).toBeGreaterThan(100);
    expect(built).toEqual(expected);
  });
});
