import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

test("a member logs a session with pasted samples and sees its margins, warm-up chart and longest run", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions");
  await page.getByRole("link", { name: "Log a session" }).click();
  await page.getByLabel("Coil", { exact: true }).selectOption("KM-06");
  await page.getByRole("button", { name: "Continue" }).click();
  await expect(page.getByRole("complementary", { name: "Safety cautions" })).toBeVisible();

  await logSession(page, "KM-06");
  for (const name of ["Voltage margin", "Current margin", "Thermal margin"]) {
    await expect(page.getByRole("heading", { level: 3, name: new RegExp(name) })).toBeVisible();
  }
  await expect(page.getByRole("table", { name: "Inputs to the voltage margin" }).getByRole("rowheader").first()).toBeVisible();
  await expect(page.getByText("Formula: headroom = 1 − V_peak / V_rating")).toBeVisible();
  await expect(page.getByText("Heat-sink temperature: logged samples, fitted curve and limits", { exact: true })).toBeVisible();
  await expect(page.locator("figure.chart canvas")).toBeVisible();
  await expect(page.getByTestId("longest-run")).toContainText(/Longest run at 18 V: (about .+ before the junction reaches|never reaches the limit)/);
  await expect(page.getByText("Extrapolation")).toBeVisible();
  await expect(page.getByRole("heading", { level: 2, name: "Power cross-check" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Parts fitted that day" })).toBeVisible();
  await expect(page.getByRole("rowheader", { name: "KX-M200" })).toBeVisible();

  // The list links the new session.
  await page.goto("/sessions?coil=KM-06");
  await page.getByRole("row").nth(1).getByRole("link").first().click();
  await expect(page.getByRole("heading", { level: 1, name: /^Session on KM-06/ })).toBeVisible();
});

test("bad input is refused field by field, keeps what was typed and stores nothing", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions?coil=KM-06");
  const before = await page.getByRole("table").locator("caption").textContent();
  await page.goto("/sessions/new?coil=KM-06");
  await page.getByLabel("Supply voltage").fill("lots");
  await page.getByLabel("Average current").fill("1.1 A");
  await page.getByLabel("Duration").fill("12 min");
  await page.getByLabel("Ambient temperature").fill("21");
  await page.getByLabel("Heat-sink samples").fill("0:00 21\n0:30 warm");
  await page.getByRole("button", { name: "Save session" }).click();
  await expect(page.getByRole("status").filter({ hasText: "The session was not saved" })).toBeVisible();
  await expect(page.getByLabel("Supply voltage")).toHaveAttribute("aria-invalid", "true");
  await expect(page.locator("#session-supplyVoltageV-error")).toContainText("Supply voltage");
  await expect(page.locator("#session-samples-error")).toContainText("Row 2, temperature column");
  await expect(page.getByLabel("Supply voltage")).toHaveValue("lots");
  await expect(page.getByLabel("Heat-sink samples")).toHaveValue("0:00 21\n0:30 warm");
  await page.goto("/sessions?coil=KM-06");
  await expect(page.getByRole("table").locator("caption")).toHaveText(before ?? "");
});
