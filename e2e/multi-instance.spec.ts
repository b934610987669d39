/**
 * Several app instances sharing one PostgreSQL database, as a network of sites would run behind a load balancer:
 * a member signed in through one instance is signed in on the other (the session is a signed token, verified with
 * the shared NEXTAUTH_SECRET; nothing lives in an instance's memory), and what one instance writes the other shows.
 * Runs when COILYARD_TEST_POSTGRES_URL names a test server (CI always does); its own database is created fresh.
 */
import { execFileSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import pg from "pg";
import { expect, test } from "@playwright/test";
import path from "node:path";
import { OwnServer } from "./support/own-server";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

const serverUrl = process.env.COILYARD_TEST_POSTGRES_URL;
const basePort = Number(process.env.E2E_PORT ?? 3100) + 60;

test.describe("two instances on one PostgreSQL database", () => {
  test.skip(!serverUrl, "COILYARD_TEST_POSTGRES_URL is not set (CI sets it; see scripts/ensure-postgres.sh)");
  test.describe.configure({ timeout: 180_000 });

  const servers: OwnServer[] = [];

  test.beforeAll(async () => {
    test.setTimeout(180_000);
    const database = `coilyard_e2e_${basePort}`;
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS "${database}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${database}"`);
    await admin.end();
    const url = new URL(serverUrl!);
    url.pathname = `/${database}`;
    const env = { DATABASE_URL: url.toString(), NEXTAUTH_SECRET: randomBytes(32).toString("base64url") };
    execFileSync("npx", ["prisma", "migrate", "deploy"], { env: { ...process.env, ...env }, stdio: "pipe" });
    execFileSync("npx", ["tsx", "prisma/seed.ts"], { env: { ...process.env, ...env }, stdio: "pipe" });
    for (const port of [basePort, basePort + 1]) {
      const server = new OwnServer(port, path.resolve(`data/e2e-${port}`), env);
      servers.push(server);
      await server.start();
    }
  });

  test.afterAll(async () => {
    await Promise.all(servers.map((server) => server.stop()));
  });

  test("a sign-in on one instance is good on the other, and each shows what the other wrote", async ({ browser }) => {
    const [first, second] = servers as [OwnServer, OwnServer];
    const onFirst = await browser.newContext({ baseURL: first.baseURL });
    const page = await onFirst.newPage();
    await signInAs(page, "member");

    // The same browser (same cookies: they are per host, not per port) moves to the other instance.
    const cookies = await onFirst.cookies();
    const onSecond = await browser.newContext({ baseURL: second.baseURL });
    await onSecond.addCookies(cookies);
    const other = await onSecond.newPage();
    await other.goto("/");
    await expect(other.getByRole("button", { name: "Sign out" })).toBeVisible();
    await expect(other).not.toHaveURL(/sign-in/);

    await logSession(other, "KM-06");
    const sessionPath = new URL(other.url()).pathname;
    await page.goto(sessionPath);
    await expect(page.getByRole("heading", { level: 1, name: /^Session on KM-06/ })).toBeVisible();
    await page.goto("/sessions?coil=KM-06");
    await expect(page.locator(`a[href="${sessionPath}"]`).first()).toBeVisible();

    await onFirst.close();
    await onSecond.close();
  });
});
