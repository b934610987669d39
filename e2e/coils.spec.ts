import { expect, test } from "@playwright/test";
import { signInAs } from "./support/accounts";

test("a steward creates a coil from typed sizes and sees what was understood and the prediction", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/coils");
  await page.getByRole("link", { name: "New coil" }).click();
  await expect(page.getByRole("heading", { name: "New coil" })).toBeVisible();

  await page.getByLabel("Tag").fill("E2E-T1");
  await page.getByLabel("Name").fill("Typed build");
  await page.getByLabel("Builder").fill("Browser tester");
  await page.getByLabel("Form diameter").fill("75 mm");
  await expect(page.getByTestId("formDiameterM-understood")).toHaveText("Understood: 75 mm");
  await page.getByLabel("Winding length").fill("8 in");
  await expect(page.getByTestId("windingLengthM-understood")).toHaveText("Understood: 203.2 mm");
  await page.getByLabel("Wire", { exact: true }).fill("AWG 28");
  await expect(page.getByTestId("wireDiameterM-understood")).toHaveText(/Understood: 321(\.\d)? µm/);
  await page.getByLabel("Turns", { exact: true }).fill("count from winding length");
  await expect(page.getByTestId("turns-understood")).toHaveText(/Will store 585 turns, counted as winding length/);

  // A slip is refused with the field named and what was read, and the typed values come back.
  await page.getByLabel("Measured inductance").fill("4.2 banana");
  await page.getByRole("button", { name: "Add coil" }).click();
  await expect(page.getByRole("status").filter({ hasText: "The coil was not added" })).toBeVisible();
  await expect(page.getByText(/Measured inductance: Could not read “4.2 banana”/)).toBeVisible();
  await expect(page.getByLabel("Form diameter")).toHaveValue("75 mm");

  await page.getByLabel("Measured inductance").fill("4.2 mH");
  await page.getByRole("button", { name: "Add coil" }).click();
  await expect(page).toHaveURL(/\/coils\/E2E-T1\?added=counted/);
  await expect(page.getByRole("heading", { name: "E2E-T1 — Typed build" })).toBeVisible();
  await expect(page.getByText(/Read as: form 75 mm, winding 203\.2 mm, wire 321.* \(AWG 28\), 585 turns, counted/)).toBeVisible();

  const prediction = page.getByRole("region", { name: "Predicted and measured" });
  const inductanceRow = prediction.getByRole("row", { name: /Inductance/ });
  await expect(inductanceRow).toContainText("4.2 mH");
  await expect(inductanceRow.getByText(/(within|outside) ±5 %/)).toBeVisible();
  await expect(prediction.getByText("What the model assumes")).toBeVisible();
});

test("a steward replaces the switch and the old part stays in the history with its dates", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/coils/KM-06");
  const fitted = page.getByRole("region", { name: "Fitted parts" });
  const replaceLink = fitted.getByRole("link", { name: /^Replace / }).first();
  const oldPart = ((await replaceLink.getAttribute("aria-label")) ?? "").replace(/^Replace /, "");
  await replaceLink.click();
  await expect(page.getByRole("heading", { name: new RegExp(`replace ${oldPart}`) })).toBeVisible();

  await page.getByLabel("Why it came out").fill("Upgrade to a higher-voltage part");
  await page.getByLabel("Kind").selectOption("switch");
  await page.getByLabel("Part number").fill("E2E-SW-500");
  await page.getByLabel("Switch type").selectOption("mosfet");
  await page.getByLabel("Voltage rating").fill("500 V");
  await expect(page.getByTestId("voltageRatingV-understood")).toHaveText("Understood: 500 V");
  await page.getByLabel("Peak current").fill("80 A");
  // Full ratings: later specs log sessions on this coil and need Tj max for the run-time figure.
  await page.getByLabel("Tj max").fill("175 °C");
  await page.getByRole("button", { name: "Replace the part" }).click();

  await expect(page).toHaveURL(/\/coils\/KM-06/);
  await expect(page.getByRole("region", { name: "Fitted parts" }).getByRole("rowheader", { name: "E2E-SW-500" })).toBeVisible();
  const removedRow = page.getByRole("table", { name: "Removed parts" }).getByRole("row", { name: new RegExp(oldPart) }).first();
  await expect(removedRow).toContainText("Upgrade to a higher-voltage part");
  await expect(removedRow).toContainText("E2E-SW-500");
  await expect(page.getByRole("list", { name: /Logbook of KM-06/ }).getByText(new RegExp(`Part removed.*${oldPart}`))).toBeVisible();
});

