/**
 * The coil page reads some records once and hands them on (lib/db/coil-page.ts, app/(app)/coils/[tag]/page.tsx): the
 * band's standing takes the latest clearance, the failures and the open loan from the timeline's reads, and the
 * prediction table takes the running frequencies from the health window when that holds the whole logbook. Each is
 * checked here against the read it replaces, and the raw running-frequency read against the query API's answer, on
 * SQLite and PostgreSQL (scripts/test-postgres.sh), including the fallbacks when what was read is not enough.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, makeUser, mainScope, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { readCoilStanding } from "@/lib/db/coil-standing";
import { getCoilTimeline } from "@/lib/db/coil-timeline";
import { readCoilPage } from "@/lib/db/coil-page";
import { readCoilComparison, readRunningFrequencies } from "@/lib/db/prediction-history";
import { getCurrentPolicy } from "@/lib/db/policy";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

const DAY = 86_400_000;
const now = new Date("2026-11-30T12:00:00Z");
const daysAgo = (days: number) => new Date(now.getTime() - days * DAY);
const main = mainScope(null);

beforeEach(resetDatabase);

/** Clearances, failures and loans of a coil: `loans` returned ones newest last, then optionally one still out that is older than them all. */
async function addRecords(coilId: string, { clearances, failures, returnedLoans, oldOpenLoan }: { clearances: number; failures: number; returnedLoans: number; oldOpenLoan: boolean }) {
  const steward = await makeUser(`steward.${coilId}@club.test`, "steward");
  const policy = await getCurrentPolicy(main);
  let clearanceId: string | null = null;
  for (let i = 0; i < clearances; i++) {
    // Two decisions at the same instant: the id tie-break decides which is the latest.
    const decidedAt = daysAgo(20 - Math.floor(i / 2));
    const row = await testDb.clearance.create({
      data: { coilId, policyId: policy.id, decidedById: steward.id, decidedAt, validUntil: new Date(decidedAt.getTime() + 90 * DAY), verdict: i % 3 === 2 ? "refused" : "cleared", ruleResultsJson: "[]", checklistJson: "{}" },
    });
    clearanceId = row.id;
  }
  for (let i = 0; i < failures; i++) {
    await testDb.failure.create({ data: { coilId, occurredAt: daysAgo(15 - i), mode: i % 2 ? "over_voltage" : "over_temperature", symptoms: `failure ${i}`, status: "closed", closedAt: daysAgo(14 - i) } });
  }
  if (clearanceId === null) return;
  if (oldOpenLoan) {
    await testDb.loan.create({ data: { coilId, clearanceId, borrower: "Still out", event: "Long loan", outAt: daysAgo(12), expectedBackAt: daysAgo(2) } });
  }
  for (let i = 0; i < returnedLoans; i++) {
    await testDb.loan.create({
      data: { coilId, clearanceId, borrower: `Borrower ${i}`, event: "Event", outAt: daysAgo(10 - i), expectedBackAt: daysAgo(9 - i), returnedAt: daysAgo(9 - i), returnCondition: "as lent" },
    });
  }
}

describe("the coil page's standing from the timeline's reads", () => {
  const cases = [
    { name: "nothing recorded", clearances: 0, failures: 0, returnedLoans: 0, oldOpenLoan: false },
    { name: "a few of each, a loan out", clearances: 3, failures: 1, returnedLoans: 1, oldOpenLoan: true },
    { name: "more of each than the timeline reads, the open loan older than the returned ones", clearances: 5, failures: 4, returnedLoans: 4, oldOpenLoan: true },
    { name: "more loans than read and none out", clearances: 2, failures: 3, returnedLoans: 4, oldOpenLoan: false },
  ];
  for (const { name, ...records } of cases) {
    it(`is the standing read on its own: ${name}`, async () => {
      const coil = await makeCleanCoil("CR-01", now);
      await addRecords(coil.id, records);
      const components = await testDb.component.findMany({ where: { coilId: coil.id }, orderBy: [{ installedAt: "asc" }, { id: "asc" }] });
      const own = await readCoilStanding(main, coil.id, components, now);
      // A timeline of 2 entries per kind holds less than everything in the larger cases (the fallbacks), of 25 everything.
      for (const limit of [2, 25]) {
        const timeline = await getCoilTimeline(main, coil.id, limit);
        expect(timeline.standingRecords).toBeDefined();
        expect(await readCoilStanding(main, coil.id, components, now, timeline.standingRecords!)).toEqual(own);
      }
      if (records.oldOpenLoan) expect(own.activeLoan?.borrower).toBe("Still out");
      if (records.clearances > 0) expect(own.clearance.clearanceId).not.toBeNull();
    });
  }

  it("another site's coil has no timeline records to hand on", async () => {
    const north = await createSite("north");
    const coil = await makeCleanCoil("CR-02", now, undefined, north.id);
    expect((await getCoilTimeline(main, coil.id)).standingRecords).toBeUndefined();
    expect((await getCoilTimeline(siteScope(north.id, null), coil.id)).standingRecords).toBeDefined();
  });
});

describe("the prediction table's running frequencies", () => {
  it("the raw read is the query API's answer: the coil's sessions with a running frequency, oldest first, id tie-break, at its site only", async () => {
    const coil = await makeCleanCoil("CR-03", now);
    const base = { coilId: coil.id, supplyVoltageV: 24, supplyCurrentA: 2, durationS: 600, ambientTempC: 21 };
    await testDb.runSession.createMany({
      data: Array.from({ length: 8 }, (_, i) => ({ ...base, startedAt: daysAgo(3 - Math.floor(i / 2)), runningFrequencyHz: i % 3 === 0 ? null : 290_000 + i })),
    });
    const expected = await testDb.runSession.findMany({
      where: { runningFrequencyHz: { not: null }, coil: { siteId: DEFAULT_SITE_ID }, coilId: coil.id },
      select: { id: true, coilId: true, startedAt: true, topLoadId: true, runningFrequencyHz: true },
      orderBy: [{ startedAt: "asc" }, { id: "asc" }],
    });
    const read = await readRunningFrequencies(main, coil.id);
    expect(read).toEqual(expected);
    expect(read).toHaveLength(10);
    expect(read[0]!.startedAt).toBeInstanceOf(Date);
    const north = await createSite("north");
    expect(await readRunningFrequencies(siteScope(north.id, null), coil.id)).toEqual([]);
  });

  it("taken from the page's health window when it holds every session, read otherwise: the same comparison", async () => {
    const coil = await makeCleanCoil("CR-04", now);
    const page = (await readCoilPage(main, "CR-04"))!;
    const count = page.timeline.counts!.sessions;
    expect(count).toBe(page.history.sessions.length);
    const read = await readCoilComparison(main, page.history);
    expect(await readCoilComparison(main, page.history, count)).toEqual(read);
    // A count that says the window is not the whole logbook: read, the same answer.
    expect(await readCoilComparison(main, page.history, count + 1)).toEqual(read);
    expect(read.rows.length).toBeGreaterThan(0);
    expect(coil.id).toBe(page.coil.id);
  });
});
