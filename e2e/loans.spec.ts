import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

// The second test lends KM-03 again after the first brings it back, so they run in order.
test.describe.configure({ mode: "serial" });

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

test("lending confirms with a handover sheet; a failure while out puts a recall warning on the loans page", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/loans/new?coil=KM-03");
  const form = page.getByRole("form", { name: "Lend coil" });
  await form.getByLabel("Borrower").fill("Harbour Scouts");
  await form.getByLabel("Event").fill("Winter open evening");
  await form.getByRole("button", { name: "Lend coil" }).click();

  await expect(page.getByRole("heading", { level: 1, name: /^Handover sheet: KM-03/ })).toBeVisible();
  await expect(page.getByRole("status")).toContainText("KM-03 is lent to Harbour Scouts");
  await expect(page.getByText("Harbour Scouts", { exact: true })).toBeVisible();
  await expect(page.getByText("Winter open evening", { exact: true })).toBeVisible();
  await expect(page.locator("dt", { hasText: "Return by" }).locator("+ dd")).toHaveText(/\d/);
  await expect(page.getByText("Borrower (name and signature):")).toBeVisible();
  await expect(page.getByRole("complementary", { name: "Safety cautions" })).toContainText("Before you lend this coil");
  await expect(page.getByRole("button", { name: "Print this sheet" })).toBeVisible();

  // Tags and dates in the loans table stay whole.
  await page.goto("/loans?state=out");
  const row = page.getByRole("row", { name: /KM-03/ }).first();
  for (const cell of [row.getByRole("cell").nth(0), row.getByRole("cell").nth(3), row.getByRole("cell").nth(4)]) {
    await expect(cell).toHaveCSS("white-space", "nowrap");
  }
  await expect(page.getByRole("main").getByRole("alert")).toHaveCount(0);

  // A failure while it is out: the clearance lapses, and the steward is told to recall it without visiting anything else.
  await page.goto("/failures/new?coil=KM-03");
  await page.getByLabel("Symptoms").fill("Borrower reports a loud crack and no more sparks.");
  await page.getByRole("button", { name: "Record failure" }).click();
  await expect(page.getByRole("heading", { level: 1, name: /^Post-mortem: KM-03 failure/ })).toBeVisible();
  await page.goto("/loans");
  const recall = page.getByRole("main").getByRole("alert");
  await expect(recall).toContainText("Recall this coil");
  await expect(recall).toContainText(/KM-03, out with Harbour Scouts for Winter open evening\. Recall it: failure recorded \(unknown\) on/);
  await expect(page.getByRole("row", { name: /KM-03.*Harbour Scouts/ }).getByText("Recall", { exact: true })).toBeVisible();
});
