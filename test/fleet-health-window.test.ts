/** The dashboard's windowed read (lib/db/coil-history getFleetHealthHistory) against the full logbook it replaces. */
import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, resetDatabase, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { getCoilHistory, getCoilPageHistory, getFleetHealthHistory, getFleetHistory } from "@/lib/db/coil-history";
import { getCoilTimeline } from "@/lib/db/coil-timeline";
import { getCoilByTag } from "@/lib/db/coils";
import { compareCoil } from "@/lib/analysis/coil-comparison";
import { getFleetOverview } from "@/lib/db/fleet";
import { HEALTH_WINDOW, selectHealthWindow } from "@/lib/analysis/health-window";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import type { SiteScope } from "@/lib/db/site-scope";

const DAY = 86_400_000;
const now = new Date("2026-11-30T12:00:00Z");

async function addSessions(coilId: string, count: number) {
  await testDb.runSession.createMany({
    data: Array.from({ length: count }, (_, i) => ({
      coilId,
      startedAt: new Date(now.getTime() - 200 * DAY + i * 3_600_000),
      supplyVoltageV: 24,
      supplyCurrentA: 2 + i * 0.001,
      durationS: 600 + i,
      ambientTempC: 21,
      heatSinkEndC: 35,
    })),
  });
}

describe("getFleetHealthHistory", () => {
  beforeEach(resetDatabase);

/** Reads at the default site, as a single-club install makes them. */
const MAIN = mainScope(null);

  it("reads the baseline and recent window of a long logbook, with totals over every session", async () => {
    const long = await makeCleanCoil("HW-01", now);
    await addSessions(long.id, 150);
    const short = await makeCleanCoil("HW-02", now);
    const [full, windowed] = await Promise.all([getFleetHistory(MAIN), getFleetHealthHistory(MAIN)]);
    for (const coil of full) {
      const read = windowed.find((w) => w.coil.id === coil.coil.id)!;
      expect(read.sessions.map((s) => s.id)).toEqual(selectHealthWindow(coil.sessions).map((s) => s.id));
      expect(read.sessions[0]).toEqual(coil.sessions[0]);
      expect(read.totals.sessionCount).toBe(coil.sessions.length);
      expect(read.totals.totalDurationS).toBeCloseTo(coil.sessions.reduce((sum, s) => sum + s.durationS, 0), 6);
      expect(read.totals.lastSessionAt).toEqual(coil.sessions.at(-1)!.startedAt);
    }
    const longRead = windowed.find((w) => w.coil.id === long.id)!;
    expect(longRead.sessions).toHaveLength(HEALTH_WINDOW.baselineSessions + HEALTH_WINDOW.recentSessions);
    expect(windowed.find((w) => w.coil.id === short.id)!.sessions).toHaveLength(5);
  });

  it("gives a coil without sessions no totals, and the dashboard still lists it", async () => {
    await testDb.coil.create({ data: { siteId: MAIN.siteId, tag: "HW-03", name: "Fresh build", builderName: "Test", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 } });
    const [read] = await getFleetHealthHistory(MAIN);
    expect(read!.sessions).toEqual([]);
    expect(read!.totals).toEqual({ sessionCount: 0, totalDurationS: 0, lastSessionAt: null });
    const [row] = await getFleetOverview(MAIN, now);
    expect(row).toMatchObject({ tag: "HW-03", sessionCount: 0, hoursRun: 0, lastSessionAt: null, health: "not enough data" });
  });

  it("gives the coil page the same window and prediction table as its whole logbook, and the timeline every count", async () => {
    const long = await makeCleanCoil("HW-04", now);
    await addSessions(long.id, 150); // no running frequency: the table's session is one of makeCleanCoil's, older than the window
    const [full, page, timeline] = await Promise.all([getCoilHistory(MAIN, long.id), getCoilPageHistory(MAIN, long.id), getCoilTimeline(MAIN, long.id)]);
    expect(page!.sessions.map((s) => s.id)).toEqual(selectHealthWindow(full!.sessions).map((s) => s.id));
    const compared = compareCoil(page!.coil, page!.topLoads, page!.sweeps, page!.comparisonSessions);
    expect(compared.rows.find((r) => r.quantity === "runningFrequency")!.measured).toBe(300_000);
    expect(compared).toEqual(compareCoil(full!.coil, full!.topLoads, full!.sweeps, full!.sessions));
    expect(timeline.counts).toEqual({ sessions: 155, sweeps: 1, failures: 0, components: 3, clearances: 0, loans: 0 });
  });

  it("reads the same history and timeline when handed the coil the page already read (parts and top loads not read twice)", async () => {
    const coil = await makeCleanCoil("HW-05", now);
    await addSessions(coil.id, 20);
    const part = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id } });
    await testDb.component.update({ where: { id: part.id }, data: { removedAt: now, removalReason: "worn" } });
    const known = (await getCoilByTag(MAIN, "HW-05"))!;
    const [read, handed] = await Promise.all([getCoilPageHistory(MAIN, coil.id), getCoilPageHistory(MAIN, coil.id, known)]);
    expect(handed).toEqual(read);
    expect(handed!.coil).not.toHaveProperty("components");
    const [timelineRead, timelineHanded] = await Promise.all([getCoilTimeline(MAIN, coil.id), getCoilTimeline(MAIN, coil.id, 25, { parts: known.components })]);
    expect(timelineHanded).toEqual(timelineRead);
    expect(timelineHanded.events.filter((e) => e.kind === "part-removed")).toHaveLength(1);
  });

  it("reads, straight through the adapter, what the query API reads of the whole demo network, site by site: coils, parts, sweeps, top loads, open failures, the window and the totals", async () => {
    const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
    await loadDemoDataset(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
    const long = await makeCleanCoil("HW-06", now);
    await addSessions(long.id, 150);
    // Two open failures (the demo network's are all closed), one at the same instant as a closed one.
    for (const [status, at] of [["open", 5], ["open", 2], ["closed", 2]] as const) {
      await testDb.failure.create({ data: { coilId: long.id, occurredAt: new Date(now.getTime() - at * DAY), mode: "over_voltage", symptoms: "Switch shorted", status, closedAt: status === "closed" ? now : null } });
    }
    // Tied instants: the raw reads break ties by id, where the query API's orderBy on the date alone left them to the database.
    const byDateThenId = <T extends { id: string }>(at: (row: T) => Date) => (a: T, b: T) => at(a).getTime() - at(b).getTime() || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
    const sites = await testDb.site.findMany({ select: { id: true } });
    let openFailuresSeen = 0;
    for (const { id: siteId } of sites) {
      const scope: SiteScope = { siteId, actorId: null };
      const [full, windowed] = await Promise.all([getFleetHistory(scope), getFleetHealthHistory(scope)]);
      expect(windowed.map((w) => w.coil)).toEqual(full.map((f) => f.coil));
      full.forEach((f, i) => {
        const read = windowed[i]!;
        const sessions = [...f.sessions].sort(byDateThenId((s) => s.startedAt));
        expect(read.sessions).toEqual(selectHealthWindow(sessions));
        expect(read.components).toEqual([...f.components].sort(byDateThenId((p) => p.installedAt)));
        expect(read.sweeps).toEqual([...f.sweeps].sort(byDateThenId((w) => w.takenAt)));
        expect(read.topLoads).toEqual([...f.topLoads].sort(byDateThenId((t) => t.createdAt)));
        expect(read.openFailures).toEqual(f.openFailures);
        openFailuresSeen += read.openFailures.length;
        expect(read.totals.sessionCount).toBe(f.sessions.length);
        expect(read.totals.totalDurationS).toBeCloseTo(f.sessions.reduce((sum, s) => sum + s.durationS, 0), 6);
        expect(read.totals.lastSessionAt).toEqual(sessions.at(-1)?.startedAt ?? null);
      });
      // The listed coils only, in the same shape; another site's coil in the list is left out.
      const listed = full.filter((_, i) => i % 2 === 0).map((f) => f.coil.id);
      const otherSite = sites.find((s) => s.id !== siteId);
      const otherCoil = otherSite ? await testDb.coil.findFirst({ where: { siteId: otherSite.id }, select: { id: true } }) : null;
      const some = await getFleetHealthHistory(scope, [...listed, ...(otherCoil ? [otherCoil.id] : [])]);
      expect(some).toEqual(windowed.filter((w) => listed.includes(w.coil.id)));
    }
    // The comparison is only as good as the records: open failures, and more than one site.
    expect(openFailuresSeen).toBeGreaterThan(0);
    expect(sites.length).toBeGreaterThan(1);
  }, 120_000);
});
