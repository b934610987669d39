import { describe, expect, it } from "vitest";
import { compareCoil, toTopLoadSpec } from "./coil-comparison";

const coil = { topology: "single_switch" as const, formDiameterM: 0.075, windingLengthM: 0.2, turns: 600, wireDiameterM: 0.00032, environmentCapacitanceF: 1e-12, measuredInductanceH: null };
const toroid = { id: "t1", name: "Toroid", shape: "toroid" as const, diameterM: 0.15, tubeDiameterM: 0.04, heightM: null, measuredCapacitanceF: null, retiredAt: null };
const day = (d: number) => new Date(Date.UTC(2025, 0, d));

describe("compareCoil", () => {
  it("compares the first resonance with the latest sweep on the fitted top load and the running frequency with that sweep", () => {
    const sweeps = [
      { id: "w0", takenAt: day(1), topLoadId: null, firstSeriesResonanceHz: 900e3 },
      { id: "w1", takenAt: day(2), topLoadId: "t1", firstSeriesResonanceHz: 400e3 },
    ];
    const sessions = [{ id: "s1", startedAt: day(3), topLoadId: "t1", supplyVoltageV: 24, supplyCurrentA: 2, durationS: 60, ambientTempC: 20, heatSinkStartC: null, heatSinkEndC: null, runningFrequencyHz: 380e3, peakSwitchVoltageV: null, dutyCycle: null, outcome: "normal" as const }];
    const result = compareCoil(coil, [toroid], sweeps, sessions);
    expect(result.currentTopLoad?.id).toBe("t1");
    const [inductance, resonance, running] = result.rows;
    expect(inductance!.comparison).toBeNull(); // nothing measured
    expect(resonance!.measured).toBe(400e3);
    expect(resonance!.predicted).toBeGreaterThan(0);
    expect(running!.comparison).toMatchObject({ tolerance: 0.1, withinTolerance: true });
    expect(running!.comparison!.deviation).toBeCloseTo(-0.05, 12);
  });

  it("says why there is no prediction when the build cannot be modelled", () => {
    const result = compareCoil({ ...coil, turns: 5000 }, [], [], []);
    expect(result.prediction).toBeNull();
    expect(result.predictionProblem).toMatch(/cannot run/);
  });

  it("prefers a measured top-load capacitance to the shape formula", () => {
    expect(toTopLoadSpec({ ...toroid, measuredCapacitanceF: 9e-12 })).toEqual({ capacitance: 9e-12 });
    expect(toTopLoadSpec({ ...toroid, shape: "none" })).toBeNull();
  });
});
