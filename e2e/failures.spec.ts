import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

test("a member records a failure from a session; a steward completes the post-mortem with a replacement part", async ({ page }) => {
  await signInAs(page, "member");
  await logSession(page, "KM-06");
  const sessionUrl = page.url();
  await page.getByRole("link", { name: "Record a failure from this session" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Record a failure" })).toBeVisible();
  await page.getByLabel("Failed component").selectOption({ label: "KX-M200 (Switching transistor)" });
  await page.getByLabel("Failure mode").selectOption("over_temperature");
  await page.getByLabel("Symptoms").fill("Smell of hot epoxy, then the arcs stopped; the MOSFET is short drain to source.");
  await page.getByRole("button", { name: "Record failure" }).click();

  await expect(page.getByRole("heading", { level: 1, name: /^Post-mortem: KM-06 failure/ })).toBeVisible();
  const failureUrl = page.url();
  await expect(page.getByRole("heading", { name: "Likely causes" })).toBeVisible();
  const causes = page.locator("ol.ranked-causes > li");
  await expect(causes.first()).toContainText("Over-temperature");
  await expect(causes.first().locator("li").first()).toContainText(/failure recorded as over-temperature/i);
  await expect(page.getByRole("table", { name: /Headroom of the \d+ sessions? before the failure/ })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Complete the post-mortem" })).toHaveCount(0);
  await expect(page.getByText("A steward completes it")).toBeVisible();

  // The session it came from now shows as failed.
  await page.goto(sessionUrl);
  await expect(page.locator(".page-head .badge")).toHaveText("Failed");

  await page.context().clearCookies();
  await signInAs(page, "steward");
  await page.goto(failureUrl);
  await page.getByLabel("Root cause").fill("The sink ran hotter each session at the same supply; the pad had dried out.");
  await page.getByLabel("Corrective action").fill("Replaced the MOSFET and the pad; log sink temperatures every session.");
  await expect(page.getByLabel("Replacement part number")).toHaveValue("KX-M200");
  await expect(page.getByLabel("Voltage rating")).toHaveValue("200 V");
  await page.getByLabel("Replacement part number").fill("KX-M200-B");
  await page.getByRole("button", { name: "Complete post-mortem" }).click();
  // The page re-renders with the findings in place of the form.
  await expect(page.getByRole("heading", { level: 2, name: "Findings" })).toBeVisible();
  await page.reload();
  await expect(page.locator(".page-head .badge")).toHaveText("Completed");
  await expect(page.getByText("KX-M200-B, fitted")).toBeVisible();
  await page.goto("/failures?status=closed&q=KM-06");
  await expect(page.getByRole("link", { name: /Post-mortem of the KM-06 failure .*: completed/ })).toBeVisible();
  await page.goto("/coils/KM-06");
  const fitted = page.getByRole("region", { name: "Fitted parts" });
  await expect(fitted.getByRole("cell", { name: "KX-M200-B", exact: true })).toBeVisible();
  await expect(fitted.getByRole("row", { name: /^KX-M200 Switching transistor .*Failed \(over temperature\).*KX-M200-B$/ })).toBeVisible();
});

test("the printable post-mortem report renders", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/failures?q=KM-01");
  await page.getByRole("row").nth(1).getByRole("link").first().click();
  await page.getByRole("link", { name: "Printable report" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Post-mortem report — KM-01" })).toBeVisible();
  for (const name of ["Identity", "Timeline", "Parts fitted that day", "Margins before the failure", "Likely causes, ranked", "Findings"]) {
    await expect(page.getByRole("heading", { level: 2, name })).toBeVisible();
  }
  await expect(page.getByText("Completed by", { exact: true })).toBeVisible();
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: "Print this report" })).toBeHidden();
  await expect(page.locator(".site-header")).toBeHidden();
});

test("a member cannot complete a post-mortem: the server refuses", async ({ browser }) => {
  // The steward opens an open post-mortem; the same browser is then signed in as a member and submits it.
  const context = await browser.newContext();
  const page = await context.newPage();
  await signInAs(page, "member");
  await logSession(page, "KM-06");
  await page.getByRole("link", { name: "Record a failure from this session" }).click();
  await page.getByLabel("Symptoms").fill("Stopped oscillating; no visible damage yet.");
  await page.getByRole("button", { name: "Record failure" }).click();
  await expect(page.getByRole("heading", { level: 1, name: /^Post-mortem: KM-06 failure/ })).toBeVisible();
  const failureUrl = page.url();
  await page.context().clearCookies();
  await signInAs(page, "steward");
  await page.goto(failureUrl);
  await page.getByLabel("Root cause").fill("Member should not be able to write this root cause.");
  await page.getByLabel("Corrective action").fill("Member should not be able to write this action.");

  const other = await context.newPage();
  await context.clearCookies();
  await signInAs(other, "member");
  await page.getByRole("button", { name: "Complete post-mortem" }).click();
  await expect(page.getByRole("status").filter({ hasText: /steward/i })).toBeVisible();

  await other.goto(failureUrl);
  await expect(other.locator(".page-head .badge")).toHaveText("Open");
  await context.close();
});

test("a post-mortem corrects the failure mode; the list, the reliability table and the ranking follow it", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/failures/new?coil=KM-06");
  // The first test fitted KX-M200-B in place of the failed KX-M200.
  await page.getByLabel("Failed component").selectOption({ label: "KX-M200-B (Switching transistor)" });
  await page.getByLabel("Symptoms").fill("Sharp crack at full supply; the MOSFET reads short gate to drain.");
  await page.getByRole("button", { name: "Record failure" }).click();
  await expect(page.getByRole("heading", { level: 1, name: /^Post-mortem: KM-06 failure/ })).toBeVisible();
  const failureUrl = page.url();
  const failureId = failureUrl.split("/").at(-1)!;

  await expect(page.getByLabel("Failure mode found")).toHaveValue("unknown");
  await page.getByLabel("Failure mode found").selectOption("over_voltage");
  await page.getByLabel("Root cause").fill("Drain ringing reached the part's rating: no clamp was fitted after the rebuild.");
  await page.getByLabel("Corrective action").fill("Fit a clamp and log the peak drain voltage each session.");
  await page.getByLabel(/Record the replacement/).uncheck();
  await page.getByRole("button", { name: "Complete post-mortem" }).click();
  await expect(page.getByRole("heading", { level: 2, name: "Findings" })).toBeVisible();

  await page.reload();
  await expect(page.locator("dt", { hasText: /^Mode$/ }).locator("+ dd")).toHaveText("Over-voltage");
  await expect(page.locator("ol.ranked-causes > li").first()).toContainText("Over-voltage");

  await page.goto("/failures?mode=over_voltage&q=KM-06");
  await expect(page.locator(`a[href="/failures/${failureId}"]`).first()).toBeVisible();
  await page.goto("/failures?mode=unknown&q=KM-06");
  await expect(page.locator(`a[href="/failures/${failureId}"]`)).toHaveCount(0);

  await page.goto("/fleet/reliability");
  await expect(page.getByRole("row", { name: /^KX-M200-B / })).toContainText(/1 × Over-voltage/);
});
