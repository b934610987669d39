import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

/** The coil page's health badge text for `tag` ("Fine", "Watch", "Hold", "Not enough data"). */
async function coilHealth(page: Page, tag: string): Promise<string> {
  await page.goto(`/coils/${tag}`);
  return ((await page.getByTestId("health-status").textContent()) ?? "").trim();
}

test("after a refused session form, focus lands on the first field in error and the summary sits above the fields", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions/new?coil=KM-06");
  await page.getByLabel("Supply voltage").fill("48 kV");
  await page.getByLabel("Average current").fill("2,5 A");
  await page.getByLabel("Duration").fill("4:00");
  await page.getByLabel("Ambient temperature").fill("21,5");
  await page.getByRole("button", { name: "Save session" }).click();
  const voltage = page.getByLabel("Supply voltage");
  await expect(voltage).toHaveAttribute("aria-invalid", "true");
  await expect(voltage).toBeFocused();
  const summary = page.locator("#session-result");
  await expect(summary).toHaveClass(/danger/);
  const summaryBox = await summary.boundingBox();
  const firstFieldBox = await page.getByLabel("Started at").boundingBox();
  expect(summaryBox!.y).toBeLessThan(firstFieldBox!.y);
  // The comma current, the clock duration and the comma temperature were read: no error under them.
  await expect(page.locator("#session-supplyCurrentA-error")).toHaveText("");
  await expect(page.locator("#session-durationS-error")).toHaveText("");
  await expect(page.locator("#session-ambientTempC-error")).toHaveText("");
});

test("a refused coil field shows its error once, not again as a grey hint", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/coils/new");
  await page.getByLabel("Form diameter").fill("75 m");
  await page.getByRole("button", { name: "Add coil" }).click();
  const field = page.getByLabel("Form diameter");
  await expect(field).toHaveAttribute("aria-invalid", "true");
  await expect(page.getByText(/Form diameter must be between/)).toHaveCount(1);
  await expect(page.getByTestId("formDiameterM-understood")).toHaveText("");
});

test("the warm-up chart's time axis reads round values in one unit", async ({ page }) => {
  await signInAs(page, "member");
  await logSession(page, "KM-06");
  const canvas = page.locator("canvas[data-x-ticks]").first();
  await expect(canvas).toHaveAttribute("data-x-ticks", /min/);
  const ticks = ((await canvas.getAttribute("data-x-ticks")) ?? "").split(" | ");
  expect(ticks.length).toBeGreaterThanOrEqual(2);
  for (const tick of ticks) expect(tick).toMatch(/^\d+ min$/);
});

test("the clearance page and sheet show the coil's health verdict, the same as the coil page, and never say safe", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/");
  const watchRow = page.locator(".fleet-table tbody tr").filter({ has: page.locator(".badge", { hasText: /^Watch$/ }) }).first();
  const tags = ["KM-02"];
  if ((await watchRow.count()) > 0) tags.push(((await watchRow.locator("th a").first().textContent()) ?? "").trim());
  for (const tag of tags) {
    const expected = await coilHealth(page, tag);
    await page.goto(`/clearances/new?coil=${tag}`);
    const verdict = page.getByTestId("clearance-health");
    await expect(verdict).toContainText(`Coil health now: ${expected}`);
    await expect(verdict).not.toContainText(/\bsafe\b/i);
    if (expected === "Watch" || expected === "Hold") {
      await expect(page.getByText("Every recorded check passes. Work through")).toHaveCount(0);
    }
  }
  // A decided clearance keeps showing the verdict, on the decision page and the printable sheet. On a fresh
  // demo database KM-02 is signed here; after other specs have run, an existing decision is opened.
  await page.goto("/clearances");
  const decisions = await page.locator("main a").evaluateAll((links) =>
    links.map((a) => a.getAttribute("href") ?? "").filter((href) => /^\/clearances\/[^/?]+$/.test(href) && href !== "/clearances/new"),
  );
  if (decisions.length > 0) {
    await page.goto(decisions[0]!);
  } else {
    await page.goto("/clearances/new?coil=KM-02");
    const form = page.getByRole("form", { name: "Sign clearance" });
    for (const box of await form.getByRole("checkbox").all()) await box.check();
    await form.getByLabel(/Clear for lending/).check();
    await form.getByRole("button", { name: "Sign decision" }).click();
  }
  await expect(page.getByRole("heading", { level: 1, name: /clearance/i })).toBeVisible();
  await expect(page.getByTestId("clearance-health")).toContainText("Coil health now");
  await page.getByRole("link", { name: "Printable sheet" }).click();
  await expect(page.getByTestId("clearance-health")).toContainText("Coil health when printed");
});
