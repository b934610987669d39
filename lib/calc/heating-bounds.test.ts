import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import {
  fitHeatingCurve,
  isUsableFit,
  lumpedDissipation,
  oneSidedCoverageFactor,
  pessimisticCurve,
  steadyStateUpperBound,
  timeToReachTemperature,
  type HeatingSample,
} from "./heating";
import { createSeededRandom } from "./seeded-random";

/** Samples of the exact first-order response T = Ta + ΔT∞(1 − e^(−t/τ)) plus seeded noise. */
function firstOrder(ambient: number, rise: number, tau: number, duration: number, step: number, noise: number, seed: number): HeatingSample[] {
  const rng = createSeededRandom(seed);
  return Array.from({ length: Math.floor(duration / step) + 1 }, (_, i) => ({
    time: step * i,
    temperature: ambient + rise * (1 - Math.exp((-step * i) / tau)) + noise * rng.normal(),
  }));
}

describe("lumpedDissipation", () => {
  it("recovers the power of the exact lumped-capacitance response at any moment of a warm-up", () => {
    // Exact solution of C·dT/dt = P − (T − Ta)/Rθ (Incropera & DeWitt lumped capacitance, docs/references.md):
    // T − Ta = P·Rθ(1 − e^(−t/τ)), dT/dt = (P/C)·e^(−t/τ), τ = Rθ·C; so C·dT/dt + ΔT/Rθ = P at every t.
    const power = 18;
    const resistance = 1.4;
    const capacity = 0.35 * 897; // 350 g of aluminium, c = 0.897 J/(g·K) (docs/references.md)
    const tau = resistance * capacity;
    for (const t of [0, 30, tau, 3 * tau]) {
      const rise = power * resistance * (1 - Math.exp(-t / tau));
      const rate = (power / capacity) * Math.exp(-t / tau);
      expect(lumpedDissipation({ thermalResistance: resistance, heatCapacityJPerK: capacity, riseK: rise, riseRateKPerS: rate })).toBeCloseTo(power, 9);
    }
  });

  it("shows how much a short run's (T − Ta)/Rθ under-reads the power", () => {
    // Same exact solution at t = τ: the rise is 63.2 % of P·Rθ, so ΔT/Rθ alone reads 63.2 % of P.
    const rise = 20 * 1.5 * (1 - Math.exp(-1));
    expect(rise / 1.5 / 20).toBeCloseTo(0.632, 3);
    expect(lumpedDissipation({ thermalResistance: 1.5, heatCapacityJPerK: 200, riseK: rise, riseRateKPerS: (20 / 200) * Math.exp(-1) })).toBeCloseTo(20, 9);
  });

  it("refuses a non-positive resistance", () => {
    expect(() => lumpedDissipation({ thermalResistance: 0, heatCapacityJPerK: 1, riseK: 1, riseRateKPerS: 0 })).toThrow(CalcInputError);
  });
});

describe("confidence bounds of a warm-up fit", () => {
  it("uses the normal coverage factor of a one-sided 95 % bound", () => {
    // JCGM 100:2008 Table G.1: k = 1.645 for a two-sided 90 % interval, i.e. a one-sided 95 % bound.
    expect(oneSidedCoverageFactor(0.95)).toBeCloseTo(1.645, 3);
    expect(() => oneSidedCoverageFactor(0.4)).toThrow(CalcInputError);
  });

  it("puts the steady state's upper bound k standard errors above it", () => {
    const fit = fitHeatingCurve(firstOrder(22, 40, 300, 1_200, 15, 0.15, 3));
    expect(steadyStateUpperBound(fit, 0.95)).toBeCloseTo(fit.steadyState + 1.6449 * fit.standardErrors.steadyState, 3);
    expect(steadyStateUpperBound({ ...fit, standardErrors: { ...fit.standardErrors, steadyState: Infinity } }, 0.95)).toBe(Infinity);
  });

  it("judges a run of four time constants usable and a run of a fifth of one not", () => {
    // Exact first-order data; thresholds as heating.ts judgeExtrapolation states them (common practice).
    expect(isUsableFit(fitHeatingCurve(firstOrder(22, 40, 300, 1_200, 15, 0.15, 4)))).toBe(true);
    expect(isUsableFit(fitHeatingCurve(firstOrder(22, 40, 3_000, 600, 15, 0.15, 4)))).toBe(false);
  });

  it("never lengthens the lower-bound time to a limit as the confidence widens (property)", () => {
    const fit = fitHeatingCurve(firstOrder(20, 60, 400, 1_600, 20, 0.3, 5));
    fc.assert(
      fc.property(fc.double({ min: 0.55, max: 0.995, noNaN: true }), fc.double({ min: 0.55, max: 0.995, noNaN: true }), fc.double({ min: 25, max: 75, noNaN: true }), (a, b, limit) => {
        const [narrow, wide] = a <= b ? [a, b] : [b, a];
        const tNarrow = timeToReachTemperature(pessimisticCurve(fit, narrow), limit);
        const tWide = timeToReachTemperature(pessimisticCurve(fit, wide), limit);
        expect(tWide).toBeLessThanOrEqual(tNarrow);
        expect(tNarrow).toBeLessThanOrEqual(timeToReachTemperature(fit, limit));
      }),
    );
  });
});
