/**
 * Keyboard-only journeys (no clicks, no fill): Tab / Shift+Tab to move, typing into fields, Space to tick,
 * arrow keys in a radio group, Enter to follow a link or submit. Every stop shows a visible focus outline,
 * and the fields are reached in reading order.
 */
import { expect, test, type Locator, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";

/** Presses Tab (or Shift+Tab) until `target` has focus; fails if it is not reached within `limit` presses. */
async function tabTo(page: Page, target: Locator, { backwards = false, limit = 80 } = {}) {
  for (let presses = 0; presses < limit; presses++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press(backwards ? "Shift+Tab" : "Tab");
  }
  throw new Error(`Not reached by ${backwards ? "Shift+Tab" : "Tab"} within ${limit} presses: ${target}`);
}

/** The focused element draws a focus ring a sighted keyboard user can see. */
async function expectVisibleFocus(target: Locator) {
  await expect(target).toBeFocused();
  const ring = await target.evaluate((el) => {
    const style = getComputedStyle(el);
    return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) };
  });
  expect(ring.style, "focus outline style").not.toBe("none");
  expect(ring.width, "focus outline width (px)").toBeGreaterThanOrEqual(2);
}

/** Tab to a field by its label, check its focus ring, and type into it. */
async function typeInto(page: Page, label: string | RegExp, text: string) {
  const field = page.getByLabel(label, { exact: typeof label === "string" });
  await tabTo(page, field);
  await expectVisibleFocus(field);
  await page.keyboard.type(text);
}

test("a member logs a session with the keyboard alone", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sessions/new?coil=KM-06");
  await expect(page.getByRole("heading", { level: 1, name: "Log a session" })).toBeVisible();

  // The first stop is the skip link; Enter on it takes the keyboard past the navigation.
  await page.keyboard.press("Tab");
  const skip = page.getByRole("link", { name: /skip to/i });
  await expectVisibleFocus(skip);
  await page.keyboard.press("Enter");

  await typeInto(page, "Supply voltage", "18 V");
  await typeInto(page, "Average current", "1.1 A");
  await typeInto(page, "Duration", "12 min");
  // Shift+Tab goes back to the field before, in reading order; fix a typo there and come forward again.
  await page.keyboard.press("Shift+Tab");
  await expectVisibleFocus(page.getByLabel("Average current", { exact: true }));
  await page.keyboard.press("Tab");
  await expect(page.getByLabel("Duration", { exact: true })).toBeFocused();
  await typeInto(page, "Ambient temperature", "21");
  await typeInto(page, "Heat sink at start", "21");
  await typeInto(page, "Heat sink at end", "35");
  await typeInto(page, "Running frequency", "760k");
  await typeInto(page, "Heat-sink samples", "0:00 21\n4:00 29.5\n8:00 33.3\n12:00 35.0");
  await expect(page.getByText("4 samples read.")).toBeVisible();

  const save = page.getByRole("button", { name: "Save session" });
  await tabTo(page, save);
  await expectVisibleFocus(save);
  await page.keyboard.press("Enter");
  await expect(page).toHaveURL(/\/sessions\/(?!new)[^/?]+$/);
  await expect(page.getByRole("heading", { level: 1, name: /^Session on KM-06/ })).toBeVisible();
  await expect(page.getByRole("main")).toContainText("18");
});

test("a steward clears a coil with the keyboard alone: checklist ticked with Space, verdict chosen with the arrows", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/clearances/new?coil=KM-02");
  await expect(page.getByRole("heading", { name: /Clearance for KM-02/ })).toBeVisible();
  const form = page.getByRole("form", { name: "Sign clearance" });
  const boxes = await form.getByRole("checkbox").all();
  expect(boxes.length).toBeGreaterThan(0);

  // Each checklist box in turn, in the order it is read.
  for (const box of boxes) {
    await tabTo(page, box);
    await expectVisibleFocus(box);
    await page.keyboard.press("Space");
    await expect(box).toBeChecked();
  }

  // The verdict is one radio group: Tab lands on its chosen option, the arrow keys move the choice.
  const cleared = form.getByRole("radio", { name: /Clear for lending/ });
  const refused = form.getByRole("radio", { name: /Refuse/i });
  await tabTo(page, form.getByRole("radio", { checked: true }));
  if (await refused.isChecked()) await page.keyboard.press("ArrowUp");
  await expectVisibleFocus(cleared);
  await expect(cleared).toBeChecked();
  // Arrow keys move the choice both ways.
  await page.keyboard.press("ArrowDown");
  await expect(refused).toBeChecked();
  await page.keyboard.press("ArrowUp");
  await expect(cleared).toBeChecked();

  const sign = form.getByRole("button", { name: "Sign decision" });
  await tabTo(page, sign);
  await expectVisibleFocus(sign);
  await page.keyboard.press("Enter");
  await expect(page.getByRole("heading", { name: /Clearance: KM-02/ })).toBeVisible();
  await expect(page.getByText(/Stands until/)).toBeVisible();

  // The printable sheet is reached by keyboard too.
  const sheet = page.getByRole("link", { name: "Printable sheet" });
  await tabTo(page, sheet);
  await expectVisibleFocus(sheet);
  await page.keyboard.press("Enter");
  await expect(page.getByRole("heading", { name: /Lending sheet: KM-02/ })).toBeVisible();
});
