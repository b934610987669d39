/**
 * storeCoilFigures writes the per-coil summary with one raw conditional UPDATE a coil (lib/db/coil-summary.ts says
 * why). Here each stored row is compared with the row the query API's `updateMany` stores for the same figures —
 * every column, types included (dates as Date, nulls as null) — on SQLite and PostgreSQL alike; and the conditions
 * are checked: a revision moved since the read, or a coil of another site, stores nothing.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { computeFiguresFor, storeCoilFigures, type ComputedFigures } from "@/lib/db/coil-summary";
import { getCurrentPolicy } from "@/lib/db/policy";

const now = new Date("2026-11-30T12:00:00.123Z");
const main = mainScope(null);

/** The same conditional update through the query API, as storeCoilFigures did before it went raw. */
async function storeThroughQueryApi({ coilId, fromRevision, figures }: ComputedFigures, policyVersion: number, computedAt: Date): Promise<number> {
  const { count } = await testDb.coilSummary.updateMany({
    where: { coilId, revision: fromRevision, coil: { siteId: main.siteId } },
    data: {
      computedRevision: fromRevision,
      policyVersion,
      computedAt,
      validUntil: figures.validUntil,
      health: figures.health,
      reasonsJson: JSON.stringify(figures.reasons),
      latestMarginsJson: JSON.stringify(figures.latestMargins),
      headroomTrendJson: JSON.stringify(figures.headroomTrend),
      sessionCount: figures.sessionCount,
      totalRunS: figures.totalRunS,
      lastSessionAt: figures.lastSessionAt,
      lastSweepAt: figures.lastSweepAt,
    },
  });
  return count;
}

const summaryRow = (coilId: string) => testDb.coilSummary.findUniqueOrThrow({ where: { coilId } });

async function clearSummary(coilId: string, revision: number) {
  await testDb.coilSummary.upsert({
    where: { coilId },
    create: { coilId, revision },
    update: { revision, computedRevision: null, policyVersion: null, computedAt: null, validUntil: null, health: null, reasonsJson: null, latestMarginsJson: null, headroomTrendJson: null, sessionCount: 0, totalRunS: 0, lastSessionAt: null, lastSweepAt: null },
  });
}

describe("storeCoilFigures (raw) against the query API's conditional update", () => {
  beforeEach(resetDatabase);

  it("stores the same row, column for column, for coils with and without sessions", async () => {
    const busy = await makeCleanCoil("ST-01", now);
    const bare = await testDb.coil.create({ data: { siteId: main.siteId, tag: "ST-02", name: "No sessions yet", builderName: "Test", formDiameterM: 0.05, windingLengthM: 0.2, turns: 900, wireDiameterM: 0.0002 } });
    const policy = await getCurrentPolicy(main);
    for (const coil of [busy, bare]) {
      await clearSummary(coil.id, 3);
      const [computed] = await computeFiguresFor(main, [coil.id], new Map([[coil.id, 3]]), policy, now);
      expect(computed, coil.tag).toBeDefined();

      expect(await storeCoilFigures(main, [computed!], policy.version, now)).toEqual([coil.id]);
      const raw = await summaryRow(coil.id);
      await clearSummary(coil.id, 3);
      expect(await storeThroughQueryApi(computed!, policy.version, now)).toBe(1);
      const queryApi = await summaryRow(coil.id);

      expect(raw).toEqual(queryApi);
      expect(raw.computedAt).toBeInstanceOf(Date);
      expect(raw.computedAt!.getTime()).toBe(now.getTime());
    }
    // The busy coil's figures carry dates and numbers; the bare one's nulls: both kinds went through.
    const busyRow = await summaryRow(busy.id);
    expect(busyRow.lastSessionAt).toBeInstanceOf(Date);
    expect(busyRow.sessionCount).toBe(5);
    expect((await summaryRow(bare.id)).lastSessionAt).toBeNull();
  });

  it("stores nothing where the revision moved since it was read, and says which coils it stored", async () => {
    const moved = await makeCleanCoil("ST-03", now);
    const still = await makeCleanCoil("ST-04", now);
    const policy = await getCurrentPolicy(main);
    await clearSummary(moved.id, 1);
    await clearSummary(still.id, 1);
    const computed = await computeFiguresFor(main, [moved.id, still.id], new Map([[moved.id, 1], [still.id, 1]]), policy, now);
    // A write lands between the read and the store.
    await testDb.coilSummary.update({ where: { coilId: moved.id }, data: { revision: 2 } });

    expect(await storeCoilFigures(main, computed, policy.version, now)).toEqual([still.id]);
    const movedRow = await summaryRow(moved.id);
    expect(movedRow.computedRevision).toBeNull();
    expect(movedRow.health).toBeNull();
    expect((await summaryRow(still.id)).computedRevision).toBe(1);
  });

  it("never stores into another site's coil, even when handed its id", async () => {
    const north = await createSite("north");
    const theirs = await makeCleanCoil("ST-05", now, undefined, north.id);
    const policy = await getCurrentPolicy(siteScope(north.id, null));
    await clearSummary(theirs.id, 1);
    const [computed] = await computeFiguresFor(siteScope(north.id, null), [theirs.id], new Map([[theirs.id, 1]]), policy, now);

    expect(await storeCoilFigures(main, [computed!], policy.version, now)).toEqual([]);
    expect((await summaryRow(theirs.id)).health).toBeNull();
    expect(await storeCoilFigures(siteScope(north.id, null), [computed!], policy.version, now)).toEqual([theirs.id]);
    expect((await summaryRow(theirs.id)).health).toBe(computed!.figures.health);
  });

  it("computes the same figures batch by batch as coil by coil, in the listed order, leaving another site's coil out", async () => {
    const north = await createSite("batch-north");
    const coils = [];
    for (const tag of ["BT-03", "BT-01", "BT-05", "BT-02", "BT-04"]) coils.push(await makeCleanCoil(tag, now));
    const theirs = await makeCleanCoil("BT-09", now, undefined, north.id);
    const policy = await getCurrentPolicy(main);
    const ids = [...coils.map((c) => c.id), theirs.id];
    const revisions = new Map(ids.map((id, i) => [id, i]));
    const oneByOne = (await Promise.all(coils.map((c) => computeFiguresFor(main, [c.id], revisions, policy, now)))).flat();
    expect(oneByOne).toHaveLength(coils.length);
    // Batches of two: the listed order batch by batch, by tag within a batch.
    const byTwo = await computeFiguresFor(main, ids, revisions, policy, now, { batchCoils: 2 });
    expect(byTwo.map((c) => c.coilId)).toEqual([coils[1]!.id, coils[0]!.id, coils[3]!.id, coils[2]!.id, coils[4]!.id]);
    expect([...byTwo].sort((a, b) => (a.coilId < b.coilId ? -1 : 1))).toEqual([...oneByOne].sort((a, b) => (a.coilId < b.coilId ? -1 : 1)));
    // One batch for all: the same figures, by tag.
    const whole = await computeFiguresFor(main, ids, revisions, policy, now);
    expect(whole.map((c) => c.coilId)).toEqual([...coils].sort((a, b) => (a.tag < b.tag ? -1 : 1)).map((c) => c.id));
    expect([...whole].sort((a, b) => (a.coilId < b.coilId ? -1 : 1))).toEqual([...oneByOne].sort((a, b) => (a.coilId < b.coilId ? -1 : 1)));
  });
});
