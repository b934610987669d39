import { describe, expect, it } from "vitest";
import { compareCoil } from "./coil-comparison";
import { compareWithPrediction } from "./sweep-report";
import { findCurrentTopLoad, findCurrentTopLoadId, findLatestSweepWithCurrentTopLoad } from "./current-top-load";
import { topLoadSpecOf } from "./top-load-spec";

const coil = { topology: "single_switch" as const, formDiameterM: 0.075, windingLengthM: 0.2, turns: 600, wireDiameterM: 0.00032, environmentCapacitanceF: 1e-12, measuredInductanceH: null };
const toroid = { id: "t1", name: "Toroid", shape: "toroid" as const, diameterM: 0.15, tubeDiameterM: 0.04, heightM: null, measuredCapacitanceF: null, retiredAt: null };
const day = (d: number) => new Date(Date.UTC(2025, 0, d));
const session = (id: string, d: number, runningFrequencyHz: number | null, topLoadId: string | null = "t1") => ({
  id, startedAt: day(d), topLoadId, supplyVoltageV: 24, supplyCurrentA: 2, durationS: 60, ambientTempC: 20, heatSinkStartC: null, heatSinkEndC: null, runningFrequencyHz, peakSwitchVoltageV: null, dutyCycle: null, outcome: "normal" as const,
});
const row = (result: ReturnType<typeof compareCoil>, key: string) => result.rows.find((r) => r.key === key)!;

describe("compareCoil", () => {
  const sweeps = [
    { id: "w0", takenAt: day(1), topLoadId: null, firstSeriesResonanceHz: 900e3 },
    { id: "w1", takenAt: day(2), topLoadId: "t1", firstSeriesResonanceHz: 400e3 },
    { id: "w2", takenAt: day(6), topLoadId: "t1", firstSeriesResonanceHz: 396e3 },
  ];

  it("calibrates the compared sweep's prediction only on the sweeps before it (Stone 1974 cross-validation)", () => {
    const result = compareCoil(coil, [toroid], sweeps, []);
    expect(result.comparedSweep?.id).toBe("w2");
    expect(result.calibrated?.fittedOn.map((s) => s.id)).toEqual(["w0", "w1"]);
    expect(result.calibrated!.fittedOn.every((s) => s.takenAt < result.comparedSweep!.takenAt)).toBe(true);
    expect(row(result, "calibrated").comparison!.deviation).not.toBe(0);
  });

  it("says there is nothing to calibrate on when the compared sweep is the coil's first", () => {
    const result = compareCoil(coil, [toroid], [sweeps[1]!], []);
    expect(result.calibrated).toBeNull();
    expect(row(result, "calibrated")).toMatchObject({ predicted: null, comparison: null, note: expect.stringMatching(/nothing to calibrate on yet/) });
  });

  it("shows the geometry-only prediction with a band that holds its nominal", () => {
    const geometry = row(compareCoil(coil, [toroid], sweeps, []), "geometryOnly");
    expect(geometry.measured).toBe(396e3);
    expect(geometry.band!.low).toBeLessThan(geometry.predicted!);
    expect(geometry.band!.high).toBeGreaterThan(geometry.predicted!);
    expect(geometry.basis).toMatch(/JCGM 100:2008/);
  });

  it("predicts the running frequency from the sweep before the session and the offset of the sessions before it", () => {
    // Offsets of +3 % and +5 % before day 8 (each over the latest earlier sweep with the same top load): mean 1.04.
    const sessions = [session("s1", 3, 412e3), session("s2", 7, 396e3 * 1.05), session("s3", 8, 410e3)];
    const running = row(compareCoil(coil, [toroid], sweeps, sessions), "runningFrequency");
    expect(running.predicted).toBeCloseTo(396e3 * 1.04, 0);
    expect(running.measured).toBe(410e3);
    expect(running.basis).toMatch(/own earlier sessions/);
  });

  it("falls back on the prior with no earlier session, and on nothing without an earlier sweep", () => {
    const prior = row(compareCoil(coil, [toroid], sweeps, [session("s1", 3, 412e3)]), "runningFrequency");
    expect(prior.predicted).toBeCloseTo(400e3, 6);
    expect(prior.basis).toMatch(/common-practice prior/);
    const early = row(compareCoil(coil, [toroid], sweeps, [session("s0", 1, 412e3)]), "runningFrequency");
    expect(early).toMatchObject({ predicted: null, note: expect.stringMatching(/no sweep/) });
  });

  it("says why there is no prediction when the build cannot be modelled", () => {
    const result = compareCoil({ ...coil, turns: 5000 }, [], [], []);
    expect(result.prediction).toBeNull();
    expect(result.geometryOnly).toBeNull();
    expect(result.predictionProblem).toMatch(/cannot run/);
  });

  it("predicts the same resonance for the same toroid as the sweep page (one top-load mapping, one current-top-load rule)", () => {
    const measured = { ...toroid, measuredCapacitanceF: 9e-12 };
    const coilPage = compareCoil(coil, [measured], sweeps, []);
    const calibrationSweeps = sweeps.map((s) => ({ ...s, topLoad: s.topLoadId ? measured : null }));
    const sweepPage = compareWithPrediction(coil, measured, sweeps[2]!, calibrationSweeps);
    if (!sweepPage.ok || !sweepPage.calibrated.ok) throw new Error("the sweep page should predict");
    expect(row(coilPage, "geometryOnly").predicted).toBe(sweepPage.geometryOnly.predictedHz);
    expect(row(coilPage, "calibrated").predicted).toBe(sweepPage.calibrated.predictedHz);
  });
});

describe("the one top-load mapping and current-top-load rule", () => {
  it("prefers a measured capacitance to the shape formula for any shape", () => {
    expect(topLoadSpecOf({ ...toroid, measuredCapacitanceF: 9e-12 })).toEqual({ capacitance: 9e-12 });
    expect(topLoadSpecOf({ ...toroid, shape: "measured", measuredCapacitanceF: 9e-12 })).toEqual({ capacitance: 9e-12 });
    expect(topLoadSpecOf({ ...toroid, shape: "none" })).toBeNull();
  });

  it("takes the latest record naming a top load; a session without one does not count, a retired one yields to the newest in service", () => {
    const sweeps = [{ takenAt: day(1), topLoadId: "t1" }];
    expect(findCurrentTopLoadId(sweeps, [{ startedAt: day(2), topLoadId: "t2" }])).toBe("t2");
    expect(findCurrentTopLoadId(sweeps, [{ startedAt: day(2), topLoadId: null }])).toBe("t1");
    const retired = { ...toroid, retiredAt: day(3) };
    const ball = { ...toroid, id: "t2", shape: "sphere" as const };
    expect(findCurrentTopLoad([retired, ball], sweeps, [])?.id).toBe("t2");
    const withSweeps = [
      { id: "a", takenAt: day(1), topLoadId: "t1" },
      { id: "b", takenAt: day(2), topLoadId: "t2" },
    ];
    expect(findLatestSweepWithCurrentTopLoad(withSweeps, [{ startedAt: day(3), topLoadId: "t1" }])?.id).toBe("a");
  });
});
