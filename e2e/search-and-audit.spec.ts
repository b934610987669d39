import { expect, test } from "@playwright/test";
import Database from "better-sqlite3";
import { signInAs } from "./support/accounts";
import { DEFAULT_SITE_ID } from "../lib/db/site-scope";

const port = Number(process.env.E2E_PORT ?? 3100);

test("the app has an icon, served without signing in and linked from every page", async ({ page, request }) => {
  const icon = await request.get("/icon.svg", { maxRedirects: 0 });
  expect(icon.status()).toBe(200);
  expect(icon.headers()["content-type"]).toMatch(/image\/svg\+xml/);
  await page.goto("/sign-in");
  const href = await page.locator('head link[rel="icon"]').first().getAttribute("href");
  expect(href).toMatch(/^\/icon\.svg/);
  expect((await request.get(href!)).status()).toBe(200);
});

test("the sweeps and sessions lists search on the server by coil", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sweeps");
  const sweepSearch = page.getByRole("search", { name: "Filter sweeps" });
  await sweepSearch.getByLabel("Search").fill("km-03");
  await sweepSearch.getByRole("button", { name: "Apply" }).click();
  await expect(page).toHaveURL(/[?&]q=km-03/);
  const sweepRows = page.locator("tbody tr");
  await expect(sweepRows.first()).toContainText("KM-03");
  for (const row of await sweepRows.all()) await expect(row).toContainText("KM-03");

  await page.goto("/sessions");
  const sessionSearch = page.getByRole("search", { name: /sessions/i });
  await sessionSearch.getByLabel("Search").fill("KM-05");
  await sessionSearch.getByRole("button", { name: "Apply" }).click();
  const sessionRows = page.locator("tbody tr");
  await expect(sessionRows.first()).toContainText("KM-05");
  for (const row of await sessionRows.all()) await expect(row).toContainText("KM-05");
});

test("the admin audit log filters by who, what and when, and shows figures with SI prefixes", async ({ page }) => {
  // An entry written as older versions wrote sweep summaries (a bare figure in hertz), straight into the e2e database,
  // at the demo club's site (the default site): the log shows the current site's events only.
  const db = new Database(`data/e2e-${port}/e2e.db`);
  try {
    db.prepare("INSERT INTO AuditEvent (siteId, at, actorId, action, entity, entityId, summary) VALUES (?, ?, NULL, 'create', 'Sweep', 'e2e-sweep', ?)").run(
      DEFAULT_SITE_ID,
      new Date().toISOString().replace("Z", "+00:00"),
      "Recorded a 120-point sweep of KM-01, first series resonance 330962 Hz",
    );
  } finally {
    db.close();
  }
  await signInAs(page, "admin");
  await page.goto("/admin");
  const filters = page.getByRole("search", { name: "Filter the audit log" });
  await filters.getByLabel("Who").selectOption({ label: "System (no user)" });
  await filters.getByLabel("Record").selectOption("Sweep");
  await filters.getByLabel("What (words)").fill("series resonance");
  const today = await page.evaluate(() => new Date().toLocaleDateString("en-CA"));
  await filters.getByLabel("From").fill(today);
  await filters.getByLabel("To").fill(today);
  await filters.getByRole("button", { name: "Apply" }).click();
  const log = page.getByRole("table").filter({ has: page.locator("caption", { hasText: /matching the filters/ }) });
  await expect(log.getByRole("row", { name: /first series resonance 331 kHz/ })).toBeVisible();
  await expect(log).not.toContainText("330962 Hz");
  await expect(log.locator("tbody tr")).toHaveCount(1);

  // Another day finds nothing.
  await filters.getByLabel("From").fill("2001-01-01");
  await filters.getByLabel("To").fill("2001-01-02");
  await filters.getByRole("button", { name: "Apply" }).click();
  await expect(page.getByText("No change matches these filters.")).toBeVisible();

  await page.goto("/admin/policy");
  await expect(page.locator("caption").first()).toHaveText(/^(1 version|\d+ versions), newest first$/);
});
