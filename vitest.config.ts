import { defineConfig } from "vitest/config";
import path from "node:path";

// Two projects: the pure engineering/unit tests beside lib/ code, and integration tests in test/
// against a real SQLite file built from the committed migrations (see test/global-setup.ts).
export default defineConfig({
  resolve: { alias: { "@": path.resolve(__dirname) } },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", environment: "node", include: ["lib/**/*.test.ts"] },
      },
      {
        extends: true,
        test: {
          name: "integration",
          environment: "node",
          include: ["test/**/*.test.ts"],
          globalSetup: ["test/global-setup.ts"],
          // One SQLite file shared by the integration files: run them one after another.
          fileParallelism: false,
          testTimeout: 20_000,
        },
      },
    ],
  },
});
