/**
 * Bench logging that never loses a reading (issue 14): the session form opens and queues with no connection,
 * sends the queue when the connection returns, and the server stores each submission's key once.
 *
 * The refused submission is one the browser cannot pre-check: a peak collector/drain voltage below the supply
 * voltage is refused only by the server's schema (lib/validation/session.ts), so it queues offline like any
 * other and is refused on replay, with the server's field error as the reason.
 */
import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";

const FORM = "/sessions/new?coil=KM-06";

async function fillSession(page: Page, notes: string, extra: { peak?: string } = {}) {
  await page.getByLabel("Supply voltage").fill("18 V");
  await page.getByLabel("Average current").fill("1.1 A");
  await page.getByLabel("Duration").fill("12 min");
  await page.getByLabel("Ambient temperature").fill("21");
  await page.getByLabel("Heat-sink samples").fill("0:00 21\n6:00 30\n12:00 34");
  if (extra.peak) await page.getByLabel("Peak collector/drain voltage").fill(extra.peak);
  await page.getByLabel("Notes").fill(notes);
}

async function storedCount(page: Page, marker: string): Promise<string | null> {
  await page.goto(`/sessions?q=${encodeURIComponent(marker)}`);
  return page.getByRole("table").locator("caption").textContent();
}

test("offline: two sessions and a refused one queue on the device; back online, the two are stored once each and the refused one is fixed and resent", async ({ page, context }) => {
  const marker = `offline-${Date.now()}`;
  await signInAs(page, "member");
  await page.goto(FORM);
  // Once the service worker controls the page, a visit copies the form into its cache.
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
  await page.reload();
  await expect(page.getByRole("heading", { level: 1, name: "Log a session" })).toBeVisible();

  await context.setOffline(true);
  // The form opens with no connection, from the service worker's copy.
  await page.reload();
  await expect(page.getByRole("heading", { level: 1, name: "Log a session" })).toBeVisible();

  await fillSession(page, `${marker} first`);
  await page.getByRole("button", { name: "Save session" }).click();
  await expect(page.getByRole("status")).toContainText("saved on this device");
  await fillSession(page, `${marker} probe misread`, { peak: "12 V" });
  await page.getByRole("button", { name: "Save session" }).click();
  await fillSession(page, `${marker} second`);
  await page.getByRole("button", { name: "Save session" }).click();
  const queue = page.getByTestId("offline-queue");
  await expect(queue.locator('li[data-status="queued"]')).toHaveCount(3);

  await context.setOffline(false);
  // The first attempt after reconnecting may fail on a busy server; the panel retries every 15 s while online.
  await expect(queue.locator('li[data-status="stored"]')).toHaveCount(2, { timeout: 40_000 });
  const refused = queue.locator('li[data-status="refused"]');
  await expect(refused).toHaveCount(1);
  await expect(refused).toContainText("Peak collector/drain voltage: it cannot be below the supply voltage");
  await expect(queue.locator('li[data-status="queued"]')).toHaveCount(0);
  // Replaying again (a page load sends whatever is still queued) stores nothing twice.
  await page.reload();
  await expect(queue.locator('li[data-status="stored"]')).toHaveCount(2);

  expect(await storedCount(page, marker)).toBe("2 sessions");

  // Fix and resend the refused one.
  await page.goto(FORM);
  await page.getByTestId("offline-queue").getByRole("button", { name: "Load into the form to fix" }).click();
  const peak = page.getByLabel("Peak collector/drain voltage");
  await expect(peak).toHaveValue("12 V");
  await expect(page.locator("#session-peakSwitchVoltageV-error")).toContainText("cannot be below the supply voltage");
  await expect(page.getByLabel("Notes")).toHaveValue(`${marker} probe misread`);
  await peak.fill("60 V");
  await page.getByRole("button", { name: "Save session" }).click();
  await expect(page).toHaveURL(/\/sessions\/(?!new)[^/?]+$/);
  expect(await storedCount(page, marker)).toBe("3 sessions");
});

test("a double-submitted form stores one session: both submits carry the same idempotency key", async ({ page }) => {
  const marker = `double-${Date.now()}`;
  await signInAs(page, "member");
  await page.goto(FORM);
  await expect(page.locator('input[name="clientKey"]')).toHaveValue(/^[0-9a-f-]{36}$/);
  await fillSession(page, marker);
  // Two submits before the first answer, as a double tap on a slow connection sends them.
  await page.evaluate(() => {
    const form = document.querySelector<HTMLFormElement>("form.bench-form")!;
    form.requestSubmit();
    form.requestSubmit();
  });
  await expect(page).toHaveURL(/\/sessions\/(?!new)[^/?]+$/);
  expect(await storedCount(page, marker)).toBe("1 session");
});

test("the JSON route answers a resend of a stored key with the stored session, not a second one", async ({ page }) => {
  const marker = `resend-${Date.now()}`;
  await signInAs(page, "member");
  const d = new Date(Date.now() - 3_600_000);
  const pad = (n: number) => String(n).padStart(2, "0");
  const body = {
    coilId: "coil-KM-06",
    startedAt: `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`,
    supplyVoltageV: "24 V",
    supplyCurrentA: 1.2,
    durationS: "10 min",
    ambientTempC: 21,
    notes: marker,
    clientKey: crypto.randomUUID(),
  };
  const first = await page.request.post("/api/sessions", { data: body });
  expect(first.status()).toBe(201);
  const second = await page.request.post("/api/sessions", { data: body });
  expect(second.status()).toBe(200);
  const [a, b] = [await first.json(), await second.json()];
  expect(b.data).toEqual({ ...a.data, replayed: true });
  expect(await storedCount(page, marker)).toBe("1 session");
});
