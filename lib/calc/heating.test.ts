import { levenbergMarquardt } from "ml-levenberg-marquardt";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import {
  ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K,
  fitHeatingCurve,
  temperatureAt,
  thermalTimeConstant,
  timeToReachTemperature,
  type HeatingCurve,
  type HeatingSample,
} from "./heating";
import { createSeededRandom } from "./seeded-random";

/** A first-order warm-up sampled every `step` s up to `duration`, with Gaussian sensor noise. */
function warmUp(
  { ambient, rise, tau }: { ambient: number; rise: number; tau: number },
  duration: number,
  step: number,
  noise: number,
  seed: number,
): HeatingSample[] {
  const rng = createSeededRandom(seed);
  const samples: HeatingSample[] = [];
  for (let time = 0; time <= duration + 1e-9; time += step) {
    samples.push({ time, temperature: ambient + rise * (1 - Math.exp(-time / tau)) + noise * rng.normal() });
  }
  return samples;
}

const truth = { ambient: 22, rise: 38, tau: 420 };

describe("fitHeatingCurve", () => {
  it("fits noise-free data exactly", () => {
    // derived: the model reproduces its own curve
    const fit = fitHeatingCurve(warmUp(truth, 2_000, 40, 0, 1));
    expect(fit.ambient).toBeCloseTo(22, 5);
    expect(fit.rise).toBeCloseTo(38, 5);
    expect(fit.timeConstant / 420).toBeCloseTo(1, 6);
    expect(fit.steadyState).toBeCloseTo(60, 5);
    expect(fit.rSquared).toBeCloseTo(1, 12);
  });

  it("recovers known parameters from noisy data, within their reported standard errors", () => {
    for (const seed of [1, 2, 3, 4]) {
      const fit = fitHeatingCurve(warmUp(truth, 2_000, 10, 0.15, seed));
      const e = fit.standardErrors;
      expect(Math.abs(fit.ambient - 22)).toBeLessThan(4 * e.ambient);
      expect(Math.abs(fit.rise - 38)).toBeLessThan(4 * e.rise);
      expect(Math.abs(fit.timeConstant - 420)).toBeLessThan(4 * e.timeConstant);
      expect(Math.abs(fit.timeConstant / 420 - 1)).toBeLessThan(0.03);
      expect(Math.abs(fit.steadyState - 60)).toBeLessThan(0.5);
      expect(fit.residualStd / 0.15).toBeGreaterThan(0.85);
      expect(fit.residualStd / 0.15).toBeLessThan(1.15);
      expect(fit.extrapolation).toBe("reliable");
    }
  });

  it("reports standard errors that match the scatter over many noisy runs", () => {
    // Monte Carlo: an independent estimate of the same uncertainty
    const taus: number[] = [];
    const steadies: number[] = [];
    let reportedTau = 0;
    let reportedSteady = 0;
    const runs = 300;
    for (let seed = 0; seed < runs; seed++) {
      const fit = fitHeatingCurve(warmUp(truth, 900, 15, 0.3, 1_000 + seed));
      taus.push(fit.timeConstant);
      steadies.push(fit.steadyState);
      reportedTau += fit.standardErrors.timeConstant / runs;
      reportedSteady += fit.standardErrors.steadyState / runs;
    }
    const sd = (xs: number[]) => {
      const m = xs.reduce((s, x) => s + x, 0) / xs.length;
      return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
    };
    // a standard deviation from 300 runs scatters by about 4 %; the linearised error is first order
    expect(reportedTau / sd(taus)).toBeGreaterThan(0.8);
    expect(reportedTau / sd(taus)).toBeLessThan(1.2);
    expect(reportedSteady / sd(steadies)).toBeGreaterThan(0.8);
    expect(reportedSteady / sd(steadies)).toBeLessThan(1.2);
  });

  it("agrees with Levenberg–Marquardt started at the answer", () => {
    // reference library: ml-levenberg-marquardt on the same data and model
    const samples = warmUp({ ambient: 18, rise: 55, tau: 800 }, 3_000, 20, 0.4, 77);
    const ours = fitHeatingCurve(samples);
    const lm = levenbergMarquardt(
      { x: samples.map((s) => s.time), y: samples.map((s) => s.temperature) },
      ([ta, dt, tau]) => (t) => (ta as number) + (dt as number) * (1 - Math.exp(-t / (tau as number))),
      {
        initialValues: [ours.ambient, ours.rise, ours.timeConstant],
        damping: 1e-3,
        gradientDifference: [1e-4, 1e-4, 1e-2],
        centralDifference: true,
        maxIterations: 200,
        errorTolerance: 1e-12,
      },
    );
    const sse = (p: readonly number[]) =>
      samples.reduce((s, x) => s + (x.temperature - ((p[0] ?? 0) + (p[1] ?? 0) * (1 - Math.exp(-x.time / (p[2] ?? 1))))) ** 2, 0);
    const ourSse = sse([ours.ambient, ours.rise, ours.timeConstant]);
    // LM cannot find a lower sum of squares than ours, and lands on the same parameters
    expect(sse(lm.parameterValues)).toBeGreaterThanOrEqual(ourSse * (1 - 1e-9));
    expect((lm.parameterValues[2] ?? 0) / ours.timeConstant).toBeCloseTo(1, 3);
    expect(lm.parameterValues[1] ?? 0).toBeCloseTo(ours.rise, 2);
  });

  it("finds the same τ and steady state when the log starts after switch-on", () => {
    // derived: Ta + ΔT(1 − e^(−(t−t0)/τ)) is again of the model's form with the same τ and Ta + ΔT
    const late = warmUp(truth, 2_400, 20, 0, 1).filter((s) => s.time >= 300);
    const fit = fitHeatingCurve(late);
    expect(fit.timeConstant / 420).toBeCloseTo(1, 5);
    expect(fit.steadyState).toBeCloseTo(60, 5);
    expect(fit.ambient).toBeCloseTo(22, 4);
  });

  it("fits a cooling run as a negative rise", () => {
    const fit = fitHeatingCurve(warmUp({ ambient: 70, rise: -45, tau: 300 }, 1_500, 10, 0.1, 8));
    expect(Math.abs(fit.rise + 45)).toBeLessThan(4 * fit.standardErrors.rise);
    expect(Math.abs(fit.timeConstant / 300 - 1)).toBeLessThan(0.03);
    expect(timeToReachTemperature(fit, 40)).toBeCloseTo(-fit.timeConstant * Math.log(1 - (40 - fit.ambient) / fit.rise), 6);
  });

  it("says a run of 0.3 τ is too short, and a run of 4 τ is not", () => {
    // docs/references.md: a short run cannot pin down the asymptote — report the uncertainty
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const short = fitHeatingCurve(warmUp(truth, 0.3 * 420, 2, 0.1, seed));
      expect(short.extrapolation).toBe("too-short");
      const long = fitHeatingCurve(warmUp(truth, 4 * 420, 10, 0.1, seed));
      expect(long.extrapolation).toBe("reliable");
      expect(short.standardErrors.steadyState).toBeGreaterThan(5 * long.standardErrors.steadyState);
    }
  });

  it("handles a flat run without NaN", () => {
    const flat = fitHeatingCurve(Array.from({ length: 20 }, (_, i) => ({ time: 30 * i, temperature: 24.5 })));
    expect(flat.rise).toBe(0);
    expect(flat.steadyState).toBe(24.5);
    const numbers = [flat.ambient, flat.rise, flat.timeConstant, flat.steadyState, flat.rSquared, flat.residualStd, ...Object.values(flat.standardErrors)];
    for (const value of numbers) expect(Number.isNaN(value)).toBe(false);
    expect(temperatureAt(flat, 1_000)).toBe(24.5);
    expect(timeToReachTemperature(flat, 80)).toBe(Number.POSITIVE_INFINITY);
    // noise around a constant: a small rise with a large uncertainty, still no NaN
    const noisy = fitHeatingCurve(warmUp({ ambient: 24, rise: 0, tau: 100 }, 600, 10, 0.2, 3));
    expect(Number.isNaN(noisy.steadyState)).toBe(false);
    expect(noisy.extrapolation).not.toBe("reliable");
  });

  it("names the offending sample", () => {
    const field = (call: () => unknown) => {
      try {
        call();
      } catch (error) {
        expect(error).toBeInstanceOf(CalcInputError);
        return (error as CalcInputError).field;
      }
      return "no error";
    };
    expect(field(() => fitHeatingCurve([{ time: 0, temperature: 20 }, { time: 1, temperature: 21 }]))).toBe("samples");
    const base = warmUp(truth, 100, 10, 0, 1);
    expect(field(() => fitHeatingCurve(base.map((s, i) => (i === 4 ? { ...s, time: base[3]?.time ?? 0 } : s))))).toBe(
      "samples[4].time",
    );
    expect(field(() => fitHeatingCurve(base.map((s, i) => (i === 6 ? { ...s, time: 5 } : s))))).toBe("samples[6].time");
    expect(field(() => fitHeatingCurve(base.map((s, i) => (i === 2 ? { ...s, temperature: Number.NaN } : s))))).toBe(
      "samples[2].temperature",
    );
    expect(field(() => fitHeatingCurve(base.map((s, i) => (i === 0 ? { ...s, time: -1 } : s))))).toBe("samples[0].time");
  });
});

