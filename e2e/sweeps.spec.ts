import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { expect, test, type Page } from "@playwright/test";
import { signInAs } from "./support/accounts";
import { createLineModel, simulateSweep } from "../lib/calc/line-model";
import { createSeededRandom } from "../lib/calc/seeded-random";

const fixture = (name: string) => fileURLToPath(new URL(`./fixtures/${name}`, import.meta.url));
/** The first series resonance the fixture's readings were generated with (e2e/fixtures/make-sweep-csv.ts). */
const FIXTURE_FIRST_RESONANCE_HZ = 265_000;

/** "265 kHz" → 265000. */
function readHz(text: string): number {
  const match = /([\d.]+)\s*([kM]?)Hz/.exec(text);
  if (!match) throw new Error(`No frequency in “${text}”`);
  return Number(match[1]) * (match[2] === "k" ? 1e3 : match[2] === "M" ? 1e6 : 1);
}

async function fillSettings(page: Page) {
  await page.getByLabel("Series resistor").fill("22k");
  await page.getByLabel("Source amplitude").fill("20 V");
  await page.getByLabel("Amplitude convention").selectOption("peak_to_peak");
  await page.getByLabel("Environment notes").fill("Bench, 1 m from the wall");
}

async function sweepCount(page: Page, tag: string): Promise<number> {
  await page.goto(`/sweeps?coil=${tag}`);
  return Number((await page.locator("caption").innerText()).match(/(\d+) sweep/)![1]);
}

