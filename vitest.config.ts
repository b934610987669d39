import { defineConfig } from "vitest/config";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { fileURLToPath } from "node:url";
import { INTEGRATION_DB_FILE, integrationDatabaseUrl } from "./test/support/paths";

// Two projects: the pure engineering/unit tests beside lib/ code, and integration tests in test/
// against a real database built from the committed migrations: their own SQLite file, or PostgreSQL when
// COILYARD_TEST_DATABASE=postgresql (see test/global-setup.ts and test/support/paths.ts).
const integrationUrl = integrationDatabaseUrl();
export default defineConfig({
  resolve: { alias: { "@": fileURLToPath(new URL(".", import.meta.url)) } },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", environment: "node", include: ["lib/**/*.test.ts"], setupFiles: ["test/setup/fast-check.ts"] },
      },
      {
        extends: true,
        test: {
          name: "integration",
          environment: "node",
          include: ["test/**/*.test.ts"],
          globalSetup: ["test/global-setup.ts"],
          setupFiles: ["test/setup/fast-check.ts"],
          env: {
            DATABASE_URL: integrationUrl,
            COILYARD_DATA_DIR: path.dirname(INTEGRATION_DB_FILE),
            // PostgreSQL deployments must set a shared session secret (lib/config/env.ts); a throwaway one per run here.
            ...(integrationUrl.startsWith("file:") ? {} : { NEXTAUTH_SECRET: randomBytes(32).toString("base64url") }),
          },
          // One database shared by the integration files: run them one after another.
          fileParallelism: false,
          testTimeout: 20_000,
          // Loading the two-site demo network in a beforeAll takes several seconds on a busy 2-core machine.
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
