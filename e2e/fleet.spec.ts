import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("with the demo data the drifting coil shows as watch with its thermal reason", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/");
  const row = page.getByRole("row", { name: /KM-04 Amber Spire/ });
  await expect(row.getByText("watch", { exact: true })).toBeVisible();
  // The row shows one short reason and the thermal trend picture; the thermal reason in full is one click away.
  await expect(row.locator("p.reason")).toBeVisible();
  await expect(row.getByRole("img", { name: /^Thermal headroom over the last \d+ sessions/ })).toBeVisible();
  await row.getByText(/^All \d+ reasons$/).click();
  await expect(row.getByRole("listitem").filter({ hasText: /thermal headroom/i }).first()).toBeVisible();

  // Filtering on the server: only watch coils, and KM-04 among them.
  await page.getByLabel("Health").selectOption("watch");
  await page.getByRole("button", { name: "Apply" }).click();
  await expect(page).toHaveURL(/health=watch/);
  await expect(page.getByRole("row", { name: /KM-04 Amber Spire/ })).toBeVisible();
  await expect(page.getByRole("row", { name: /KM-03/ })).toHaveCount(0);

  // The trends page shows the margins against their thresholds.
  await page.getByRole("link", { name: "Trends for Amber Spire" }).click();
  await expect(page.getByRole("heading", { name: /Trends: KM-04/ })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Thermal headroom" })).toBeVisible();
});

test("the loan out on KM-03 and its clearance show on the dashboard; reliability lists parts", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/?loan=out");
  await expect(page.getByRole("row", { name: /KM-03/ }).getByText(/Out: Riverside Library/)).toBeVisible();
  await page.goto("/?clearance=valid");
  // KM-03 went out under a clearance that still stands (other specs may change KM-02's).
  await expect(page.getByRole("row", { name: /KM-03/ }).getByText(/Cleared until/)).toBeVisible();
  await page.goto("/fleet/reliability");
  await expect(page.getByRole("heading", { name: "Fleet reliability per part" })).toBeVisible();
  await expect(page.getByRole("table").getByRole("row")).not.toHaveCount(1);
});
