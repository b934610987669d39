/**
 * Integration tests run against a real database built from the committed migrations with the Prisma CLI, exactly
 * as a deployment is, rebuilt on every run: their own SQLite file, or (COILYARD_TEST_DATABASE=postgresql) an
 * emptied PostgreSQL database.
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { INTEGRATION_DB_FILE, integrationDatabaseUrl } from "./support/paths";
import { databaseProvider } from "../lib/config/database-url";

function prismaCli(url: string, args: string[]) {
  execFileSync(path.resolve("node_modules/.bin/prisma"), args, { env: { ...process.env, DATABASE_URL: url }, stdio: "pipe" });
}

async function emptyPostgresSchema(url: string) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query('DROP SCHEMA IF EXISTS "public" CASCADE');
    await client.query('CREATE SCHEMA "public"');
  } finally {
    await client.end();
  }
}

export default async function setup() {
  const url = integrationDatabaseUrl();
  if (databaseProvider(url) === "postgresql") {
    await emptyPostgresSchema(url);
    prismaCli(url, ["migrate", "deploy"]);
    return;
  }
  mkdirSync(path.dirname(INTEGRATION_DB_FILE), { recursive: true });
  for (const suffix of ["", "-wal", "-shm", "-journal"]) rmSync(INTEGRATION_DB_FILE + suffix, { force: true });
  prismaCli(url, ["migrate", "deploy"]);
  execFileSync(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "scripts/prepare-db.ts"], {
    env: { ...process.env, DATABASE_URL: url },
    stdio: "pipe",
  });
}
