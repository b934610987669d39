import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("a coil page shows the geometry-only and the calibrated prediction side by side, each with its basis", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/coils/KM-02");
  const prediction = page.getByRole("region", { name: "Predicted and measured" });
  const geometry = prediction.getByRole("row", { name: /from geometry and parts alone/ });
  await expect(geometry).toContainText(/Nagaoka inductance, Medhurst self-capacitance/);
  await expect(geometry).toContainText(/JCGM 100:2008/);
  const calibrated = prediction.getByRole("row", { name: /calibrated on earlier sweeps/ });
  await expect(calibrated).toContainText(/fitted on the \d+ earlier sweeps? \(/);
  await expect(calibrated.getByText(/(within|outside) ±15 %/)).toBeVisible();
  await expect(prediction.getByRole("row", { name: /Running frequency/ })).toContainText(/offset of [+-]\d+\.\d % ± \d+\.\d %/);
});

test("the fleet's prediction quality is one link from the dashboard", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/");
  await page.getByRole("link", { name: "Prediction quality" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "How far the predictions have landed" })).toBeVisible();
  const table = page.getByRole("table", { name: "Out-of-sample deviations across all coils" });
  for (const model of [/geometry and parts alone/, /calibrated on earlier sweeps/, /Running frequency/]) {
    await expect(table.getByRole("row", { name: model }).getByRole("link").first()).toBeVisible();
  }
});
