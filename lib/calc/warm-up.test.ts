import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CalcInputError } from "./errors";
import type { HeatingSample } from "./heating";
import { createSeededRandom } from "./seeded-random";
import { analyzeWarmUp } from "./warm-up";

function warmUp(ambient: number, rise: number, tau: number, duration: number, noise: number, seed: number): HeatingSample[] {
  const rng = createSeededRandom(seed);
  return Array.from({ length: Math.floor(duration / 10) + 1 }, (_, i) => ({
    time: 10 * i,
    temperature: ambient + rise * (1 - Math.exp((-10 * i) / tau)) + noise * rng.normal(),
  }));
}

describe("analyzeWarmUp", () => {
  it("predicts the junction from the sink: Tj = Tsink + P·(Rθjc + Rθcs)", () => {
    // docs/references.md, "The switching transistor": thermal chain Tj = Ta + P·(Rθjc + Rθcs + Rθsa)
    const result = analyzeWarmUp({
      samples: warmUp(25, 50, 300, 1_500, 0, 1),
      dissipation: 12,
      junctionToSink: 1.5,
      junctionLimitC: 150,
    });
    expect(result.predictedSteadySinkC).toBeCloseTo(75, 4);
    expect(result.predictedSteadyJunctionC).toBeCloseTo(75 + 18, 4);
    expect(result.sinkLimitC).toBe(132);
    // the sink levels off at 75 °C, below the 132 °C it may reach
    expect(result.longestRunBelowLimitS).toBe(Number.POSITIVE_INFINITY);
  });

  it("gives the time to the junction limit from the closed form", () => {
    // derived (docs/references.md, "Heat sink warm-up"): t = −τ·ln(1 − (T_lim − Ta)/ΔT∞), T_lim = 150 − 20·1.2
    const result = analyzeWarmUp({
      samples: warmUp(20, 160, 400, 2_000, 0, 1),
      dissipation: 20,
      junctionToSink: 1.2,
      junctionLimitC: 150,
    });
    const expected = -400 * Math.log(1 - (126 - 20) / 160);
    expect(result.longestRunBelowLimitS / expected).toBeCloseTo(1, 5);
    expect(result.explanations.join(" ")).toMatch(/min at this supply/);
  });

  it("falls back to the sink temperature, and says it is optimistic, without P and Rθ", () => {
    const result = analyzeWarmUp({ samples: warmUp(20, 160, 400, 2_000, 0.2, 2), junctionLimitC: 150 });
    expect(result.predictedSteadyJunctionC).toBeNull();
    expect(result.sinkLimitC).toBe(150);
    const expected = -400 * Math.log(1 - (150 - 20) / 160);
    expect(Math.abs(result.longestRunBelowLimitS / expected - 1)).toBeLessThan(0.02);
    expect(result.explanations.join(" ")).toMatch(/upper bound/);
  });

  it("warns when the predicted time rests on an extrapolation the run cannot support", () => {
    // a run of 0.4 τ heading for a limit it has not reached yet
    const result = analyzeWarmUp({
      samples: warmUp(22, 90, 900, 360, 0.3, 3),
      dissipation: 8,
      junctionToSink: 2,
      junctionLimitC: 110,
    });
    expect(result.fit.extrapolation).toBe("too-short");
    expect(result.explanations.join(" ")).toMatch(/extrapolation/);
  });

  it("reports zero time when the sink already sits above its limit", () => {
    const result = analyzeWarmUp({
      samples: warmUp(60, 30, 300, 1_500, 0, 1),
      dissipation: 40,
      junctionToSink: 1.5,
      junctionLimitC: 100,
    });
    expect(result.sinkLimitC).toBe(40);
    expect(result.longestRunBelowLimitS).toBe(0);
  });

  it("refuses a negative dissipation or resistance", () => {
    const samples = warmUp(20, 10, 100, 500, 0, 1);
    expect(() => analyzeWarmUp({ samples, dissipation: -1, junctionToSink: 1, junctionLimitC: 150 })).toThrowError(CalcInputError);
    expect(() => analyzeWarmUp({ samples, dissipation: 1, junctionToSink: -1, junctionLimitC: 150 })).toThrow(/junctionToSink/);
    expect(() => analyzeWarmUp({ samples, junctionLimitC: Number.NaN })).toThrow(/junctionLimitC/);
  });
});

describe("analyzeWarmUp: bounds a steward can defend", () => {
  it("takes the power from the fitted rise, ΔT∞/Rθsa, so a run cut short does not under-read it", () => {
    // Exact first-order data (docs/references.md, "Heat sink warm-up"): ΔT∞ = 50 K over a 2 K/W sink is 25 W, though the
    // run ends at one time constant with only 31.6 K of rise (15.8 W by (T_end − Ta)/Rθsa).
    const result = analyzeWarmUp({ samples: warmUp(25, 50, 300, 300, 0, 1), sinkToAmbientKPerW: 2, ambientC: 25, junctionToSink: 1.5, junctionLimitC: 150 });
    expect(result.dissipationW).toBeCloseTo(25, 3);
    expect(result.predictedSteadyJunctionC).toBeCloseTo(75 + 25 * 1.5, 2);
  });

  it("bounds the longest run from below, and offers none from a fit too short to extrapolate", () => {
    const long = analyzeWarmUp({ samples: warmUp(20, 160, 400, 2_000, 0.2, 2), sinkToAmbientKPerW: 8, ambientC: 20, junctionToSink: 1.2, junctionLimitC: 150 });
    expect(long.usable).toBe(true);
    expect(long.longestRunLowerBoundS).not.toBeNull();
    expect(long.longestRunLowerBoundS!).toBeLessThanOrEqual(long.longestRunBelowLimitS);
    expect(long.longestRunLowerBoundS!).toBeGreaterThan(0);
    const short = analyzeWarmUp({ samples: warmUp(20, 160, 4_000, 300, 0.2, 2), sinkToAmbientKPerW: 8, ambientC: 20, junctionToSink: 1.2, junctionLimitC: 150 });
    expect(short.usable).toBe(false);
    expect(short.longestRunLowerBoundS).toBeNull();
    expect(short.explanations.join(" ")).toMatch(/cannot bound the longest run/);
  });

  it("never lengthens the lower-bound run as the confidence widens (property)", () => {
    const samples = warmUp(20, 160, 400, 2_000, 0.3, 7);
    fc.assert(
      fc.property(fc.double({ min: 0.6, max: 0.99, noNaN: true }), fc.double({ min: 0.6, max: 0.99, noNaN: true }), (a, b) => {
        const [narrow, wide] = a <= b ? [a, b] : [b, a];
        const at = (confidence: number) => analyzeWarmUp({ samples, sinkToAmbientKPerW: 8, ambientC: 20, junctionToSink: 1.2, junctionLimitC: 150, confidence }).longestRunLowerBoundS!;
        expect(at(wide)).toBeLessThanOrEqual(at(narrow));
      }),
      { numRuns: 25 },
    );
  });
});
