/**
 * The CSV exports over HTTP against the built app: the site's sessions table streamed whole (GET
 * /api/export/sessions.csv) holds each coil's own sessions file under one header, and the fleet summary's session
 * count for a coil is that file's row count. Rows are compared parsed, since notes may hold line breaks.
 */
import { expect, test } from "@playwright/test";
import Papa from "papaparse";
import { signInAs } from "./support/accounts";

const rowsOf = (text: string) => Papa.parse<string[]>(text, { newline: "\r\n", skipEmptyLines: true }).data;

test("a member downloads the site's sessions table, each coil's rows as its own file has them", async ({ page }) => {
  await signInAs(page, "member");
  const whole = await page.request.get("/api/export/sessions.csv");
  expect(whole.status()).toBe(200);
  expect(whole.headers()["content-type"]).toContain("text/csv");
  expect(whole.headers()["content-disposition"]).toMatch(/attachment; filename="coilyard-sessions-\d{4}-\d{2}-\d{2}\.csv"/);
  const [header, ...rows] = rowsOf(await whole.text());
  expect(header).toContain("supply_voltage_v");

  const one = await page.request.get("/api/export/coils/KM-05/sessions.csv");
  expect(one.status()).toBe(200);
  const [oneHeader, ...oneRows] = rowsOf(await one.text());
  expect(oneHeader).toEqual(header);
  expect(oneRows.length).toBeGreaterThan(0);
  expect(rows.filter((row) => row[0] === "KM-05")).toEqual(oneRows);

  const summary = rowsOf(await (await page.request.get("/api/export/fleet.csv")).text());
  const sessionsColumn = summary[0]!.indexOf("sessions");
  expect(summary.find((row) => row[0] === "KM-05")?.[sessionsColumn]).toBe(String(oneRows.length));

  expect((await page.request.get("/api/export/coils/NO-SUCH-COIL/sessions.csv")).status()).toBe(404);
});
