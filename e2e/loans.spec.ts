import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("a steward cannot lend a coil already out, and takes it back", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/loans/new?coil=KM-03");
  const form = page.getByRole("form", { name: "Lend coil" });
  await form.getByLabel("Borrower").fill("Another school");
  await form.getByLabel("Event").fill("Open day");
  await form.getByRole("button", { name: "Lend coil" }).click();
  await expect(form.getByRole("status")).toContainText("already out on loan to Riverside Library");

  await page.goto("/loans?state=out");
  await page.getByRole("link", { name: "Return KM-03" }).click();
  const back = page.getByRole("form", { name: "Return coil" });
  await back.getByLabel("Condition on return").fill("Good order");
  await back.getByRole("button", { name: "Record return" }).click();
  await expect(page).toHaveURL(/state=returned/);
  await expect(page.getByRole("row", { name: /KM-03/ }).first().getByText("Returned")).toBeVisible();
});
