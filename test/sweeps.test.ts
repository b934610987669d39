import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { getCoilForSweepEntry, getSweep, listCalibrationSweeps, listSweeps, recordSweep, SweepRefusedError } from "@/lib/db/sweeps";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import { createLineModel, simulateSweep } from "@/lib/calc/line-model";
import { createSeededRandom } from "@/lib/calc/seeded-random";
import { detectSweepCsvLayout, readSweepCsv } from "@/lib/import/sweep-csv";
import type { SweepRecordInput } from "@/lib/validation/sweep";

beforeEach(resetDatabase);

const FIRST_RESONANCE_HZ = 420_000;

/** Invented readings: a lossy-line coil with its first series resonance at 420 kHz, through 22 kΩ from 20 V. */
function simulatedPoints(first = FIRST_RESONANCE_HZ, count = 400) {
  const model = createLineModel({ firstSeriesResonance: first, characteristicImpedance: 60_000, topCapacitance: 8e-12, dispersionExponent: 0.12, q: 90 });
  const frequencies = Array.from({ length: count }, (_, i) => Math.round(first * 0.5 * 8 ** (i / (count - 1))));
  return simulateSweep({ model, seriesResistance: 22_000, sourceAmplitude: 20, frequencies, noise: { relative: 0.005 }, rng: createSeededRandom(7) }).map((p) => ({
    frequencyHz: p.frequency,
    amplitudeV: Math.min(p.amplitude, 19.9),
  }));
}

async function makeCoil(siteId: string = DEFAULT_SITE_ID) {
  return testDb.coil.create({
    data: {
      siteId,
      tag: "TS-01",
      name: "Test Spire",
      builderName: "Tester",
      formDiameterM: 0.05,
      windingLengthM: 0.2,
      turns: 880,
      wireDiameterM: 0.000202,
      topLoads: { create: [{ name: "Ducting toroid", shape: "toroid", diameterM: 0.15, tubeDiameterM: 0.04 }] },
    },
    include: { topLoads: true },
  });
}

function sweepInput(coilId: string, topLoadId: string | null, points = simulatedPoints()): SweepRecordInput {
  return {
    coilId,
    topLoadId,
    takenAt: new Date("2025-03-01T14:30:00Z"),
    seriesResistanceOhm: 22_000,
    sourceAmplitudeV: 20,
    amplitudeConvention: "peak_to_peak",
    environmentNotes: "Bench, 1 m from the wall",
    notes: "",
    points,
  };
}

