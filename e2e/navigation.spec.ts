import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("every area lists the demo club's records", async ({ page }) => {
  await signInAs(page, "admin");
  const nav = page.getByRole("navigation", { name: "Main" });
  const areas: Array<[string, RegExp]> = [
    ["Coils", /^Coils$/],
    ["Sweeps", /Resonance sweeps/],
    ["Sessions", /Run sessions/],
    ["Failures", /Failures and post-mortems/],
    ["Loans", /^Loans$/],
    ["Admin", /^Admin: Kettlewell Maker Collective$/],
    ["Fleet", /^Fleet$/],
  ];
  for (const [link, heading] of areas) {
    await nav.getByRole("link", { name: link }).click();
    await expect(page.getByRole("heading", { level: 1, name: heading })).toBeVisible();
    await expect(nav.getByRole("link", { name: link })).toHaveAttribute("aria-current", "page");
    // Each area shows records from the demo database.
    await expect(page.locator("tbody tr").first()).toBeVisible();
    await expect(page.getByText(/No (coils|sessions|sweeps|failures|loans) (match|to show)/)).toHaveCount(0);
  }
});

test("the session list filters and pages on the server", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions");
  const caption = page.locator("caption");
  const total = Number((await caption.innerText()).match(/(\d+) session/)![1]);
  expect(total).toBeGreaterThanOrEqual(150);
  await page.getByLabel("Coil").selectOption("KM-04");
  await page.getByRole("button", { name: "Apply" }).click();
  await expect(page).toHaveURL(/coil=KM-04/);
  const filtered = Number((await caption.innerText()).match(/(\d+) session/)![1]);
  expect(filtered).toBeLessThan(total);
  for (const cell of await page.locator("tbody tr td:nth-child(2)").allInnerTexts()) expect(cell).toBe("KM-04");
  await page.getByRole("link", { name: "Next →" }).click();
  await expect(page.getByText(/Page 2 of/)).toBeVisible();
});

test("an admin adds a user and the change is audited", async ({ page }) => {
  await signInAs(page, "admin");
  await page.goto("/admin");
  await page.getByLabel("Name").fill("Nova Quist");
  await page.getByLabel("E-mail").fill("nova@kettlewell.example");
  await page.getByLabel("Initial password").fill("short");
  await page.getByRole("button", { name: "Add user" }).click();
  await expect(page.locator("#new-password-error")).toContainText("at least 10 characters");
  await page.getByLabel("Initial password").fill("a-long-enough-pass");
  await page.getByRole("button", { name: "Add user" }).click();
  await expect(page.getByText("Added Nova Quist as member.")).toBeVisible();
  await page.reload();
  await expect(page.getByRole("cell", { name: "nova@kettlewell.example", exact: true })).toBeVisible();
  await expect(page.getByText(/Added Nova Quist <nova@kettlewell.example> as member/)).toBeVisible();
});
