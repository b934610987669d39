/**
 * The hot page reads that go through $queryRaw (lib/db/raw-read.ts says why) against Prisma's query API asking the
 * same question: same rows, same order, same types (dates as Date, nulls as null), on SQLite and on PostgreSQL. Each
 * read is narrowed by the scope's site in its own SQL; the last tests put a second site with the same tags on the
 * database and check every read against the query API asking for that site only.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { TEST_SWITCH } from "./support/bench-fixtures";
import { getCoilByTag } from "@/lib/db/coils";
import { getCoilHistory, getCoilPageHistory } from "@/lib/db/coil-history";
import { getCoilTimeline } from "@/lib/db/coil-timeline";
import { readCoilPage } from "@/lib/db/coil-page";
import { getCurrentPolicy, saveSitePolicyVersion } from "@/lib/db/policy";
import { getFleetOverview, readLatestClearances } from "@/lib/db/fleet";
import { selectHealthWindow } from "@/lib/analysis/health-window";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { rawCount, rawDate, rawDateOrNull } from "@/lib/db/raw-read";
import { DEFAULT_SITE_ID, type SiteScope } from "@/lib/db/site-scope";

const DAY = 86_400_000;
const now = new Date("2026-11-30T12:00:00Z");
const daysAgo = (days: number) => new Date(now.getTime() - days * DAY);
const main = mainScope(null);

/** A coil with a history of every kind: parts fitted and removed, two top loads, sweeps with and without one, a failure, clearances, loans. */
async function makeBusyCoil(tag: string, siteId: string = DEFAULT_SITE_ID) {
  const steward = await makeUser(`${tag.toLowerCase()}.${siteId}@club.test`, "steward", "Rhiannon Steward", siteId);
  const coil = await makeCleanCoil(tag, now, steward.id, siteId);
  const policy = await getCurrentPolicy(siteScope(siteId, null));
  const bigTop = await testDb.topLoad.create({ data: { coilId: coil.id, name: "Large toroid", shape: "toroid", diameterM: 0.2, tubeDiameterM: 0.05, createdAt: daysAgo(3) } });
  const [oldSwitch] = await testDb.component.findMany({ where: { coilId: coil.id, kind: "switch" } });
  await testDb.component.update({ where: { id: oldSwitch!.id }, data: { removedAt: daysAgo(4), removalReason: "shorted drain to source" } });
  await testDb.component.create({ data: { coilId: coil.id, kind: "switch", partNumber: "SW-2", voltageRatingV: 600, continuousCurrentA: 20, installedAt: daysAgo(4) } });
  await testDb.component.create({ data: { coilId: coil.id, kind: "snubber", partNumber: "RC-1", installedAt: daysAgo(20), removedAt: daysAgo(12), removalReason: "upgraded" } });
  await testDb.sweep.create({ data: { coilId: coil.id, topLoadId: null, takenAt: daysAgo(2), seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, firstSeriesResonanceHz: null } });
  await testDb.sweep.create({ data: { coilId: coil.id, topLoadId: bigTop.id, takenAt: daysAgo(1), seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, firstSeriesResonanceHz: 251_000 } });
  await testDb.failure.create({ data: { coilId: coil.id, occurredAt: daysAgo(4), mode: "over_voltage", symptoms: "Switch shorted on start-up", status: "closed", closedAt: daysAgo(3) } });
  const clearance = (verdict: "cleared" | "refused", decided: number, lapsed?: number) =>
    testDb.clearance.create({
      data: {
        coilId: coil.id,
        policyId: policy.id,
        decidedById: steward.id,
        decidedAt: daysAgo(decided),
        validUntil: daysAgo(decided - 90),
        verdict,
        ruleResultsJson: "[]",
        checklistJson: "{}",
        lapsedAt: lapsed === undefined ? null : daysAgo(lapsed),
        lapseReason: lapsed === undefined ? null : "part replaced",
      },
    });
  const old = await clearance("cleared", 8, 4);
  await clearance("refused", 3);
  const latest = await clearance("cleared", 2);
  await testDb.loan.create({ data: { coilId: coil.id, clearanceId: old.id, borrower: "Year 9 science", event: "Open evening", outAt: daysAgo(7), expectedBackAt: daysAgo(6), returnedAt: daysAgo(6), returnCondition: "as lent" } });
  await testDb.loan.create({ data: { coilId: coil.id, clearanceId: latest.id, borrower: "Library club", event: "Science week", outAt: daysAgo(1), expectedBackAt: daysAgo(-2) } });
  return { coil, steward };
}

