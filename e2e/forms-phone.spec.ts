import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { logSession } from "./support/session-log";

/** Every .table-wrap on the page fits its box, and every data cell carries its column heading. */
async function expectTablesStacked(page: Page, where: string) {
  const tables = page.locator(".table-wrap table:not(.keep-grid)");
  await expect(tables.first(), `${where}: a table`).toBeVisible();
  const report = await page.evaluate(() =>
    Array.from(document.querySelectorAll<HTMLElement>(".table-wrap")).map((wrap) => {
      const table = wrap.querySelector("table");
      const cells = Array.from(table?.querySelectorAll("tbody td") ?? []);
      return {
        overflow: wrap.scrollWidth - wrap.clientWidth,
        pageOverflow: document.documentElement.scrollWidth - document.documentElement.clientWidth,
        unlabelled: table?.classList.contains("keep-grid") || !table?.tHead ? 0 : cells.filter((c) => !c.hasAttribute("data-label")).length,
        display: table ? getComputedStyle(table).display : "none",
      };
    }),
  );
  for (const t of report) {
    expect(t.overflow, `${where}: a table wider than its box`).toBeLessThanOrEqual(1);
    expect(t.pageOverflow, `${where}: the page scrolls sideways`).toBeLessThanOrEqual(1);
    expect(t.unlabelled, `${where}: cells without their column heading`).toBe(0);
  }
  expect(report.some((t) => t.display === "block"), `${where}: tables stacked`).toBe(true);
}

test("on a phone, wide tables become labelled stacked rows on every list and record page", async ({ page }) => {
  await signInAs(page, "steward");
  for (const path of ["/", "/coils/KM-02", "/sessions", "/sweeps", "/loans", "/clearances", "/failures"]) {
    await page.goto(path);
    await expectTablesStacked(page, path);
  }
  // The dashboard's first card shows its figures beside their headings, not cut off.
  const firstLabelled = page.locator(".fleet-table tbody td[data-label]").first();
  await page.goto("/");
  await expect(firstLabelled).toBeVisible();
  const label = await firstLabelled.evaluate((cell) => getComputedStyle(cell, "::before").content);
  expect(label).not.toBe("none");
  await logSession(page, "KM-06");
  await expectTablesStacked(page, "session page");
});

test("on a phone, numeric fields ask for the decimal keypad and read a decimal comma", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions/new?coil=KM-06");
  for (const label of ["Supply voltage", "Average current", "Duration", "Ambient temperature", "Duty cycle"]) {
    await expect(page.getByLabel(label)).toHaveAttribute("inputmode", "decimal");
  }
  // "334k" needs letters, so the running frequency keeps the full keyboard.
  await expect(page.getByLabel("Running frequency")).not.toHaveAttribute("inputmode", "decimal");
  await page.goto("/coils/plan");
  await expect(page.getByLabel("Form diameter")).toHaveAttribute("inputmode", "decimal");
  await expect(page.getByLabel("Supply voltage")).toHaveAttribute("inputmode", "decimal");
  await page.getByLabel("Form diameter").fill("75,5");
  await expect(page.getByLabel("Form diameter")).toHaveValue("75,5");
});
