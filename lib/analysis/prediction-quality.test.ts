import { describe, expect, it } from "vitest";
import { assessPredictionQuality } from "./prediction-quality";

const day = (d: number) => new Date(Date.UTC(2025, 0, d));
const coil = { id: "c1", tag: "PQ-01", topology: "single_switch" as const, formDiameterM: 0.05, windingLengthM: 0.2, turns: 880, wireDiameterM: 0.000202, environmentCapacitanceF: null, measuredInductanceH: null };
const ball = { id: "t1", coilId: "c1", shape: "sphere" as const, diameterM: 0.1, tubeDiameterM: null, heightM: null, measuredCapacitanceF: null };
const sweeps = [300e3, 294e3, 303e3].map((f, i) => ({ id: `w${i + 1}`, coilId: "c1", takenAt: day(1 + 10 * i), topLoadId: "t1", firstSeriesResonanceHz: f }));

describe("assessPredictionQuality", () => {
  it("compares every sweep with geometry alone, and with a calibration only from the sweeps before it", () => {
    const { deviations, summaries } = assessPredictionQuality({ coils: [coil], topLoads: [ball], sweeps, sessions: [] });
    expect(deviations.geometryOnly.map((d) => d.label.recordId)).toEqual(["w1", "w2", "w3"]);
    // w1 has nothing before it; w2 is predicted from w1 alone, so its deviation is 294/300 − 1 to within the model's rounding.
    expect(deviations.calibrated.map((d) => d.label.recordId)).toEqual(["w2", "w3"]);
    expect(deviations.calibrated[0]!.deviation).toBeCloseTo(294 / 300 - 1, 6);
    expect(summaries.calibrated!.count).toBe(2);
    expect(summaries.runningFrequency).toBeNull();
  });

  it("skips a build the models refuse instead of failing the fleet's figures", () => {
    const { summaries } = assessPredictionQuality({ coils: [{ ...coil, turns: 5000 }], topLoads: [ball], sweeps, sessions: [] });
    expect(summaries.geometryOnly).toBeNull();
    expect(summaries.calibrated).toBeNull();
  });
});
