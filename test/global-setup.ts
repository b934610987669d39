/**
 * Integration tests run against a real SQLite file built from the committed migrations with the
 * Prisma CLI, exactly as a deployment is. Rebuilt on every run.
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { INTEGRATION_DB_FILE } from "./support/paths";

export default function setup() {
  mkdirSync(path.dirname(INTEGRATION_DB_FILE), { recursive: true });
  for (const suffix of ["", "-wal", "-shm", "-journal"]) rmSync(INTEGRATION_DB_FILE + suffix, { force: true });
  execFileSync(path.resolve("node_modules/.bin/prisma"), ["migrate", "deploy"], {
    env: { ...process.env, DATABASE_URL: `file:${INTEGRATION_DB_FILE}` },
    stdio: "pipe",
  });
  execFileSync(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "scripts/prepare-db.ts"], {
    env: { ...process.env, DATABASE_URL: `file:${INTEGRATION_DB_FILE}` },
    stdio: "pipe",
  });
}
