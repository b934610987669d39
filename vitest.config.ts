import { defineConfig } from "vitest/config";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { INTEGRATION_DB_FILE } from "./test/support/paths";

// Two projects: the pure engineering/unit tests beside lib/ code, and integration tests in test/
// against a real SQLite file built from the committed migrations (see test/global-setup.ts).
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
          env: { DATABASE_URL: `file:${INTEGRATION_DB_FILE}`, COILYARD_DATA_DIR: path.dirname(INTEGRATION_DB_FILE) },
          // One SQLite file shared by the integration files: run them one after another.
          fileParallelism: false,
          testTimeout: 20_000,
        },
      },
    ],
  },
});
