import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

/** A datetime-local value an hour ago, in the lab's (the server's and this runner's) time zone. */
function anHourAgo(): string {
  const d = new Date(Date.now() - 3_600_000);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

const session = () => ({
  coilId: "coil-KM-06",
  startedAt: anHourAgo(),
  supplyVoltageV: "24 V",
  supplyCurrentA: 1.2,
  durationS: "10 min",
  ambientTempC: 21,
  notes: "Logged by the JSON route test",
  samples: "0, 21\n300, 30\n600, 34",
});

test("the session route refuses anonymous callers", async ({ request }) => {
  const response = await request.post("/api/sessions", { data: session() });
  expect(response.status()).toBe(401);
  expect((await response.json()).ok).toBe(false);
});

test("a member logs a session through the JSON route, and bad fields are named", async ({ page }) => {
  await signInAs(page, "member");
  const bad = await page.request.post("/api/sessions", { data: { ...session(), supplyVoltageV: "lots" } });
  expect(bad.status()).toBe(422);
  const badBody = await bad.json();
  expect(badBody.fieldErrors.supplyVoltageV[0]).toContain("Supply voltage");

  const unreadable = await page.request.post("/api/sessions", { data: "not json", headers: { "content-type": "application/json" } });
  expect(unreadable.status()).toBe(400);

  const saved = await page.request.post("/api/sessions", { data: session() });
  expect(saved.status()).toBe(201);
  const { data } = await saved.json();
  expect(data.coilTag).toBe("KM-06");
  await page.goto(`/sessions/${data.id}`);
  await expect(page.getByText("Logged by the JSON route test")).toBeVisible();
});
