import { beforeAll, describe, expect, it } from "vitest";
import { mainScope, resetDatabase, siteScope, testDb } from "./support/db";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { readCoilPage } from "@/lib/db/coil-page";
import { readCoilComparison, readFleetPredictionInputs } from "@/lib/db/prediction-history";
import { assessPredictionQuality } from "@/lib/analysis/prediction-quality";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";

beforeAll(async () => {
  await resetDatabase();
  // Passwords are not exercised here, so one placeholder hash serves every demo person.
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
}, 60_000); // generating and loading the whole demo club takes a few seconds, more on a busy machine

/** Every demo coil's prediction table, each read as its own site reads it. */
async function demoComparisons() {
  const coils = await testDb.coil.findMany({ select: { tag: true, siteId: true }, orderBy: [{ siteId: "asc" }, { tag: "asc" }] });
  return Promise.all(
    coils.map(async ({ tag, siteId }) => {
      const scope = siteScope(siteId, null);
      const records = (await readCoilPage(scope, tag))!;
      return { tag, comparison: await readCoilComparison(scope, records.history) };
    }),
  );
}

describe("the demo club's predictions", () => {
  it("never calibrates a coil's first-resonance prediction on the sweep it is compared with", async () => {
    const all = await demoComparisons();
    expect(all.length).toBeGreaterThan(3);
    let calibratedCount = 0;
    for (const { tag, comparison } of all) {
      const row = comparison.rows.find((r) => r.key === "calibrated")!;
      if (row.comparison === null) {
        expect(row.note, tag).toBeTruthy();
        continue;
      }
      calibratedCount++;
      const compared = comparison.comparedSweep!;
      expect(comparison.calibrated!.fittedOn.length, tag).toBeGreaterThan(0);
      for (const fitted of comparison.calibrated!.fittedOn) {
        expect(fitted.id, tag).not.toBe(compared.id);
        expect(fitted.takenAt.getTime(), tag).toBeLessThan(compared.takenAt.getTime());
      }
    }
    expect(calibratedCount).toBeGreaterThan(0);
    // Sweeps of a coil move with its surroundings, so an honest out-of-sample deviation is not zero.
    const deviations = all.flatMap(({ comparison }) => comparison.rows.filter((r) => r.key === "calibrated" && r.comparison).map((r) => Math.abs(r.comparison!.deviation)));
    expect(Math.max(...deviations)).toBeGreaterThan(0.002);
  });

  it("shows every coil a geometry-only prediction with its band", async () => {
    for (const { tag, comparison } of await demoComparisons()) {
      const row = comparison.rows.find((r) => r.key === "geometryOnly")!;
      expect(row.predicted, tag).toBeGreaterThan(0);
      expect(row.band!.low, tag).toBeLessThan(row.predicted!);
      expect(row.band!.high, tag).toBeGreaterThan(row.predicted!);
    }
  });

  it("records where each sweep was taken, and a coil's sweeps with one top load move by a percent or more", async () => {
    const sweeps = await testDb.sweep.findMany({ select: { coilId: true, topLoadId: true, firstSeriesResonanceHz: true, environmentNotes: true } });
    expect(new Set(sweeps.map((s) => s.environmentNotes)).size).toBeGreaterThan(2);
    const groups = new Map<string, number[]>();
    for (const s of sweeps) groups.set(`${s.coilId}/${s.topLoadId}`, [...(groups.get(`${s.coilId}/${s.topLoadId}`) ?? []), s.firstSeriesResonanceHz!]);
    const ranges = [...groups.values()].filter((f) => f.length >= 3).map((f) => Math.max(...f) / Math.min(...f) - 1);
    expect(ranges.length).toBeGreaterThan(0);
    expect(Math.max(...ranges)).toBeGreaterThan(0.01);
  });

  it("sums up every model's out-of-sample deviations for the fleet page", async () => {
    // The demo club's own site.
    const { summaries } = assessPredictionQuality(await readFleetPredictionInputs(mainScope(null)));
    for (const model of ["geometryOnly", "calibrated", "runningFrequency"] as const) {
      expect(summaries[model]?.count, model).toBeGreaterThan(0);
      expect(summaries[model]!.lowerQuartile).toBeLessThanOrEqual(summaries[model]!.upperQuartile);
    }
    // Running frequencies sit a few per cent above the sweeps; learnt from earlier sessions, the prediction lands within 5 % for most.
    expect(Math.abs(summaries.runningFrequency!.median)).toBeLessThan(0.05);
    // The calibrated model, fitted on the coil's own earlier sweeps, scatters less than geometry alone.
    const spread = (s: { lowerQuartile: number; upperQuartile: number }) => s.upperQuartile - s.lowerQuartile;
    expect(spread(summaries.calibrated!)).toBeLessThan(spread(summaries.geometryOnly!));
  });
});
