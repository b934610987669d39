import { describe, expect, it } from "vitest";
import { analyzeWarmUp } from "../calc/warm-up";
import { buildWarmUpSeries } from "./warm-up-chart";

describe("buildWarmUpSeries", () => {
  // A synthetic first-order warm-up: 22 °C → 62 °C with τ = 300 s (values made up for the test).
  const samples = Array.from({ length: 13 }, (_, i) => ({ elapsedS: i * 60, temperatureC: 22 + 40 * (1 - Math.exp((-i * 60) / 300)) }));
  const warmUp = analyzeWarmUp({ samples: samples.map((s) => ({ time: s.elapsedS, temperature: s.temperatureC })), junctionLimitC: 120 });

  it("draws the fit through the samples and past the run, with flat steady and limit lines", () => {
    const series = buildWarmUpSeries(samples, warmUp);
    expect(series.samples).toHaveLength(13);
    expect(series.endS).toBeCloseTo(720 * 1.5, 6);
    expect(series.fitted.at(-1)!.x).toBeCloseTo(series.endS, 6);
    expect(series.fitted[0]!.y).toBeCloseTo(22, 1);
    expect(series.steady.every((p) => Math.abs(p.y - warmUp.predictedSteadySinkC) < 1e-9)).toBe(true);
    expect(series.sinkLimit[0]!.y).toBe(120);
  });
});
