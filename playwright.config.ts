import { defineConfig } from "@playwright/test";

// E2E_PORT lets two checkouts run their browser tests side by side.
const port = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://localhost:${port}`;

// Browser tests run the production build against Debian's Chromium (no browser download).
export default defineConfig({
  testDir: "e2e",
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  projects: [
    { name: "desktop", use: { viewport: { width: 1280, height: 800 } }, testIgnore: /phone\.spec\.ts/ },
    { name: "phone", use: { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true }, testMatch: /phone\.spec\.ts/ },
  ],
  webServer: {
    command: `bash scripts/e2e-server.sh ${port}`,
    url: `${baseURL}/sign-in`,
    timeout: 180_000,
    reuseExistingServer: false,
    env: { NEXTAUTH_URL: baseURL, NEXT_TELEMETRY_DISABLED: "1" },
  },
});