describe("recording a sweep", () => {
  it("stores the sweep, its points, its resonances, recalibrates the coil and audits, all together", async () => {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    const recorded = await recordSweep(mainScope(member.id), sweepInput(coil.id, coil.topLoads[0]!.id));
    expect(recorded.firstSeriesResonanceHz).toBeGreaterThan(FIRST_RESONANCE_HZ * 0.98);
    expect(recorded.firstSeriesResonanceHz).toBeLessThan(FIRST_RESONANCE_HZ * 1.02);
    const sweep = await testDb.sweep.findUniqueOrThrow({ where: { id: recorded.id }, include: { resonances: true, _count: { select: { points: true } } } });
    expect(sweep.pointCount).toBe(400);
    expect(sweep._count.points).toBe(400);
    expect(sweep.takenById).toBe(member.id);
    expect(sweep.resonances.filter((r) => r.kind === "series").length).toBeGreaterThanOrEqual(1);
    expect(sweep.resonances.filter((r) => r.kind === "parallel").length).toBeGreaterThanOrEqual(1);
    // each fitted frequency is stored with its standard error, a small fraction of the frequency
    const firstSeries = sweep.resonances.find((r) => r.kind === "series" && r.ordinal === 1)!;
    expect(firstSeries.frequencyStandardErrorHz).toBeGreaterThan(0);
    expect(firstSeries.frequencyStandardErrorHz!).toBeLessThan(0.01 * firstSeries.frequencyHz);
    const after = await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } });
    expect(after.environmentCapacitanceF).not.toBeNull();
    expect(after.environmentCalibratedAt).not.toBeNull();
    const audit = await testDb.auditEvent.findMany({ where: { entity: "Sweep", entityId: recorded.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.action).toBe("create");
    expect(audit[0]!).toMatchObject({ siteId: DEFAULT_SITE_ID, actorId: member.id });
  });

  it("recalibrates over all the coil's sweeps: a second, lower sweep moves the calibration", async () => {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    await recordSweep(mainScope(member.id), sweepInput(coil.id, coil.topLoads[0]!.id));
    const once = (await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).environmentCapacitanceF!;
    await recordSweep(mainScope(member.id), sweepInput(coil.id, coil.topLoads[0]!.id, simulatedPoints(380_000)), "import");
    const twice = (await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).environmentCapacitanceF!;
    // A lower resonance with the same top load means more capacitance; the median of two is their mean.
    expect(twice).toBeGreaterThan(once);
    expect(await testDb.auditEvent.count({ where: { action: "import", entity: "Sweep" } })).toBe(1);
  });

  it("imports a 100 000-point sweep in one transaction", async () => {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    const recorded = await recordSweep(mainScope(member.id), sweepInput(coil.id, null, simulatedPoints(FIRST_RESONANCE_HZ, 100_000).filter((p, i, all) => i === 0 || p.frequencyHz !== all[i - 1]!.frequencyHz)), "import");
    expect(await testDb.sweepPoint.count({ where: { sweepId: recorded.id } })).toBeGreaterThan(90_000);
  }, 60_000);

  it("refuses a reading above the source amplitude by its row, and stores nothing", async () => {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    const points = simulatedPoints();
    points[13] = { ...points[13]!, amplitudeV: 25 };
    const refusal = await recordSweep(mainScope(member.id), sweepInput(coil.id, null, points)).catch((e: unknown) => e);
    expect(refusal).toBeInstanceOf(SweepRefusedError);
    expect((refusal as SweepRefusedError).field).toBe("points.13.amplitude");
    expect((refusal as SweepRefusedError).message).toMatch(/^Reading 14, amplitude: expected a reading above 0 V and below the source amplitude 20 V/);
    expect(await testDb.sweep.count()).toBe(0);
    expect(await testDb.sweepPoint.count()).toBe(0);
    expect(await testDb.auditEvent.count()).toBe(0);
    expect((await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).environmentCapacitanceF).toBeNull();
  });

  it("refuses another coil's top load and rolls everything back", async () => {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    const other = await testDb.coil.create({
      data: { siteId: DEFAULT_SITE_ID, tag: "TS-02", name: "Other", builderName: "T", formDiameterM: 0.05, windingLengthM: 0.2, turns: 880, wireDiameterM: 0.000202, topLoads: { create: [{ name: "Ball", shape: "sphere", diameterM: 0.05 }] } },
      include: { topLoads: true },
    });
    await expect(recordSweep(mainScope(member.id), sweepInput(coil.id, other.topLoads[0]!.id))).rejects.toMatchObject({ field: "topLoadId" });
    expect(await testDb.sweep.count()).toBe(0);
    expect(await testDb.sweepPoint.count()).toBe(0);
  });

  it("a bad CSV is refused with its row and column before anything reaches the database", async () => {
    await makeUser("m@club.test", "member");
    await makeCoil();
    const rows = ["Freq (kHz),Vout (V)", ...simulatedPoints().map((p) => `${p.frequencyHz / 1000},${p.amplitudeV}`)];
    rows[14] = "3.2.1,1.5";
    const text = rows.join("\n");
    const layout = detectSweepCsvLayout(text);
    const result = readSweepCsv(text, layout, layout.suggested);
    expect(result).toMatchObject({ ok: false, error: { message: "Row 15, column 'Freq (kHz)': expected a number, got '3.2.1'" } });
    expect(await testDb.sweep.count()).toBe(0);
  });
});

