import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

test("on a phone-width screen the pages fit and the navigation is usable", async ({ page }) => {
  await signInAs(page, "member");
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(1);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Sessions" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Run sessions" })).toBeVisible();
  const sessionsOverflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(sessionsOverflow).toBeLessThanOrEqual(1);
});

test("on a phone a member logs a session at the bench and reads its margins", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions");
  const logButton = page.getByRole("link", { name: "Log a session" });
  const box = await logButton.boundingBox();
  expect(box?.height ?? 0).toBeGreaterThanOrEqual(44);
  await logSession(page, "KM-06");
  await expect(page.getByRole("heading", { level: 3, name: /Thermal margin/ })).toBeVisible();
  await expect(page.getByTestId("longest-run")).toBeVisible();
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(1);
  await page.goto("/sessions/new?coil=KM-06");
  const formOverflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(formOverflow).toBeLessThanOrEqual(1);
});
