import { fileURLToPath } from "node:url";

/** The integration tests' own database file, away from the demo database. */
export const INTEGRATION_DB_FILE = fileURLToPath(new URL("../../data/test/integration.db", import.meta.url));
