import { expect, test, type Page } from "@playwright/test";
import Database from "better-sqlite3";
import { signInAs } from "./support/accounts";

// Tests in this file build on each other (clear, then lapse), so they run in order.
test.describe.configure({ mode: "serial" });

const port = Number(process.env.E2E_PORT ?? 3100);

async function clearCoil(page: Page, tag: string) {
  await page.goto(`/clearances/new?coil=${tag}`);
  await expect(page.getByRole("heading", { name: new RegExp(`Clearance for ${tag}`) })).toBeVisible();
  await expect(page.getByRole("table").first().getByText("Fundamental outside the medium-wave broadcast band")).toBeVisible();
  const form = page.getByRole("form", { name: "Sign clearance" });
  for (const box of await form.getByRole("checkbox").all()) await box.check();
  await form.getByLabel(/Clear for lending/).check();
  await form.getByRole("button", { name: "Sign decision" }).click();
  await expect(page.getByRole("heading", { name: new RegExp(`Clearance: ${tag}`) })).toBeVisible();
}

test("a steward clears a coil and prints its sheet", async ({ page }) => {
  await signInAs(page, "steward");
  await clearCoil(page, "KM-02");
  await expect(page.getByText(/Stands until/)).toBeVisible();
  await page.getByRole("link", { name: "Printable sheet" }).click();
  await expect(page.getByRole("heading", { name: /Lending sheet: KM-02/ })).toBeVisible();
  await expect(page.getByRole("img", { name: /QR code linking to http:\/\/localhost:\d+\/clearances\// })).toBeVisible();
  await expect(page.getByRole("complementary", { name: "Safety cautions" })).toContainText("Before you lend this coil");
  await expect(page.getByText(/Passed the team's recorded checks/)).toBeVisible();
  await expect(page.getByRole("button", { name: "Print this sheet" })).toBeVisible();
});

test("signing with boxes unticked marks them at the boxes with one short summary, and suggests no refusal", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/clearances/new?coil=KM-02");
  const form = page.getByRole("form", { name: "Sign clearance" });
  const boxes = await form.getByRole("checkbox").all();
  for (const box of boxes.slice(2)) await box.check();
  await form.getByLabel(/Clear for lending/).check();
  await form.getByRole("button", { name: "Sign decision" }).click();
  const summary = form.getByRole("status");
  await expect(summary).toHaveText("Not signed: 2 checklist items are not ticked. Tick the marked items to clear the coil.");
  await expect(page.getByText(/checklist items are not ticked/)).toHaveCount(1);
  await expect(page.getByRole("main")).not.toContainText(/record a refusal/i);
  // The missing boxes are marked where they are, and only those.
  await expect(form.getByRole("checkbox", { checked: false })).toHaveCount(2);
  for (const box of await form.getByRole("checkbox", { checked: false }).all()) {
    await expect(box).toHaveAttribute("aria-invalid", "true");
    await expect(box).toHaveAccessibleDescription(/Not ticked/);
  }
  await expect(form.locator(".check-missing")).toHaveCount(2);
});

test("a failure makes that clearance lapse and blocks the next loan", async ({ page }) => {
  // The failure is written straight into the e2e database file, as the failure form's transaction stores it (ISO text
  // dates, as Prisma writes them), with the coil's summary marked changed as markCoilChanged does in that transaction;
  // the failure form itself has its own journeys in failures.spec.ts.
  const db = new Database(`data/e2e-${port}/e2e.db`);
  try {
    const coil = db.prepare("SELECT id FROM Coil WHERE tag = ?").get("KM-02") as { id: string };
    const now = new Date().toISOString().replace("Z", "+00:00");
    db.prepare("INSERT INTO Failure (id, coilId, occurredAt, mode, symptoms, status, createdAt) VALUES (?, ?, ?, 'over_current', 'e2e: switch failed short', 'open', ?)").run(
      `e2e-failure-${Date.now()}`,
      coil.id,
      now,
      now,
    );
    db.prepare("UPDATE CoilSummary SET revision = revision + 1 WHERE coilId = ?").run(coil.id);
  } finally {
    db.close();
  }
  await signInAs(page, "steward");
  await page.goto("/?clearance=lapsed");
  // One clean sentence beside the badge: the badge says "Lapsed", the sentence what ended it and when.
  const row = page.getByRole("row", { name: /KM-02/ });
  await expect(row.locator(".badge", { hasText: /^Lapsed$/ })).toBeVisible();
  await expect(row.getByText(/Failure recorded \(over current\) on \d{4}-\d\d-\d\d \d\d:\d\d UTC; needs a new clearance before lending\.$/)).toBeVisible();
  await expect(row).not.toContainText(/Lapsed: failure|Lapsed on/);

  // The decision list says the same without anyone opening the decision page first.
  await page.goto("/clearances");
  await expect(page.getByRole("row", { name: /KM-02/ }).first().getByText(/Failure recorded \(over current\) on/)).toBeVisible();

  await page.goto("/loans/new?coil=KM-02");
  await expect(page.getByRole("main").getByRole("alert")).toContainText("lapsed after a failure");
  const form = page.getByRole("form", { name: "Lend coil" });
  await form.getByLabel("Borrower").fill("Dunmore Primary School");
  await form.getByLabel("Event").fill("Science week");
  await form.getByRole("button", { name: "Lend coil" }).click();
  await expect(form.getByRole("status")).toContainText("lapsed after a failure");
  // What was typed is kept after the refusal.
  await expect(form.getByLabel("Borrower")).toHaveValue("Dunmore Primary School");
});

test("a member cannot clear or lend: the server refuses the pages", async ({ page }) => {
  await signInAs(page, "member");
  const clear = await page.goto("/clearances/new?coil=KM-02");
  expect(clear?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not allowed" })).toBeVisible();
  const lend = await page.goto("/loans/new?coil=KM-02");
  expect(lend?.status()).toBe(403);
  await page.goto("/loans");
  await expect(page.getByRole("link", { name: /^Return / })).toHaveCount(0);
});