describe("a second site", () => {
  async function twoSites() {
    const member = await makeUser("m@club.test", "member");
    const coil = await makeCoil();
    const recorded = await recordSweep(mainScope(member.id), sweepInput(coil.id, coil.topLoads[0]!.id));
    const north = await createSite("north");
    const northMember = await makeUser("n@north.test", "member", "Nell North", north.id);
    return { coil, recorded, north: siteScope(north.id, northMember.id), northSiteId: north.id };
  }

  it("cannot read, list, search or calibrate from the first site's sweeps", async () => {
    const { coil, recorded, north } = await twoSites();
    expect(await getSweep(north, recorded.id)).toBeNull();
    expect(await getSweep(mainScope(null), recorded.id)).not.toBeNull();
    for (const filter of [{}, { q: "TS-01" }, { q: "Test Spire" }, { q: "Ducting" }, { coilTag: "TS-01" }]) {
      expect((await listSweeps(north, filter)).total).toBe(0);
      expect((await listSweeps(mainScope(null), filter)).total).toBe(1);
    }
    expect(await listCalibrationSweeps(north, coil.id)).toEqual([]);
    expect(await listCalibrationSweeps(mainScope(null), coil.id)).toHaveLength(1);
    expect(await getCoilForSweepEntry(north, "TS-01")).toBeNull();
  });

  it("cannot record a sweep on the first site's coil: refused as a coil that does not exist, and nothing stored", async () => {
    const { coil, north } = await twoSites();
    const before = { sweeps: await testDb.sweep.count(), points: await testDb.sweepPoint.count(), audits: await testDb.auditEvent.count() };
    const calibrated = (await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).environmentCapacitanceF;
    const otherSite = await recordSweep(north, sweepInput(coil.id, coil.topLoads[0]!.id)).catch((e: unknown) => e);
    const missing = await recordSweep(north, sweepInput("no-such-coil", null)).catch((e: unknown) => e);
    expect(otherSite).toBeInstanceOf(SweepRefusedError);
    expect(otherSite).toMatchObject({ field: "coilId", message: (missing as Error).message });
    expect({ sweeps: await testDb.sweep.count(), points: await testDb.sweepPoint.count(), audits: await testDb.auditEvent.count() }).toEqual(before);
    expect((await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).environmentCapacitanceF).toBe(calibrated);
  });

  it("keeps its own coil under the same tag apart: each site lists, opens and records only its own", async () => {
    const { coil, recorded, north, northSiteId } = await twoSites();
    const northCoil = await makeCoil(northSiteId);
    expect((await getCoilForSweepEntry(north, "TS-01"))!.id).toBe(northCoil.id);
    expect((await getCoilForSweepEntry(mainScope(null), "TS-01"))!.id).toBe(coil.id);
    const northSweep = await recordSweep(north, sweepInput(northCoil.id, northCoil.topLoads[0]!.id, simulatedPoints(380_000)));
    // The first site's top load is not one of the second site's coil's, whatever the tag.
    await expect(recordSweep(north, sweepInput(northCoil.id, coil.topLoads[0]!.id))).rejects.toMatchObject({ field: "topLoadId" });
    expect((await listSweeps(north, { coilTag: "TS-01" })).rows.map((r) => r.id)).toEqual([northSweep.id]);
    expect((await listSweeps(mainScope(null), { coilTag: "TS-01" })).rows.map((r) => r.id)).toEqual([recorded.id]);
    expect(await getSweep(mainScope(null), northSweep.id)).toBeNull();
    const audit = await testDb.auditEvent.findFirstOrThrow({ where: { entity: "Sweep", entityId: northSweep.id } });
    expect(audit).toMatchObject({ siteId: northSiteId, actorId: north.actorId });
    // Recalibrating one site's coil leaves the other's as it was.
    const [mainAfter, northAfter] = await Promise.all([coil.id, northCoil.id].map((id) => testDb.coil.findUniqueOrThrow({ where: { id } })));
    expect(northAfter!.environmentCapacitanceF).not.toBe(mainAfter!.environmentCapacitanceF);
  });
});
