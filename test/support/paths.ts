import { fileURLToPath } from "node:url";

/** The integration tests' own database file, away from the demo database. */
export const INTEGRATION_DB_FILE = fileURLToPath(new URL("../../data/test/integration.db", import.meta.url));

/**
 * The database the integration tests run against: their own SQLite file, or the PostgreSQL database named by
 * COILYARD_TEST_POSTGRES_URL when COILYARD_TEST_DATABASE=postgresql (scripts/test.sh runs the suite both ways).
 * That PostgreSQL database is emptied on every run: never point it at one you care about.
 */
export function integrationDatabaseUrl(env: NodeJS.ProcessEnv = process.env): string {
  if (env.COILYARD_TEST_DATABASE !== "postgresql") return `file:${INTEGRATION_DB_FILE}`;
  const url = env.COILYARD_TEST_POSTGRES_URL?.trim();
  if (!url) throw new Error("COILYARD_TEST_DATABASE=postgresql needs COILYARD_TEST_POSTGRES_URL (scripts/ensure-postgres.sh prints one).");
  return url;
}
