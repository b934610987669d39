import { describe, expect, it } from "vitest";
import { fitResonance } from "./resonance-fit";

/**
 * Readings m = |Z/(R + Z)| of an ideal isolated resonance, for which the fit's model is exact:
 * series Z = Rs + j·X′·(f − f0), parallel Y = G + j·B′·(f − f0) (docs/references.md, "Sweeps through a
 * series resistor"; the half-power points are X = ±Rs and B = ±G, so Q = f0·X′/(2Rs) = f0·B′/(2G)).
 */
function idealReadings(kind: "series" | "parallel", r: number, f0: number, q: number, level: number, fs: number[]) {
  return Float64Array.from(fs, (f) => {
    if (kind === "series") {
      const slope = (2 * q * level) / f0; // X′ with Rs = level
      const x = slope * (f - f0);
      return Math.hypot(level, x) / Math.hypot(r + level, x);
    }
    const g = 1 / level; // level = Rp
    const b = ((2 * q * g) / f0) * (f - f0);
    return 1 / Math.hypot(1 + r * g, r * b);
  });
}

describe("fitResonance", () => {
  const r = 10_000;
  const input = (kind: "series" | "parallel", f: Float64Array, ratio: Float64Array, peak: number, from: number, to: number) => ({
    kind,
    f,
    ratio,
    peak,
    from,
    to,
    seriesResistance: r,
    noiseMargin: 1e-4,
    relativeNoise: 0.01,
    absoluteNoise: 0,
  });
  const f0 = 312_345;
  const fs = Array.from({ length: 201 }, (_, i) => f0 * (0.9 + (0.2 * i) / 200 + 0.0003 * Math.sin(7 * i)));
  const f = Float64Array.from(fs);

  it("recovers frequency, impedance and Q of an ideal series resonance exactly", () => {
    // derived: m²/(1 − m²) is exactly a parabola in f for this resonance
    const ratio = idealReadings("series", r, f0, 40, 350, fs);
    const peak = ratio.indexOf(Math.min(...ratio));
    const fit = fitResonance(input("series", f, ratio, peak, 0, f.length - 1));
    expect(fit.method).toBe("lorentzian");
    expect(fit.frequency / f0).toBeCloseTo(1, 9);
    expect(fit.impedance / 350).toBeCloseTo(1, 8);
    expect((fit.q ?? 0) / 40).toBeCloseTo(1, 8);
  });

  it("recovers frequency, impedance and Q of an ideal parallel resonance exactly", () => {
    // derived: 1/m² is exactly a parabola in f for this resonance
    const ratio = idealReadings("parallel", r, f0, 25, 60_000, fs);
    const peak = ratio.indexOf(Math.max(...ratio));
    const fit = fitResonance(input("parallel", f, ratio, peak, 0, f.length - 1));
    expect(fit.frequency / f0).toBeCloseTo(1, 9);
    expect(fit.impedance / 60_000).toBeCloseTo(1, 8);
    expect((fit.q ?? 0) / 25).toBeCloseTo(1, 8);
  });

  it("still places a resonance sampled by three points, but gives no Q", () => {
    const coarse = Float64Array.from([0.8, 0.97, 1.05, 1.2].map((k) => k * f0));
    const ratio = idealReadings("series", r, f0, 40, 350, Array.from(coarse));
    const fit = fitResonance(input("series", coarse, ratio, 1, 0, 3));
    expect(fit.q).toBeUndefined();
    // the three samples around the minimum straddle f0 by ±3–5 %; the vertex lands much closer
    expect(Math.abs(fit.frequency / f0 - 1)).toBeLessThan(0.01);
  });
});
