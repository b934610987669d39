import { describe, expect, it } from "vitest";
import { compareWithPrediction, impedanceCurve, predictWhatIf, summarizeCalibration } from "./sweep-report";
import { topLoadSpecOf } from "./top-load-spec";

// A build like the demo club's KM-02 (invented): 50 mm form, 200 mm winding, 880 turns of 0.202 mm wire.
const coil = { formDiameterM: 0.05, windingLengthM: 0.2, turns: 880, wireDiameterM: 0.000202, environmentCapacitanceF: 3e-12 };
const toroid = { shape: "toroid" as const, diameterM: 0.15, tubeDiameterM: 0.04, heightM: null, measuredCapacitanceF: null };

describe("topLoadSpecOf", () => {
  it("maps stored shapes to lib/calc's specs and a bare or incomplete row to none", () => {
    expect(topLoadSpecOf(toroid)).toEqual({ kind: "toroid", outerDiameter: 0.15, tubeDiameter: 0.04 });
    expect(topLoadSpecOf({ ...toroid, shape: "measured", measuredCapacitanceF: 9e-12 })).toEqual({ capacitance: 9e-12 });
    expect(topLoadSpecOf({ ...toroid, shape: "none" })).toBeNull();
    expect(topLoadSpecOf({ ...toroid, shape: "cylinder" })).toBeNull();
  });
});

describe("predictWhatIf", () => {
  it("predicts a lower first resonance for a bigger toroid, and flags the broadcast band", () => {
    const bigger = predictWhatIf(coil, toroid, { shape: "toroid", diameter: 0.4, tubeDiameter: 0.1 });
    expect(bigger.ok && bigger.prediction.shift).toBeLessThan(0);
    const tiny = predictWhatIf({ ...coil, turns: 300 }, null, { shape: "sphere", diameter: 0.005 });
    expect(tiny.ok && tiny.prediction.predictedFirstResonance).toBeGreaterThan(0);
    if (tiny.ok) expect(tiny.inBand).toBe(tiny.prediction.predictedFirstResonance >= tiny.band.lowerEdge && tiny.prediction.predictedFirstResonance <= tiny.band.upperEdge);
  });

  it("checks against the broadcast band of the region it is given", () => {
    const input = { shape: "toroid" as const, diameter: 0.4, tubeDiameter: 0.1 };
    const [one, two] = [predictWhatIf(coil, toroid, input, 1), predictWhatIf(coil, toroid, input, 2)];
    // ITU Radio Regulations Article 5 (as in lib/calc/broadcast-band.test.ts): Region 1 ends at 1606.5 kHz, Region 2 at 1705 kHz.
    expect(one.ok && one.band.upperEdge).toBe(1_606_500);
    expect(two.ok && two.band.upperEdge).toBe(1_705_000);
    expect(one.ok && one.region).toBe(1);
  });

  it("names the field of a toroid without a hole", () => {
    expect(predictWhatIf(coil, toroid, { shape: "toroid", diameter: 0.1, tubeDiameter: 0.06 })).toMatchObject({ ok: false, field: "tubeDiameter" });
  });
});

describe("compareWithPrediction and summarizeCalibration", () => {
  const day = (d: number) => new Date(Date.UTC(2025, 0, d));
  const sweeps = [
    { id: "s1", takenAt: day(1), firstSeriesResonanceHz: 300_000, topLoad: toroid },
    { id: "s2", takenAt: day(2), firstSeriesResonanceHz: 297_000, topLoad: toroid },
    { id: "s3", takenAt: day(3), firstSeriesResonanceHz: 303_000, topLoad: toroid },
  ];

  it("calibrates only on sweeps strictly before the one compared (out of sample, Stone 1974)", () => {
    const comparison = compareWithPrediction(coil, toroid, sweeps[2]!, sweeps);
    expect(comparison.ok && comparison.calibrated.ok && comparison.calibrated.fittedOn.map((s) => s.id)).toEqual(["s1", "s2"]);
    // The earlier sweeps' median environment predicts between their resonances (298.5 kHz), so 303 kHz deviates by about +1.5 %.
    if (comparison.ok && comparison.calibrated.ok) expect(comparison.calibrated.comparison.deviation).toBeCloseTo(303 / 298.5 - 1, 2);
  });

  it("says there is nothing to calibrate on for the first sweep, instead of a 0.0 % deviation", () => {
    const first = compareWithPrediction(coil, toroid, sweeps[0]!, sweeps);
    expect(first.ok && first.calibrated).toMatchObject({ ok: false, reason: expect.stringMatching(/Nothing to calibrate on yet/) });
    expect(first.ok && first.geometryOnly.lowHz).toBeLessThan(first.ok ? first.geometryOnly.highHz : 0);
    expect(compareWithPrediction(coil, toroid, { takenAt: day(4), firstSeriesResonanceHz: null }, sweeps).ok).toBe(false);
    expect(summarizeCalibration(coil, [{ ...sweeps[0]!, firstSeriesResonanceHz: null }])).toMatchObject({ ok: false });
  });
});

describe("impedanceCurve", () => {
  it("turns readings into |Z| = R·m/(1 − m) and thins long sweeps", () => {
    const curve = impedanceCurve({ seriesResistanceOhm: 1000, sourceAmplitudeV: 10, points: [{ frequencyHz: 1, amplitudeV: 5 }] });
    expect(curve.points).toEqual([{ x: 1, y: 1000 }]);
    const long = impedanceCurve({ seriesResistanceOhm: 1000, sourceAmplitudeV: 10, points: Array.from({ length: 5000 }, (_, i) => ({ frequencyHz: 1000 + i, amplitudeV: 1 + (i % 5) })) });
    expect(long.decimated).toBe(true);
    expect(long.total).toBe(5000);
    expect(long.points.length).toBeLessThanOrEqual(1200);
  });
});
