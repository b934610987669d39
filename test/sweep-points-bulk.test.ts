/** recordSweep's bulk point insert (one JSON parameter per chunk, lib/db/sweeps.ts) stores every double exactly and in order. */
import { beforeEach, expect, it } from "vitest";
import { mainScope, makeUser, resetDatabase, testDb } from "./support/db";
import { recordSweep } from "@/lib/db/sweeps";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import { createLineModel, simulateSweep } from "@/lib/calc/line-model";
import { createSeededRandom } from "@/lib/calc/seeded-random";

beforeEach(resetDatabase);

it("stores 45 000 points bit for bit, across chunks, in the order given", async () => {
  const member = await makeUser("m@club.test", "member");
  const coil = await testDb.coil.create({
    data: { siteId: DEFAULT_SITE_ID, tag: "BK-01", name: "Bulk", builderName: "Tester", formDiameterM: 0.05, windingLengthM: 0.2, turns: 880, wireDiameterM: 0.000202 },
  });
  const model = createLineModel({ firstSeriesResonance: 420_000, characteristicImpedance: 60_000, topCapacitance: 8e-12, dispersionExponent: 0.12, q: 90 });
  // Irrational-looking frequencies (not rounded) so any loss of precision in the JSON route would show.
  const frequencies = Array.from({ length: 45_000 }, (_, i) => 210_000 * 8 ** (i / 44_999));
  const points = simulateSweep({ model, seriesResistance: 22_000, sourceAmplitude: 20, frequencies, noise: { relative: 0.005 }, rng: createSeededRandom(3) }).map((p) => ({
    frequencyHz: p.frequency,
    amplitudeV: Math.min(p.amplitude, 19.9),
  }));
  const sweep = await recordSweep(
    mainScope(member.id),
    { coilId: coil.id, topLoadId: null, takenAt: new Date("2025-03-01T14:30:00Z"), seriesResistanceOhm: 22_000, sourceAmplitudeV: 20, amplitudeConvention: "peak_to_peak", environmentNotes: "", notes: "", points },
    "import",
  );
  const stored = await testDb.sweepPoint.findMany({ where: { sweepId: sweep.id }, orderBy: { id: "asc" }, select: { frequencyHz: true, amplitudeV: true } });
  expect(stored).toHaveLength(points.length);
  expect(stored).toEqual(points);
});
