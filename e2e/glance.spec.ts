/**
 * At a glance (issue 14): the dashboard's trend pictures and short reasons, badges that keep their shape, the coil
 * page's header band with its key figures above the fold on a desktop, and the logbook filter. Screenshots of the
 * dashboard and a coil page at a desktop (1366×900) and a phone (390×844) size are attached to the test results.
 */
import { expect, test, type Locator, type Page, type TestInfo } from "@playwright/test";
import { signInAs } from "./support/accounts";

const DESKTOP = { width: 1366, height: 900 };
const PHONE = { width: 390, height: 844 };

async function attachScreenshot(page: Page, testInfo: TestInfo, name: string) {
  const path = testInfo.outputPath(`${name}.png`);
  await page.screenshot({ path, fullPage: false });
  await testInfo.attach(name, { path, contentType: "image/png" });
}

/** Wholly inside the first screen: no scrolling needed to read it. */
async function expectAboveTheFold(locator: Locator, viewport: { width: number; height: number }) {
  await expect(locator).toBeVisible();
  const box = await locator.boundingBox();
  expect(box, "element has a box").not.toBeNull();
  expect(box!.y).toBeGreaterThanOrEqual(0);
  expect(box!.x).toBeGreaterThanOrEqual(0);
  expect(box!.y + box!.height).toBeLessThanOrEqual(viewport.height);
  expect(box!.x + box!.width).toBeLessThanOrEqual(viewport.width);
}

test("the dashboard shows each coil's headroom trends and a short reason; badges stay pills or rectangles", async ({ page }, testInfo) => {
  await signInAs(page, "member");
  await page.setViewportSize(DESKTOP);
  await page.goto("/");
  const row = page.getByRole("row", { name: /KM-04 Amber Spire/ });
  // Three trend pictures, each described in words with the policy's minimum.
  const pictures = row.getByRole("img", { name: /headroom over the last \d+ sessions.*policy minimum \d+ %/ });
  await expect(pictures).toHaveCount(3);
  await expect(row.getByRole("img", { name: /^Thermal headroom over the last/ })).toBeVisible();
  // The short reason stands in the row; the full sentences are one click away.
  const reason = row.locator("p.reason");
  await expect(reason).toBeVisible();
  const details = row.locator("details");
  await expect(details.locator("li").first()).toBeHidden();
  await details.locator("summary").click();
  await expect(details.locator("li").first()).toBeVisible();
  expect((await details.locator("li").first().innerText()).length).toBeGreaterThanOrEqual((await reason.innerText()).length);
  await attachScreenshot(page, testInfo, "dashboard-1366x900");

  await page.setViewportSize(PHONE);
  await page.goto("/");
  await expect(page.getByRole("row", { name: /KM-04 Amber Spire/ })).toBeAttached();
  await attachScreenshot(page, testInfo, "dashboard-390x844");
  // No badge is an oval: whatever its text and however it wraps, its corner radius is small beside its height.
  const shapes = await page.locator(".badge").evaluateAll((badges) =>
    badges.map((b) => ({ text: b.textContent, radius: parseFloat(getComputedStyle(b).borderTopLeftRadius), height: b.getBoundingClientRect().height })),
  );
  expect(shapes.length).toBeGreaterThan(5);
  expect(shapes.some((s) => /Cleared until/.test(s.text ?? ""))).toBe(true);
  for (const shape of shapes) expect(shape.radius, `badge "${shape.text}"`).toBeLessThanOrEqual(Math.min(12, shape.height / 2 + 0.5));
});

test("the coil page opens on its key figures: health, clearance, loan and the three margins above the fold", async ({ page }, testInfo) => {
  await signInAs(page, "member");
  await page.setViewportSize(DESKTOP);
  await page.goto("/coils/KM-03");
  const band = page.getByRole("region", { name: "At a glance" });
  const facts = band.locator(".glance-facts");
  await expectAboveTheFold(facts.getByText("Health", { exact: true }), DESKTOP);
  await expectAboveTheFold(facts.locator("dd").first().locator(".badge"), DESKTOP);
  await expectAboveTheFold(facts.getByText("Clearance", { exact: true }), DESKTOP);
  await expectAboveTheFold(facts.locator("dd").nth(1).locator(".badge"), DESKTOP);
  await expectAboveTheFold(facts.getByText("Loan", { exact: true }), DESKTOP);
  for (const kind of ["voltage", "current", "thermal"]) {
    const margin = band.getByTestId(`glance-margin-${kind}`);
    await expectAboveTheFold(margin, DESKTOP);
    // The figure is in words, with its limit: "62 % (min 20 %)".
    await expect(margin).toContainText(/-?\d+ % \(min \d+ %\)/);
  }
  // The latest sweep's |Z| picture, described, linking to the sweep.
  await expect(band.getByRole("img", { name: /\|Z\| of the sweep of .* on log axes/ })).toBeVisible();
  await expect(band.getByRole("img", { name: /^Voltage headroom over the last/ })).toBeVisible();
  await attachScreenshot(page, testInfo, "coil-page-1366x900");
  await band.getByRole("link", { name: /^Latest sweep, .*: open it$/ }).click();
  await expect(page).toHaveURL(/\/sweeps\//);

  await page.setViewportSize(PHONE);
  await page.goto("/coils/KM-03");
  await expect(page.getByRole("region", { name: "At a glance" })).toBeVisible();
  // The band stacks on a phone: the page does not scroll sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(1);
  await attachScreenshot(page, testInfo, "coil-page-390x844");
});

test("the logbook filters by kind on the server, and comes back to everything", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/coils/KM-04");
  const filters = page.getByRole("navigation", { name: "Show in the logbook" });
  await expect(filters.getByRole("link", { name: "Everything" })).toHaveAttribute("aria-current", "true");
  const everything = page.getByRole("list", { name: /^Logbook of KM-04, newest first$/ });
  await expect(everything.locator(".timeline-session").first()).toBeVisible();
  await expect(everything.locator(".timeline-sweep").first()).toBeVisible();

  await filters.getByRole("link", { name: /^Sweeps \(\d+\)$/ }).click();
  await expect(page).toHaveURL(/[?&]log=sweeps/);
  const sweeps = page.getByRole("list", { name: "Logbook of KM-04, newest first: sweeps" });
  await expect(sweeps.getByRole("listitem").first()).toBeVisible();
  const kinds = await sweeps.locator(".timeline-kind").allInnerTexts();
  expect(kinds.length).toBeGreaterThan(0);
  expect(new Set(kinds.map((k) => k.toLowerCase()))).toEqual(new Set(["sweep"]));
  await expect(filters.getByRole("link", { name: /^Sweeps/ })).toHaveAttribute("aria-current", "true");

  await filters.getByRole("link", { name: /^Sessions/ }).click();
  await expect(page).toHaveURL(/[?&]log=sessions/);
  const sessions = await page.getByRole("list", { name: /sessions$/ }).locator(".timeline-kind").allInnerTexts();
  expect(new Set(sessions.map((k) => k.toLowerCase()))).toEqual(new Set(["session"]));

  // An unknown filter shows everything rather than failing.
  await page.goto("/coils/KM-04?log=nonsense");
  await expect(page.getByRole("list", { name: /^Logbook of KM-04, newest first$/ })).toBeVisible();
  await filters.getByRole("link", { name: "Everything" }).click();
  await expect(page).not.toHaveURL(/log=/);
});