test("import a sweep CSV, map its columns and units, preview, and see its resonances", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sweeps?coil=KM-02");
  await page.getByRole("link", { name: "Import CSV" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Import a sweep of KM-02" })).toBeVisible();

  await page.getByLabel("CSV file").setInputFiles(fixture("sweep-km02.csv"));
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(page.getByRole("status")).toContainText("semicolon-separated, with the header on row 1, decimal commas");
  await page.getByLabel("Frequency column").selectOption({ label: "Freq (kHz)" });
  await page.getByLabel("Frequency unit").selectOption("kHz");
  await page.getByLabel("Amplitude column").selectOption({ label: "Vout (mV)" });
  await page.getByLabel("Amplitude unit").selectOption("mV");
  await fillSettings(page);
  await page.getByRole("button", { name: "Preview" }).click();

  await expect(page.getByRole("status")).toContainText("400 readings understood");
  const preview = page.getByRole("table", { name: /readings, as understood/ });
  await expect(preview.getByRole("row").nth(1)).toContainText("132.5 kHz");
  const found = page.getByRole("table", { name: "Resonances found" });
  await expect(found.getByRole("row", { name: /Series 1/ })).toBeVisible();

  await page.getByRole("button", { name: "Import 400 readings" }).click();
  await expect(page).toHaveURL(/\/sweeps\/[^/]+$/);
  await expect(page.getByRole("heading", { level: 1, name: /Sweep of KM-02/ })).toBeVisible();
  await expect(page.getByRole("img", { name: /\|Z\| of KM-02/ })).toBeVisible();
  await expect(page.getByText(/assumes the coil's impedance is in phase/)).toBeVisible();
  const first = readHz(await page.locator("dl.facts").first().locator("dt:text-is('First series resonance') + dd").innerText());
  expect(Math.abs(first / FIXTURE_FIRST_RESONANCE_HZ - 1)).toBeLessThan(0.03);
  await expect(page.getByRole("table", { name: /Series resonances are \|Z\| minima/ }).getByRole("rowheader", { name: "Series 1" })).toBeVisible();
  // the fitted frequency carries its standard error, and the |Z| note says which way the amplitude-only reading errs
  await expect(page.getByRole("table", { name: /Series resonances are \|Z\| minima/ }).getByRole("row", { name: /Series 1/ })).toContainText(/Hz ± [\d.]+ [kM]?Hz/);
  await expect(page.getByText(/always reads \|Z\| high, never low/)).toBeVisible();
  await expect(page.getByRole("heading", { name: "Measured against the prediction" })).toBeVisible();
  await expect(page.getByText(/(within|outside) the ±15 % tolerance/)).toBeVisible();
});

test("a bad CSV is refused with its row and column, and nothing is stored", async ({ page }) => {
  await signInAs(page, "member");
  const before = await sweepCount(page, "KM-05");
  await page.goto("/sweeps/import?coil=KM-05");
  await page.getByLabel("CSV file").setInputFiles(fixture("sweep-bad.csv"));
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(page.getByRole("status")).toContainText("comma-separated, with the header on row 1");
  await fillSettings(page);
  await page.getByRole("button", { name: "Preview" }).click();
  await expect(page.getByRole("status")).toContainText("Row 14, column 'Freq (kHz)': expected a number, got '3.2.1'. Nothing was imported.");
  await expect(page.getByRole("button", { name: /^Import \d+ readings$/ })).toHaveCount(0);
  expect(await sweepCount(page, "KM-05")).toBe(before);
});

test("a CSV with comment and preamble lines: skipped, the header row can be picked, the plot is previewed; empty and header-only files are named", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sweeps/import?coil=KM-05");
  const status = page.locator("#import-status");
  const rows = Array.from({ length: 40 }, (_, i) => {
    const f = 200 + i * 5; // kHz
    const reading = 18 - 12 / (1 + ((f - 290) / 8) ** 2); // a dip at 290 kHz, invented readings
    return `${f},${reading.toFixed(3)}`;
  });
  const text = ["# Exported from the bench scope", "# Source 20 Vpp through 22k", "Operator: bench team", "Freq (kHz),Vout (V)", ...rows, ""].join("\n");
  await page.getByLabel("…or paste the contents").fill(text);
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(status).toContainText("comma-separated, with the header on row 4, 3 comment or preamble lines skipped");
  await expect(page.getByLabel("Header row")).toHaveValue("4");
  await expect(page.getByLabel("Frequency column")).toHaveValue("0");
  await expect(page.getByLabel("Frequency unit")).toHaveValue("kHz");
  // Picking a line of the preamble as the header is possible, and picking the right one again restores the mapping.
  await page.getByLabel("Header row").selectOption("3");
  await expect(status).toContainText("with the header on row 3");
  await page.getByLabel("Header row").selectOption("4");
  await expect(status).toContainText("with the header on row 4");

  await page.getByLabel("Series resistor").fill("22k");
  await page.getByLabel("Source amplitude").fill("20 Vpp");
  await page.getByRole("button", { name: "Preview" }).click();
  await expect(status).toContainText("40 readings understood");
  await expect(page.getByRole("img", { name: /The 40 readings as understood/ })).toBeVisible();
  await expect(page.getByRole("table", { name: /readings, as understood/ }).getByRole("row").nth(1)).toContainText(/^5\s*200 kHz/);

  await page.getByLabel("…or paste the contents").fill("# export\nFreq (kHz),Vout (V)\n");
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(status).toHaveText("Row 2: no readings after the header. Nothing was imported.");

  await page.getByLabel("…or paste the contents").fill("");
  await page.getByLabel("CSV file").setInputFiles({ name: "empty.csv", mimeType: "text/csv", buffer: Buffer.alloc(0) });
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(status).toHaveText("The file is empty. Nothing was imported.");
});

test("a sweep typed and pasted into the grid", async ({ page }) => {
  await signInAs(page, "member");
  const before = await sweepCount(page, "KM-01");
  await page.getByRole("link", { name: "New sweep" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "New sweep of KM-01" })).toBeVisible();
  await fillSettings(page);

  // Typed: Enter moves from frequency to amplitude, then on to the next row.
  await page.getByLabel("Frequency, row 1").fill("132.5k");
  await page.getByLabel("Frequency, row 1").press("Enter");
  await expect(page.getByLabel("Amplitude, row 1")).toBeFocused();
  await page.keyboard.type("banana");
  await page.keyboard.press("Enter");
  await expect(page.getByLabel("Frequency, row 2")).toBeFocused();
  await expect(page.getByLabel("Amplitude, row 1")).toHaveAttribute("aria-invalid", "true");
  await expect(page.locator("#points\\.0\\.amplitude-error")).toContainText("Could not read “banana” as a voltage");
  await page.getByLabel("Amplitude, row 1").fill("18.6 V");
  await expect(page.getByLabel("Amplitude, row 1")).toHaveAttribute("aria-invalid", "false");

  // Pasted: the fixture's next 59 readings as two tab-separated columns in engineering notation.
  const block = readFileSync(fixture("sweep-km02.csv"), "utf8")
    .split(/\r?\n/)
    .slice(2, 61)
    .map((line) => line.replace(/,/g, ".").split(";"))
    .map(([kHz, mV]) => `${kHz}k\t${mV} mV`)
    .join("\n");
  await page.getByLabel("Frequency, row 2").focus();
  await page.getByLabel("Frequency, row 2").evaluate((input, text) => {
    const data = new DataTransfer();
    data.setData("text/plain", text);
    input.dispatchEvent(new ClipboardEvent("paste", { clipboardData: data, bubbles: true, cancelable: true }));
  }, block);
  await expect(page.getByLabel("Frequency, row 60")).toHaveValue(/k$/);
  await expect(page.getByLabel("Frequency, row 61")).toHaveValue("");
  await expect(page.getByRole("table", { name: /Readings \(60\)/ })).toBeVisible();

  await page.getByRole("button", { name: "Save sweep" }).click();
  await expect(page).toHaveURL(/\/sweeps\/[^/]+$/);
  await expect(page.getByRole("heading", { level: 1, name: /Sweep of KM-01/ })).toBeVisible();
  await expect(page.locator("dl.facts").first().locator("dt:text-is('Readings') + dd")).toHaveText("60");
  expect(await sweepCount(page, "KM-01")).toBe(before + 1);
});

test("the what-if form predicts a lower first resonance for a bigger top load", async ({ page }) => {
  await signInAs(page, "member");
  await page.goto("/sweeps?coil=KM-03");
  await page.locator("tbody tr").first().getByRole("link").first().click();
  await expect(page.getByRole("heading", { level: 1, name: /Sweep of KM-03/ })).toBeVisible();

  const predict = async (diameter: string, tube: string) => {
    const form = page.getByRole("form", { name: "What would this top load do?" });
    await form.getByLabel("Shape").selectOption("toroid");
    await form.getByLabel("Diameter (outer, for a toroid)").fill(diameter);
    await form.getByLabel("Tube diameter (toroid)").fill(tube);
    await form.getByRole("button", { name: "Predict" }).click();
    const result = page.locator("#what-if-result");
    await expect(result).toContainText("Predicted first resonance");
    return readHz(await result.locator("strong").first().innerText());
  };
  const small = await predict("150 mm", "40 mm");
  const big = await predict("0.4 m", "10 cm");
  expect(big).toBeLessThan(small);
  await expect(page).toHaveURL(/shape=toroid/);
});

test("a 100 000-row file is read with a progress bar and imported whole", async ({ page }) => {
  test.setTimeout(180_000);
  const count = 100_000;
  const model = createLineModel({ firstSeriesResonance: 480_000, characteristicImpedance: 60_000, topCapacitance: 6e-12, dispersionExponent: 0.12, q: 90 });
  const frequencies = Array.from({ length: count }, (_, i) => 240_000 * 8 ** (i / (count - 1)));
  const readings = simulateSweep({ model, seriesResistance: 22_000, sourceAmplitude: 20, frequencies, noise: { relative: 0.005 }, rng: createSeededRandom(99) });
  const csv = ["frequency_hz\tvout_v", ...readings.map((p) => `${p.frequency.toFixed(2)}\t${Math.min(p.amplitude, 19.9).toFixed(5)}`)].join("\n");

  await signInAs(page, "member");
  await page.goto("/sweeps/import?coil=KM-06");
  await page.getByLabel("CSV file").setInputFiles({ name: "long-sweep.tsv", mimeType: "text/plain", buffer: Buffer.from(csv) });
  await page.getByRole("button", { name: "Read the file" }).click();
  await expect(page.getByRole("status")).toContainText("tab-separated, with the header on row 1");
  await fillSettings(page);
  await page.getByRole("button", { name: "Preview" }).click();
  await expect(page.getByRole("status")).toContainText(`${count} readings understood`, { timeout: 60_000 });
  await expect(page.getByLabel("Reading the file")).toHaveAttribute("value", "1");
  await page.getByRole("button", { name: `Import ${count} readings` }).click();
  await expect(page.getByRole("heading", { level: 1, name: /Sweep of KM-06/ })).toBeVisible({ timeout: 90_000 });
  await expect(page.locator("dl.facts").first().locator("dt:text-is('Readings') + dd")).toHaveText(String(count));
  await expect(page.getByText(/The chart shows \d+ of 100000 readings/)).toBeVisible();
  const first = readHz(await page.locator("dl.facts").first().locator("dt:text-is('First series resonance') + dd").innerText());
  expect(Math.abs(first / 480_000 - 1)).toBeLessThan(0.03);
});

test("the import route refuses anonymous callers and answers bad readings with the field, storing nothing", async ({ page, request }) => {
  const anonymous = await request.post("/api/sweeps/import", { data: {} });
  expect(anonymous.status()).toBe(401);
  expect(await anonymous.json()).toMatchObject({ ok: false });

  await signInAs(page, "member");
  const before = await sweepCount(page, "KM-07");
  const coilId = "coil-KM-07"; // the demo loader's id for KM-07 (prisma/demo/generate.ts)
  const response = await page.request.post("/api/sweeps/import", {
    data: { coilId, topLoadId: "", takenAt: new Date().toISOString(), seriesResistanceOhm: "22k", sourceAmplitudeV: "20", amplitudeConvention: "peak", frequenciesHz: [1000, 2000, -5], amplitudesV: [1, 2, 3] },
  });
  expect(response.status()).toBe(422);
  const body = await response.json();
  expect(body).toMatchObject({ ok: false, fieldErrors: { "frequenciesHz.2": [expect.stringMatching(/^Reading 3: frequency must be between 1 Hz and 100 MHz/)] } });
  expect(await sweepCount(page, "KM-07")).toBe(before);
});