describe("raw page reads", () => {
  beforeEach(resetDatabase);

  it("getCoilByTag: the coil, who recorded it, top loads in creation order and parts fitted-first as the query API reads them", async () => {
    const { coil } = await makeBusyCoil("RR-01");
    const expected = await testDb.coil.findUnique({
      where: { siteId_tag: { siteId: DEFAULT_SITE_ID, tag: "RR-01" } },
      include: {
        topLoads: { orderBy: [{ createdAt: "asc" }, { id: "asc" }] },
        components: { orderBy: [{ removedAt: { sort: "asc", nulls: "first" } }, { installedAt: "desc" }, { id: "asc" }] },
        createdBy: { select: { name: true } },
      },
    });
    const read = await getCoilByTag(main, "RR-01");
    expect(read).toEqual(expected);
    expect(read!.createdBy).toEqual({ name: "Rhiannon Steward" });
    expect(read!.components.map((c) => c.removedAt === null)).toEqual([true, true, true, false, false]);
    expect(read!.createdAt).toBeInstanceOf(Date);
    expect(read!.components.at(-1)!.removedAt).toBeInstanceOf(Date);
    expect(await getCoilByTag(main, "RR-99")).toBeNull();
    await testDb.coil.update({ where: { id: coil.id }, data: { createdById: null } });
    expect((await getCoilByTag(main, "RR-01"))!.createdBy).toBeNull();
  });

  it("getCoilPageHistory: the coil, parts, sweeps and the health window exactly as the whole-logbook read gives them", async () => {
    const { coil } = await makeBusyCoil("RR-02");
    // Two open failures besides the busy coil's closed one, one at the same instant as another (ties go by id).
    for (const [id, mode] of [["rr02-open-b", "over_temperature"], ["rr02-open-a", "over_current"]] as const) {
      await testDb.failure.create({ data: { id, coilId: coil.id, occurredAt: daysAgo(2), mode, symptoms: "Switch hot and shorted", status: "open" } });
    }
    const [page, full] = await Promise.all([getCoilPageHistory(main, coil.id), getCoilHistory(main, coil.id)]);
    expect(page!.openFailures.map((f) => [f.mode, f.occurredAt.getTime()])).toEqual([
      ["over_current", daysAgo(2).getTime()],
      ["over_temperature", daysAgo(2).getTime()],
    ]);
    expect(page!.openFailures).toEqual(full!.openFailures);
    expect(page!.coil).toEqual(full!.coil);
    expect(page!.components).toEqual(full!.components);
    expect(page!.topLoads).toEqual(full!.topLoads);
    expect(page!.sweeps).toEqual(full!.sweeps);
    expect(page!.sessions).toEqual(selectHealthWindow(full!.sessions));
    expect(page!.sessions[0]!.startedAt).toBeInstanceOf(Date);
    expect(page!.sweeps.at(-1)!.takenAt).toBeInstanceOf(Date);
    expect(await getCoilPageHistory(main, "no-such-coil")).toBeNull();
  });

  it("getCoilPageHistory: the latest session with a running frequency under a coil's only top-load-less sessions (topLoadId IS NULL)", async () => {
    const coil = await testDb.coil.create({ data: { siteId: DEFAULT_SITE_ID, tag: "RR-03", name: "Bare", builderName: "Test", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 } });
    const base = { coilId: coil.id, supplyVoltageV: 24, supplyCurrentA: 2, durationS: 600, ambientTempC: 21 };
    const withFrequency = await testDb.runSession.create({ data: { ...base, startedAt: daysAgo(100), runningFrequencyHz: 410_000 } });
    await testDb.runSession.createMany({ data: Array.from({ length: 70 }, (_, i) => ({ ...base, startedAt: daysAgo(90 - i) })) });
    const page = await getCoilPageHistory(main, coil.id);
    expect(page!.comparisonSessions.some((s) => s.id === withFrequency.id)).toBe(true);
    expect(page!.comparisonSessions[0]).toEqual(await testDb.runSession.findUnique({ where: { id: withFrequency.id }, select: Object.fromEntries(Object.keys(page!.sessions[0]!).map((k) => [k, true])) }));
  });

  it("getCoilTimeline: every kind of record, newest first, with dates as dates and the sweep's top load by name", async () => {
    const { coil } = await makeBusyCoil("RR-04");
    const timeline = await getCoilTimeline(main, coil.id);
    expect(timeline.counts).toEqual({ sessions: 5, sweeps: 3, failures: 1, components: 5, clearances: 3, loans: 2 });
    const kinds = new Set(timeline.events.map((e) => e.kind));
    expect([...kinds].sort()).toEqual(["clearance", "failure", "loan-back", "loan-out", "part-fitted", "part-removed", "session", "sweep"]);
    for (const event of timeline.events) expect(event.at).toBeInstanceOf(Date);
    const times = timeline.events.map((e) => e.at.getTime());
    expect(times).toEqual([...times].sort((a, b) => b - a));
    const sweeps = timeline.events.filter((e) => e.kind === "sweep").map((e) => e.detail);
    expect(sweeps).toEqual(["first series resonance 251.0 kHz (Large toroid)", "no resonance found (no top load)", "first series resonance 305.0 kHz (Small toroid)"]);
    expect(timeline.events.find((e) => e.kind === "loan-back")!.detail).toBe("from Year 9 science (as lent)");
    expect(timeline.events.filter((e) => e.kind === "part-removed").map((e) => e.detail)).toEqual([
      `${TEST_SWITCH.partNumber} (switch): shorted drain to source`,
      "RC-1 (snubber): upgraded",
    ]);
    // Read without the parts handed in, the same timeline.
    expect(await getCoilTimeline(main, coil.id, 25, { parts: (await getCoilByTag(main, "RR-04"))!.components })).toEqual(timeline);
  });

  it("readCoilPage: the timeline from the records the page already holds is the timeline read on its own, for short and long limits", async () => {
    const { coil } = await makeBusyCoil("RR-08");
    const base = { coilId: coil.id, supplyVoltageV: 24, supplyCurrentA: 2, durationS: 600, ambientTempC: 21 };
    // 90 sessions newer than any other record, in pairs at the same instant, so the newest 25 depend on the id tie-break.
    await testDb.runSession.createMany({ data: Array.from({ length: 90 }, (_, i) => ({ ...base, startedAt: new Date(daysAgo(0.9).getTime() + Math.floor(i / 2) * 600_000) })) });
    for (const limit of [25, 60, 80]) {
      const page = await readCoilPage(main, "RR-08", limit);
      expect(page!.timeline).toEqual(await getCoilTimeline(main, coil.id, limit));
      expect(page!.history).toEqual(await getCoilPageHistory(main, coil.id));
    }
    expect((await readCoilPage(main, "RR-08"))!.timeline.events.map((e) => e.kind)).toEqual(Array(25).fill("session"));
    expect(await readCoilPage(main, "RR-99")).toBeNull();
  });

  it("getCurrentPolicy: the organisation's and the site's highest versions, as stored, and no other site's", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    const north = siteScope((await createSite("north")).id, null);
    const first = await getCurrentPolicy(main);
    await saveSitePolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, minVoltageHeadroom: 0.3 }, "tighter");
    const latest = await getCurrentPolicy(main);
    const storedDefault = await testDb.clearancePolicy.findFirstOrThrow({ where: { siteId: null }, orderBy: { version: "desc" } });
    const storedOwn = await testDb.clearancePolicy.findFirstOrThrow({ where: { siteId: DEFAULT_SITE_ID }, orderBy: { version: "desc" } });
    const fields = ({ id, siteId, version, note, createdAt }: typeof storedOwn) => ({ id, siteId, version, note, createdAt });
    expect(latest.version).toBe(first.version + 1);
    expect(latest).toMatchObject(fields(storedOwn));
    expect(latest.organisationDefault).toMatchObject(fields(storedDefault));
    expect(latest.siteOwn).toMatchObject(fields(storedOwn));
    expect(latest.createdAt).toBeInstanceOf(Date);
    expect(latest.rules.minVoltageHeadroom).toBe(0.3);
    // The other site still lends by the default alone.
    const northPolicy = await getCurrentPolicy(north);
    expect(northPolicy).toMatchObject({ ...fields(storedDefault), siteOwn: null });
    expect(northPolicy.rules.minVoltageHeadroom).toBe(DEFAULT_CLEARANCE_POLICY.minVoltageHeadroom);
  });

  it("the dashboard's latest clearance per coil is the query API's distinct-by-coil answer, and the dashboard reads it", async () => {
    const { coil } = await makeBusyCoil("RR-05");
    await makeBusyCoil("RR-06");
    await makeCleanCoil("RR-07", now); // never cleared
    const expected = await testDb.clearance.findMany({
      orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
      distinct: ["coilId"],
      select: { id: true, coilId: true, verdict: true, decidedAt: true, validUntil: true },
    });
    const read = await readLatestClearances(main);
    const byCoil = (rows: typeof read) => [...rows].sort((a, b) => a.coilId.localeCompare(b.coilId));
    expect(byCoil(read)).toEqual(byCoil(expected));
    const rows = await getFleetOverview(main, now);
    expect(rows.map((r) => r.tag)).toEqual(["RR-05", "RR-06", "RR-07"]);
    const busy = rows.find((r) => r.id === coil.id)!;
    expect(busy.clearance.kind).toBe("valid");
    expect(busy.activeLoan).toMatchObject({ borrower: "Library club", overdue: false });
    expect(busy.activeLoan!.expectedBackAt).toBeInstanceOf(Date);
    expect(busy.openFailures).toBe(0);
    expect(rows.find((r) => r.tag === "RR-07")!.clearance.kind).toBe("none");
  });
});

