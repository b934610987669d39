import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

const validCoil = {
  tag: "E2E-01",
  name: "Browser test build",
  builderName: "Test runner",
  formDiameterM: 0.05,
  windingLengthM: 0.2,
  turns: 900,
  wireDiameterM: 0.0002,
};

test("anonymous requests to the API are refused with 401", async ({ request }) => {
  const response = await request.post("/api/coils", { data: validCoil });
  expect(response.status()).toBe(401);
});

test("a member is refused a steward action on the server, not just hidden in the UI", async ({ page }) => {
  await signInAs(page, "member");
  await expect(page.getByRole("link", { name: "Admin" })).toHaveCount(0);

  const response = await page.request.post("/api/coils", { data: validCoil });
  expect(response.status()).toBe(403);
  expect((await response.json()).message).toMatch(/needs the steward role/);

  await page.goto("/coils/KM-02");
  await expect(page.getByRole("form", { name: "Change status" })).toHaveCount(0);

  await page.goto("/admin");
  await expect(page.getByRole("heading", { name: "Not allowed" })).toBeVisible();
});

test("a steward's bad input is answered with the field and the reason, and nothing is stored", async ({ page }) => {
  await signInAs(page, "steward");
  const bad = await page.request.post("/api/coils", { data: { ...validCoil, tag: "E2E-BAD", windingLengthM: 200 } });
  expect(bad.status()).toBe(422);
  const body = await bad.json();
  expect(body.fieldErrors.windingLengthM[0]).toMatch(/Winding length must be between/);
  const list = await page.request.get("/api/coils?q=E2E-BAD");
  expect((await list.json()).data.total).toBe(0);

  const good = await page.request.post("/api/coils", { data: validCoil });
  expect(good.status()).toBe(201);
  await page.goto("/coils/E2E-01");
  await expect(page.getByRole("heading", { name: /E2E-01/ })).toBeVisible();
});

test("an unknown coil gets the not-found page", async ({ page }) => {
  await signInAs(page, "member");
  const response = await page.goto("/coils/NO-SUCH-COIL");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Not found" })).toBeVisible();
});
