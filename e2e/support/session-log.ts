import { expect, type Page } from "@playwright/test";

/** A warm-up that levels off, pasted as typed at the bench (mixed time styles). */
export const PASTED_SAMPLES = "0:00 21\n2:00, 26.0\n4 min 29.5\n360 s 31.8\n8:00 33.3\n10:00 34.3\n12:00 35.0";

/** Fills the quick log form for a coil and saves it; ends on the new session's page. */
export async function logSession(page: Page, coilTag: string) {
  await page.goto(`/sessions/new?coil=${coilTag}`);
  await expect(page.getByRole("heading", { level: 1, name: "Log a session" })).toBeVisible();
  await page.getByLabel("Supply voltage").fill("18 V");
  await page.getByLabel("Average current").fill("1.1 A");
  await page.getByLabel("Duration").fill("12 min");
  await page.getByLabel("Ambient temperature").fill("21");
  await page.getByLabel("Heat sink at start").fill("21");
  await page.getByLabel("Heat sink at end").fill("35");
  await page.getByLabel("Running frequency").fill("760k");
  await page.getByLabel("Heat-sink samples").fill(PASTED_SAMPLES);
  await expect(page.getByText("7 samples read.")).toBeVisible();
  await page.getByRole("button", { name: "Save session" }).click();
  await expect(page).toHaveURL(/\/sessions\/(?!new)[^/?]+$/);
  await expect(page.getByRole("heading", { level: 1, name: new RegExp(`^Session on ${coilTag}`) })).toBeVisible();
}