describe("raw page reads, per site", () => {
  beforeEach(resetDatabase);

  /** Two sites with the same tags and the same kinds of history, so only the site can tell their records apart. */
  async function twoSites() {
    const north = await createSite("north");
    const northScope = siteScope(north.id, null);
    const mine = await makeBusyCoil("RR-01");
    const theirs = await makeBusyCoil("RR-01", north.id);
    await makeCleanCoil("RR-02", now, undefined, north.id);
    return { north: northScope, mainCoil: mine.coil, northCoil: theirs.coil };
  }

  it("getCoilByTag, getCoilPageHistory and readCoilPage: each site's own coil under a shared tag, the other's not found", async () => {
    const { north, mainCoil, northCoil } = await twoSites();
    for (const [scope, coil, other] of [[main, mainCoil, northCoil], [north, northCoil, mainCoil]] as const) {
      const expected = await testDb.coil.findUnique({
        where: { siteId_tag: { siteId: scope.siteId, tag: "RR-01" } },
        include: {
          topLoads: { orderBy: [{ createdAt: "asc" }, { id: "asc" }] },
          components: { orderBy: [{ removedAt: { sort: "asc", nulls: "first" } }, { installedAt: "desc" }, { id: "asc" }] },
          createdBy: { select: { name: true } },
        },
      });
      expect(await getCoilByTag(scope, "RR-01")).toEqual(expected);
      expect(expected!.id).toBe(coil.id);
      const [page, full] = await Promise.all([getCoilPageHistory(scope, coil.id), getCoilHistory(scope, coil.id)]);
      expect(page!.sessions).toEqual(selectHealthWindow(full!.sessions));
      expect(page!.sweeps).toEqual(full!.sweeps);
      expect(page!.sessions.every((s) => s.coilId === coil.id)).toBe(true);
      expect(await getCoilPageHistory(scope, other.id)).toBeNull();
      const read = (await readCoilPage(scope, "RR-01"))!;
      expect(read.history).toEqual(page);
      expect(read.timeline).toEqual(await getCoilTimeline(scope, coil.id));
    }
    expect(await getCoilByTag(main, "RR-02")).toBeNull();
    expect(await readCoilPage(main, "RR-02")).toBeNull();
    expect(await getCoilByTag(north, "RR-02")).not.toBeNull();
  });

  it("the dashboard's latest clearances and fleet rows: the query API's answer for the site's coils only", async () => {
    const { north, mainCoil, northCoil } = await twoSites();
    for (const [scope, coil] of [[main, mainCoil], [north, northCoil]] as [SiteScope, typeof mainCoil][]) {
      const expected = await testDb.clearance.findMany({
        where: { coil: { siteId: scope.siteId } },
        orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
        distinct: ["coilId"],
        select: { id: true, coilId: true, verdict: true, decidedAt: true, validUntil: true },
      });
      expect(expected.map((c) => c.coilId)).toEqual([coil.id]);
      expect(await readLatestClearances(scope)).toEqual(expected);
      const rows = await getFleetOverview(scope, now);
      const coilsOfSite = await testDb.coil.findMany({ where: { siteId: scope.siteId }, orderBy: { tag: "asc" }, select: { id: true, tag: true } });
      expect(rows.map((r) => ({ id: r.id, tag: r.tag }))).toEqual(coilsOfSite);
    }
  });
});

describe("raw-read decoding", () => {
  it("turns stored text, epoch milliseconds and Dates into Dates, and refuses anything else by name", () => {
    const at = new Date("2026-11-30T12:00:00.000Z");
    expect(rawDate(at)).toBe(at);
    expect(rawDate("2026-11-30T12:00:00.000+00:00")).toEqual(at);
    expect(rawDate(at.getTime())).toEqual(at);
    expect(rawDateOrNull(null)).toBeNull();
    expect(() => rawDate("yesterday")).toThrow(/Expected a date from the database, got "yesterday"/);
    expect(() => rawDate(true)).toThrow(TypeError);
  });

  it("turns bigint and number counts into numbers, no rows into 0", () => {
    expect(rawCount(12n)).toBe(12);
    expect(rawCount(7)).toBe(7);
    expect(rawCount(null)).toBe(0);
    expect(() => rawCount("3")).toThrow(/Expected a count/);
  });
});