describe("temperatureAt and timeToReachTemperature", () => {
  const curve: HeatingCurve = {
    ambient: 20,
    rise: 40,
    timeConstant: 100,
    steadyState: 60,
    rSquared: 1,
    residualStd: 0,
    standardErrors: { ambient: 0, rise: 0, timeConstant: 0, steadyState: 0 },
    duration: 500,
    extrapolation: "reliable",
    explanation: "",
  };

  it("reaches half the rise after τ·ln 2", () => {
    // derived: 1 − e^(−t/τ) = ½ ⇒ t = τ·ln 2
    expect(timeToReachTemperature(curve, 40)).toBeCloseTo(100 * Math.LN2, 10);
    expect(temperatureAt(curve, 100 * Math.LN2)).toBeCloseTo(40, 10);
    // one time constant reaches 1 − 1/e ≈ 63.2 % of the rise (textbook first-order response)
    expect(temperatureAt(curve, 100)).toBeCloseTo(20 + 40 * (1 - Math.exp(-1)), 10);
  });

  it("inverts temperatureAt below the asymptote, and is never or at once outside it", () => {
    for (const limit of [20.5, 33, 51.7, 59.99]) {
      expect(temperatureAt(curve, timeToReachTemperature(curve, limit))).toBeCloseTo(limit, 8);
    }
    expect(timeToReachTemperature(curve, 60)).toBe(Number.POSITIVE_INFINITY);
    expect(timeToReachTemperature(curve, 75)).toBe(Number.POSITIVE_INFINITY);
    expect(timeToReachTemperature(curve, 20)).toBe(0);
    expect(timeToReachTemperature(curve, 5)).toBe(0);
    expect(() => timeToReachTemperature(curve, Number.NaN)).toThrow(/limitC/);
  });
});

describe("thermalTimeConstant", () => {
  it("gives τ = Rθ·m·c for an aluminium sink", () => {
    // EDN, "Thermal time constant versus specific heat": aluminium c ≈ 0.897 J/(g·K); 500 g at 1.2 K/W
    const tau = thermalTimeConstant({ thermalResistance: 1.2, mass: 0.5, specificHeat: ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K });
    expect(tau).toBeCloseTo(1.2 * 500 * 0.897, 9);
    expect(() => thermalTimeConstant({ thermalResistance: 1, mass: 0, specificHeat: 897 })).toThrow(/mass/);
  });
});
