/**
 * The coil page band's own reads (lib/db/coil-standing.ts, lib/db/sweep-thumbnail.ts) are raw SQL, so they are
 * checked here against an independent answer on both databases: the standing against the dashboard's row for the
 * same coil (the same clearance state and loan), the sweep's points against the query API's.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { makeUser, resetDatabase, mainScope, testDb } from "./support/db";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import { signClearance } from "@/lib/db/clearances";
import { createLoan } from "@/lib/db/loans";
import { getFleetOverview } from "@/lib/db/fleet";
import { readCoilStanding } from "@/lib/db/coil-standing";
import { readSweepThumbnail, THUMBNAIL_BUCKETS, THUMBNAIL_FULL_READ_MAX } from "@/lib/db/sweep-thumbnail";
import { plotSweepThumbnail } from "@/lib/analysis/sweep-thumbnail";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";

beforeEach(resetDatabase);

const DAY = 86_400_000;
const scope = mainScope(null);

describe("the coil page band's reads", () => {
  it("a coil's standing is the dashboard's clearance and loan for it: none, then cleared, then out", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("GL-01", now);
    const standingNow = async () => readCoilStanding(scope, coil.id, await testDb.component.findMany({ where: { coilId: coil.id }, orderBy: [{ installedAt: "asc" }, { id: "asc" }] }), now);
    const dashboardRow = async () => (await getFleetOverview(scope, now)).find((r) => r.id === coil.id)!;

    let standing = await standingNow();
    expect(standing.clearance.kind).toBe("none");
    expect(standing.activeLoan).toBeNull();

    await signClearance(mainScope(steward.id), clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "cleared", checklist: ALL_YES }), new Date(now.getTime() - 1000));
    await createLoan(mainScope(steward.id), { coilId: coil.id, borrower: "Riverside Library", borrowerContact: "", event: "Family science morning", expectedBackAt: new Date(now.getTime() + 3 * DAY) }, new Date(now.getTime() - 500));
    standing = await standingNow();
    const row = await dashboardRow();
    expect(standing.clearance.kind).toBe("valid");
    expect(standing.clearance).toEqual(row.clearance);
    // The dashboard's loan row also names its coil; the coil page knows which coil it is on.
    const { coilId: _coilId, ...dashboardLoan } = row.activeLoan as NonNullable<typeof row.activeLoan> & { coilId: string };
    expect(standing.activeLoan).toEqual(dashboardLoan);
    expect(standing.activeLoan!.borrower).toBe("Riverside Library");
  });

  it("reads only the one sweep's points, in frequency order, as the query API does; a missing sweep is null", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("GL-02", now);
    const sweep = await testDb.sweep.findFirstOrThrow({ where: { coilId: coil.id } });
    const other = await testDb.sweep.create({ data: { coilId: coil.id, takenAt: now, seriesResistanceOhm: 10_000, sourceAmplitudeV: 10 } });
    // Stored out of order, and a point of another sweep that must not be read.
    await testDb.sweepPoint.createMany({
      data: [
        { sweepId: sweep.id, frequencyHz: 300_000, amplitudeV: 9 },
        { sweepId: sweep.id, frequencyHz: 100_000, amplitudeV: 1 },
        { sweepId: sweep.id, frequencyHz: 200_000, amplitudeV: 0.2 },
        { sweepId: other.id, frequencyHz: 150_000, amplitudeV: 5 },
      ],
    });
    const read = (await readSweepThumbnail(scope, sweep.id))!;
    const expected = await testDb.sweepPoint.findMany({ where: { sweepId: sweep.id }, orderBy: [{ frequencyHz: "asc" }, { id: "asc" }], select: { frequencyHz: true, amplitudeV: true } });
    expect(read.points).toEqual(expected);
    expect(read).toMatchObject({ id: sweep.id, takenAt: sweep.takenAt, seriesResistanceOhm: 10_000, sourceAmplitudeV: 10 });
    expect(typeof read.points[0]!.frequencyHz).toBe("number");
    // Its picture spans the sweep's frequencies.
    const plot = plotSweepThumbnail(read);
    expect(plot.xRange![0]).toBeCloseTo(100_000, 6);
    expect(plot.xRange![1]).toBeCloseTo(300_000, 6);
    expect(await readSweepThumbnail(scope, "no-such-sweep")).toBeNull();
  });

  it("reads a long sweep already thinned by the database: its lowest and highest readings kept, a few hundred rows", async () => {
    const now = new Date();
    const coil = await makeCleanCoil("GL-03", now);
    const count = THUMBNAIL_FULL_READ_MAX * 5 + 7;
    const sweep = await testDb.sweep.create({ data: { coilId: coil.id, takenAt: now, seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, pointCount: count } });
    // A narrow dip and a narrow peak, one reading each, somewhere inside runs: a stride sample would lose them.
    const points = Array.from({ length: count }, (_, i) => ({ sweepId: sweep.id, frequencyHz: 100_000 + i * 10, amplitudeV: i === 3_333 ? 0.01 : i === 7_777 ? 9.9 : 5 }));
    await testDb.sweepPoint.createMany({ data: points });
    const read = (await readSweepThumbnail(scope, sweep.id))!;
    expect(read.points.length).toBeLessThanOrEqual(2 * THUMBNAIL_BUCKETS);
    expect(Math.min(...read.points.map((p) => p.amplitudeV))).toBe(0.01);
    expect(Math.max(...read.points.map((p) => p.amplitudeV))).toBe(9.9);
    const frequencies = read.points.map((p) => p.frequencyHz);
    expect(frequencies).toEqual([...frequencies].sort((a, b) => a - b));
    expect(frequencies[0]!).toBeLessThan(100_000 + 20 * count / THUMBNAIL_BUCKETS);
    expect(frequencies.at(-1)!).toBeGreaterThan(100_000 + 10 * count - 20 * count / THUMBNAIL_BUCKETS);
  });
});
