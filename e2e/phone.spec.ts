import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("on a phone-width screen the pages fit and the navigation is usable", async ({ page }) => {
  await signInAs(page, "member");
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(1);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Sessions" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Run sessions" })).toBeVisible();
  const sessionsOverflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(sessionsOverflow).toBeLessThanOrEqual(1);
});
