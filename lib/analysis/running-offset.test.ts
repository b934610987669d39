import { describe, expect, it } from "vitest";
import { checkAllRunningFrequencies, checkRunningFrequency, needsFleetObservations, pairFleetRunning, pairRunningWithSweeps } from "./running-offset";

const day = (d: number) => new Date(Date.UTC(2025, 0, d));
const sweeps = [
  { id: "w1", coilId: "a", takenAt: day(1), topLoadId: "t1", firstSeriesResonanceHz: 400e3 },
  { id: "w2", coilId: "a", takenAt: day(5), topLoadId: "t2", firstSeriesResonanceHz: 300e3 },
  { id: "v1", coilId: "b", takenAt: day(1), topLoadId: "u1", firstSeriesResonanceHz: 200e3 },
];
const sessions = [
  { id: "s0", coilId: "a", startedAt: day(1), topLoadId: "t1", runningFrequencyHz: 410e3 }, // same instant as w1: not after it
  { id: "s1", coilId: "a", startedAt: day(2), topLoadId: "t1", runningFrequencyHz: 412e3 },
  { id: "s2", coilId: "a", startedAt: day(6), topLoadId: "t1", runningFrequencyHz: 408e3 }, // latest t1 sweep is still w1
  { id: "s3", coilId: "a", startedAt: day(7), topLoadId: "t2", runningFrequencyHz: 309e3 },
  { id: "r1", coilId: "b", startedAt: day(3), topLoadId: "u1", runningFrequencyHz: 196e3 },
  { id: "r2", coilId: "b", startedAt: day(4), topLoadId: "u1", runningFrequencyHz: 198e3 },
];

describe("pairRunningWithSweeps", () => {
  it("pairs each session with the latest sweep strictly before it on the same top load", () => {
    const pairs = pairRunningWithSweeps(sessions.filter((s) => s.coilId === "a"), sweeps.filter((w) => w.coilId === "a"));
    expect(pairs.map((p) => [p.sessionId, p.sweepId])).toEqual([["s1", "w1"], ["s2", "w1"], ["s3", "w2"]]);
    expect(pairs[0]!.ratio).toBeCloseTo(1.03, 12);
  });
});

describe("checkRunningFrequency", () => {
  const fleet = pairFleetRunning(sweeps, sessions);
  const own = fleet.filter((o) => o.coilId === "a");

  it("learns only from observations before the session: the first of coil a falls back on coil b's earlier ones", () => {
    // Before day 2 neither coil has an observation: the common-practice prior (ratio 1).
    expect(checkRunningFrequency(own[0]!, own, fleet).prediction.offset.source).toBe("prior");
    // s3 (day 7): coil a's own s1 and s2 (ratios 1.03 and 1.02) are earlier, so the fleet is not read.
    const third = checkRunningFrequency(own[2]!, own, fleet);
    expect(third.prediction.offset).toMatchObject({ source: "coil", count: 2 });
    expect(third.prediction.frequency).toBeCloseTo(300e3 * 1.025, 6);
    expect(third.deviation).toBeCloseTo(309 / 307.5 - 1, 9);
    // s2 (day 6): one own observation; coil b's two (0.98 and 0.99) stand in, never coil a's own.
    const second = checkRunningFrequency(own[1]!, own, fleet);
    expect(second.prediction.offset).toMatchObject({ source: "fleet", count: 2 });
    expect(second.prediction.offset.ratio).toBeCloseTo(0.985, 12);
  });

  it("gives the same checks by running totals for the whole fleet as one by one", () => {
    const byCoil = new Map([["a", own], ["b", fleet.filter((o) => o.coilId === "b")]]);
    const all = checkAllRunningFrequencies(byCoil);
    for (const [coilId, observations] of byCoil) {
      const oneByOne = observations.map((o) => checkRunningFrequency(o, observations, fleet));
      all.get(coilId)!.forEach((check, i) => {
        expect(check.prediction.offset.source).toBe(oneByOne[i]!.prediction.offset.source);
        expect(check.prediction.frequency).toBeCloseTo(oneByOne[i]!.prediction.frequency, 6);
        expect(check.prediction.standardUncertainty).toBeCloseTo(oneByOne[i]!.prediction.standardUncertainty, 6);
      });
    }
  });

  it("reads the fleet only when the coil has too few observations of its own", () => {
    expect(needsFleetObservations(own.slice(0, 2))).toBe(true);
    expect(needsFleetObservations(own)).toBe(false);
  });
});
