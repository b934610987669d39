/**
 * The exports that no longer read whole logbooks, against the whole-logbook answer they replace, on SQLite and on
 * PostgreSQL (scripts/test-postgres.sh): the fleet summary counted in the database (lib/db/fleet-summary.ts, raw SQL)
 * must print exactly what `fleetSummaryCsv(exportFleet(…))` prints, and the sessions tables streamed in keyset pages
 * (lib/db/session-export.ts) exactly what `sessionsCsv` prints from each coil's logbook file — same rows, order,
 * cells and quoting. Each is asked at two sites that both have a coil tagged KM-01 (the demo's school site adds its
 * own coils), so a row of the other site would show.
 */
import { beforeAll, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { exportFleet } from "@/lib/db/export";
import { readFleetSummaryRows } from "@/lib/db/fleet-summary";
import { openSessionExport } from "@/lib/db/session-export";
import { csvStream } from "@/lib/export/csv-stream";
import { fleetSummaryCsv, fleetSummaryRowsCsv, sessionCsvPage, sessionsCsv, SESSION_CSV_COLUMNS } from "@/lib/export/logbook-csv";
import type { SiteScope } from "@/lib/db/site-scope";

const now = new Date("2026-11-30T12:00:00Z");
const main = mainScope(null);
let other: SiteScope = main;

async function streamedText(scope: SiteScope, options: { tag?: string; pageSize?: number }): Promise<string> {
  const { pages } = await openSessionExport(scope, options);
  return new Response(csvStream(pages, sessionCsvPage)).text();
}

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
  // A third site with a coil tagged like one of the club's: sessions that tie on startedAt (the id decides), notes that
  // need quoting, a session without a top load or logger, an open failure, a loan out, two sweeps taken at the same time.
  const site = await createSite("annex");
  other = siteScope(site.id, null);
  const steward = await makeUser("annex.steward@club.test", "steward", "Annex Steward", site.id);
  const coil = await makeCleanCoil("KM-01", now, steward.id, site.id);
  const top = await testDb.topLoad.create({ data: { coilId: coil.id, name: 'Toroid, "large"', shape: "toroid", diameterM: 0.2, tubeDiameterM: 0.05, createdAt: now } });
  const tiedAt = new Date("2026-11-28T10:00:00Z");
  const session = (id: string, startedAt: Date, extra: object = {}) =>
    testDb.runSession.create({ data: { id, coilId: coil.id, startedAt, supplyVoltageV: 120, supplyCurrentA: 2.5, durationS: 60, ambientTempC: 21, ...extra } });
  await session("annex-s-b", tiedAt, { topLoadId: top.id, loggedById: steward.id, notes: 'Arc to "ground", then\nstopped' });
  await session("annex-s-a", tiedAt, { runningFrequencyHz: 251_000.5, outcome: "stopped" });
  await session("annex-s-c", new Date("2026-11-29T10:00:00Z"), { notes: " leading space" });
  const sweep = (id: string, hz: number) => testDb.sweep.create({ data: { id, coilId: coil.id, takenAt: tiedAt, seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, firstSeriesResonanceHz: hz } });
  await sweep("annex-w-a", 250_000);
  await sweep("annex-w-b", 249_000);
  await testDb.failure.create({ data: { coilId: coil.id, occurredAt: now, mode: "over_voltage", symptoms: "Switch shorted", status: "open" } });
  await testDb.coil.create({ data: { siteId: site.id, tag: "TC-99", name: "Empty logbook", builderName: "Annex", formDiameterM: 0.05, windingLengthM: 0.2, turns: 800, wireDiameterM: 0.0002 } });
});

describe("fleet summary counted in the database", () => {
  it("prints what the whole-logbook summary prints, at each site", async () => {
    for (const scope of [main, other, siteScope("site-fenwick", null)]) {
      const counted = fleetSummaryRowsCsv(await readFleetSummaryRows(scope));
      expect(counted).toBe(fleetSummaryCsv(await exportFleet(scope)));
    }
  });

  it("gives counts as numbers and times as ISO text, and only the scope's coils", async () => {
    const rows = await readFleetSummaryRows(other);
    expect(rows.map((r) => r.tag)).toEqual(["KM-01", "TC-99"]);
    const [busy, empty] = rows;
    const busyCoil = { coil: { siteId: other.siteId, tag: "KM-01" } };
    const sessions = await testDb.runSession.count({ where: busyCoil });
    expect(sessions).toBeGreaterThan(3);
    expect(busy).toMatchObject({ sessions, sweeps: await testDb.sweep.count({ where: busyCoil }), failures: 1, open_failures: 1, last_session_at: "2026-11-29T10:00:00.000Z", last_first_series_resonance_hz: 249_000 });
    expect(empty).toMatchObject({ sessions: 0, sweeps: 0, parts_fitted: 0, last_session_at: null, last_first_series_resonance_hz: null });
    const mainTags = (await readFleetSummaryRows(main)).map((r) => r.tag);
    expect(mainTags).toContain("KM-01");
    expect(mainTags).not.toContain("TC-99");
  });
});

describe("sessions export streamed in keyset pages", () => {
  it("each coil's file is exactly sessionsCsv of its logbook, whatever the page size", async () => {
    for (const scope of [main, other]) {
      const doc = await exportFleet(scope);
      expect(doc.coils.length).toBeGreaterThan(0);
      for (const coil of doc.coils) {
        for (const pageSize of [1, 7, 1000]) expect(await streamedText(scope, { tag: coil.tag, pageSize })).toBe(sessionsCsv(coil));
      }
    }
  });

  it("the site's file is every coil's rows in tag order under one header, and none of another site's", async () => {
    for (const scope of [main, other]) {
      const doc = await exportFleet(scope);
      const expected = doc.coils.flatMap((coil) => Papa.parse<string[]>(sessionsCsv(coil).trimEnd(), { newline: "\r\n" }).data.slice(1));
      const parsed = Papa.parse<string[]>(await streamedText(scope, { pageSize: 5 }), { newline: "\r\n" }).data;
      expect(parsed[0]).toEqual([...SESSION_CSV_COLUMNS]);
      expect(parsed.slice(1)).toEqual(expected);
      expect(expected.length).toBe(await testDb.runSession.count({ where: { coil: { siteId: scope.siteId } } }));
    }
    const annex = Papa.parse<string[]>(await streamedText(other, {}), { newline: "\r\n" }).data.slice(1);
    const ids = annex.map((row) => row[1]);
    // Tied on startedAt: the id decides, and the next session follows them.
    expect(ids.indexOf("annex-s-b") - ids.indexOf("annex-s-a")).toBe(1);
    expect(ids.indexOf("annex-s-c")).toBeGreaterThan(ids.indexOf("annex-s-b"));
    expect(annex[ids.indexOf("annex-s-b")]?.[15]).toBe('Arc to "ground", then\nstopped');
    expect(annex[ids.indexOf("annex-s-b")]?.[3]).toBe('Toroid, "large"');
  });

  it("finds no coil of another site by its tag, and writes the header alone for a coil with no sessions", async () => {
    expect((await openSessionExport(other, { tag: "KM-02" })).coilCount).toBe(0);
    expect((await openSessionExport(main, { tag: "TC-99" })).coilCount).toBe(0);
    expect(await streamedText(other, { tag: "TC-99" })).toBe(`${SESSION_CSV_COLUMNS.join(",")}\r\n`);
  });
});