test("a member sees no edit controls, and the server refuses their writes", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/coils");
  await expect(page.getByRole("link", { name: "New coil" })).toHaveCount(0);
  await page.goto("/coils/KM-04");
  await expect(page.getByRole("heading", { name: /KM-04/ })).toBeVisible();
  await expect(page.getByRole("link", { name: "Edit the build" })).toHaveCount(0);
  await expect(page.getByRole("link", { name: /^Replace / })).toHaveCount(0);
  await expect(page.getByTestId("health-status")).toBeVisible();

  const response = await page.request.post("/api/coils", { data: { tag: "E2E-M1", name: "No", builderName: "No", formDiameterM: 0.05, windingLengthM: 0.2, turns: 500, wireDiameterM: 0.0002 } });
  expect(response.status()).toBe(403);
  const importResponse = await page.request.post("/api/import/json", { data: { format: "coilyard-logbook" } });
  expect(importResponse.status()).toBe(403);
  const edit = await page.goto("/coils/KM-04/edit");
  expect(edit?.status()).toBe(403);
});

test("the label shows a QR code and the tag", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/coils/KM-02/label");
  const label = page.getByRole("article", { name: "Label for KM-02" });
  await expect(label.getByRole("img", { name: /QR code opening http:\/\/localhost:\d+\/coils\/KM-02/ })).toBeVisible();
  await expect(label.locator("svg")).toHaveCount(1);
  await expect(label.getByText("KM-02", { exact: true })).toBeVisible();
});

test("a coil's logbook exports as JSON and CSV, and a steward re-imports it as a copy", async ({ page }) => {
  await signInAs(page, "steward");
  const json = await page.request.get("/api/export/coils/KM-05.json");
  expect(json.status()).toBe(200);
  const doc = await json.json();
  expect(doc).toMatchObject({ format: "coilyard-logbook", version: 1 });
  const csv = await page.request.get("/api/export/coils/KM-05/sessions.csv");
  expect((await csv.text()).split("\r\n")[0]).toContain("supply_voltage_v");

  const conflict = await page.request.post("/api/import/json", { data: doc });
  expect(conflict.status()).toBe(409);
  const bad = await page.request.post("/api/import/json?asTag=KM-05-BAD", { data: { ...doc, coils: [{ ...doc.coils[0], turns: "many" }] } });
  expect(bad.status()).toBe(422);
  expect((await bad.json()).message).toContain("coils.0.turns");

  const copy = await page.request.post("/api/import/json?asTag=KM-05-COPY", { data: doc });
  expect(copy.status()).toBe(201);
  await page.goto("/coils/KM-05-COPY");
  await expect(page.getByRole("heading", { name: /KM-05-COPY/ })).toBeVisible();
});

test("two stewards edit the same coil: the later save from a stale form is refused, naming who changed it, and overwrites nothing", async ({ browser }) => {
  const first = await browser.newContext();
  const second = await browser.newContext();
  try {
    const ines = await first.newPage();
    const rafe = await second.newPage();
    await signInAs(ines, "admin");
    await signInAs(rafe, "steward");
    // Both open the edit form before either saves.
    await ines.goto("/coils/KM-03/edit");
    await rafe.goto("/coils/KM-03/edit");
    await ines.getByLabel("Notes").fill("Ines: re-wound the primary.");
    await ines.getByRole("button", { name: "Save changes" }).click();
    await expect(ines).toHaveURL(/\/coils\/KM-03\?saved=/);

    await rafe.getByLabel("Notes").fill("Rafe: new toroid.");
    await rafe.getByRole("button", { name: "Save changes" }).click();
    await expect(rafe.getByRole("status").filter({ hasText: /Nothing was saved: Ines Okafor changed KM-03 at .* UTC, after you opened this form/ })).toBeVisible();
    // What Rafe typed is kept in the form, and Ines's change stands.
    await expect(rafe.getByLabel("Notes")).toHaveValue("Rafe: new toroid.");
    await rafe.goto("/coils/KM-03/edit");
    await expect(rafe.getByLabel("Notes")).toHaveValue("Ines: re-wound the primary.");
  } finally {
    await first.close();
    await second.close();
  }
});

test("an absurd turn count gets a clear message, and a measured inductance far from the prediction is saved with a warning", async ({ page }) => {
  await signInAs(page, "steward");
  await page.goto("/coils/new");
  await page.getByLabel("Tag").fill("E2E-T2");
  await page.getByLabel("Name").fill("Slip build");
  await page.getByLabel("Builder").fill("Browser tester");
  await page.getByLabel("Form diameter").fill("75 mm");
  await page.getByLabel("Winding length").fill("8 in");
  await page.getByLabel("Wire", { exact: true }).fill("AWG 28");
  await page.getByLabel("Turns", { exact: true }).fill("9999999");
  await page.getByRole("button", { name: "Add coil" }).click();
  await expect(page.getByText("Turns must be between 10 and 20000; “9999999” was read as 9999999.").first()).toBeVisible();
  await expect(page.getByText("Invalid input")).toHaveCount(0);

  await page.getByLabel("Turns", { exact: true }).fill("585");
  await page.getByLabel("Measured inductance").fill("4.2 H");
  await page.getByRole("button", { name: "Add coil" }).click();
  await expect(page).toHaveURL(/\/coils\/E2E-T2\?added=typed/);
  await expect(page.getByRole("main").getByRole("alert")).toContainText(/The measured inductance, 4\.2 H, is [\d,]+ times the [\d.]+ mH this geometry predicts: it was saved as typed/);
});
