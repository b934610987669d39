/**
 * Sites in the browser: the header names the current site, someone in two sites switches between them, the
 * organisation admin's district view lists every site and drills down into one, and a site admin adds an account of
 * another site to theirs. Uses the demo network (prisma/demo/people.ts).
 */
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage, signInAs } from "./support/accounts";

const CLUB = "Kettlewell Maker Collective";
const SCHOOL = "Fenwick Street School";

async function signInWith(page: Page, email: string, password: string) {
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, password);
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible();
}

test("the header names the current site for someone in one site, with no switcher", async ({ page }) => {
  await signInAs(page, "steward");
  await expect(page.locator(".site-header")).toContainText(CLUB);
  await expect(page.getByRole("combobox", { name: "Site" })).toHaveCount(0);
});

test("a member of two sites switches from one to the other, and the choice sticks", async ({ page }) => {
  await signInWith(page, "priya@kettlewell.example", "demo-member-pass-2");
  const switcher = page.getByRole("combobox", { name: "Site" });
  await expect(switcher.locator("option:checked")).toHaveText(`${SCHOOL} (member)`);
  await page.goto("/coils");
  await switcher.selectOption({ label: `${CLUB} (member)` });
  const answered = page.waitForResponse((r) => r.request().method() === "POST");
  await page.getByRole("button", { name: "Switch" }).click();
  await answered;
  // The switch opens the dashboard, whatever page it was made from.
  await expect(page).toHaveURL(/\/$/);
  await page.goto("/coils");
  await expect(page.getByRole("combobox", { name: "Site" }).locator("option:checked")).toHaveText(`${CLUB} (member)`);
});

test("the organisation admin sees every site in the district view and drills down into one", async ({ page }) => {
  await signInWith(page, "coordinator@northmoor.example", "demo-organisation-pass");
  await page.getByRole("link", { name: "District" }).click();
  await expect(page.getByRole("heading", { name: "District" })).toBeVisible();
  const table = page.getByRole("table");
  await expect(table.getByRole("rowheader")).toHaveText([new RegExp(SCHOOL), new RegExp(CLUB), "All sites"]);
  const answered = page.waitForResponse((r) => r.request().method() === "POST");
  await page.getByRole("button", { name: `${SCHOOL}: open its dashboard` }).click();
  await answered;
  await expect(page).toHaveURL(/\/$/);
  await page.reload();
  await expect(page.getByRole("combobox", { name: "Site" }).locator("option:checked")).toHaveText(`${SCHOOL} (admin)`);
});

test("a site admin adds an account of another site by e-mail; a site admin sees no district", async ({ page }) => {
  await signInAs(page, "admin");
  await page.goto("/admin");
  await expect(page.getByRole("heading", { name: `Admin: ${CLUB}` })).toBeVisible();
  await expect(page.getByRole("link", { name: "District" })).toHaveCount(0);
  await page.getByLabel("Sign-in address").fill("member@fenwick.example");
  await page.getByLabel(`Role at ${CLUB}`).first().selectOption("steward");
  await page.getByRole("button", { name: `Add to ${CLUB}` }).click();
  await expect(page.getByText(`Jonah Castellanos is now a steward at ${CLUB}.`)).toBeVisible();
  await page.reload();
  await expect(page.getByRole("cell", { name: "member@fenwick.example", exact: true })).toBeVisible();
  const response = await page.goto("/district");
  expect(response?.status()).toBe(403);
});

test("the district view, the sites page and the members page have no serious accessibility violation", async ({ page }) => {
  await signInWith(page, "coordinator@northmoor.example", "demo-organisation-pass");
  for (const path of ["/district", "/admin/sites", "/admin"]) {
    await page.goto(path);
    const { violations } = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
    const blocking = violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${path}: ${v.id} ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
    expect(blocking).toEqual([]);
  }
});
