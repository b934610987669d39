import { describe, expect, it } from "vitest";
import { dividerImpedance } from "./divider";
import { CalcInputError } from "./errors";
import { createLineModel, lineModelImpedance, simulateSweep, type LineModel } from "./line-model";
import { createSeededRandom } from "./seeded-random";

const magnitude = (model: LineModel, f: number) => {
  const z = lineModelImpedance(model, f);
  return Math.hypot(z.re, z.im);
};

/** Local extrema of |Z| on a fine logarithmic grid: +1 for a maximum, −1 for a minimum. */
function extremaOnGrid(model: LineModel, fLow: number, fHigh: number, steps: number) {
  const fs = Array.from({ length: steps }, (_, i) => fLow * (fHigh / fLow) ** (i / (steps - 1)));
  const zs = fs.map((f) => magnitude(model, f));
  const found: { kind: 1 | -1; frequency: number }[] = [];
  for (let i = 1; i < steps - 1; i++) {
    const [a, b, c] = [zs[i - 1] as number, zs[i] as number, zs[i + 1] as number];
    if (b < a && b < c) found.push({ kind: -1, frequency: fs[i] as number });
    if (b > a && b > c) found.push({ kind: 1, frequency: fs[i] as number });
  }
  return found;
}

/** Root of g between a and b by bisection (g changes sign there). */
function bisect(g: (x: number) => number, a: number, b: number): number {
  let ga = g(a);
  for (let i = 0; i < 200; i++) {
    const m = (a + b) / 2;
    const gm = g(m);
    if (gm > 0 === ga > 0) {
      a = m;
      ga = gm;
    } else b = m;
  }
  return (a + b) / 2;
}

describe("lineModelImpedance", () => {
  it("is −jZ0·cot(βℓ) for a lossless bare line, with zeros at odd quarter waves", () => {
    // derived: Z_in of an open lossless line (telegrapher's equations; Pozar, from memory)
    const model = createLineModel({ firstSeriesResonance: 250e3, characteristicImpedance: 12e3 });
    for (const f of [37e3, 180e3, 333e3, 611e3, 1.2e6]) {
      const z = lineModelImpedance(model, f);
      expect(z.re).toBe(0);
      expect(z.im / (-12e3 / Math.tan((Math.PI / 2) * (f / 250e3)))).toBeCloseTo(1, 10);
    }
    for (let n = 1; n <= 6; n++) {
      // exact odd quarter waves: |Z| vanishes up to rounding of the angle
      expect(magnitude(model, (2 * n - 1) * 250e3) / 12e3).toBeLessThan(1e-12);
      expect(magnitude(model, 2 * n * 250e3 * (1 + 1e-9)) / 12e3).toBeGreaterThan(1e7);
    }
  });

  it("matches a ladder of many short LC sections ending in the top load", () => {
    // independent numerical method: a lossless TEM line discretised into 4 000 L–C sections
    const z0 = 9e3;
    const cTop = 12e-12;
    const f1 = 210e3;
    const model = createLineModel({ firstSeriesResonance: f1, characteristicImpedance: z0, topCapacitance: cTop });
    const delay = model.electricalLengthAtFirst / (2 * Math.PI * f1); // √(L·C) of the whole line
    const sections = 4_000;
    const lSection = (z0 * delay) / sections;
    const cSection = delay / z0 / sections;
    for (const f of [90e3, 300e3, 520e3, 777e3]) {
      const w = 2 * Math.PI * f;
      // start at the top: admittance of the top load, then alternate shunt C/2, series L, shunt C/2
      let y = { re: 0, im: w * cTop };
      for (let k = 0; k < sections; k++) {
        y = { re: y.re, im: y.im + (w * cSection) / 2 };
        const d = y.re * y.re + y.im * y.im;
        const z = { re: y.re / d, im: -y.im / d + w * lSection };
        const e = z.re * z.re + z.im * z.im;
        y = { re: z.re / e, im: -z.im / e + (w * cSection) / 2 };
      }
      const d = y.re * y.re + y.im * y.im;
      const ladder = { re: y.re / d, im: -y.im / d };
      const exact = lineModelImpedance(model, f);
      expect(Math.hypot(ladder.re - exact.re, ladder.im - exact.im) / Math.hypot(exact.re, exact.im)).toBeLessThan(1e-4);
    }
  });

  it("puts the first series resonance where it was asked, with or without top load and loss", () => {
    for (const params of [
      { firstSeriesResonance: 180e3, characteristicImpedance: 10e3, topCapacitance: 20e-12 },
      { firstSeriesResonance: 95e3, characteristicImpedance: 25e3, topCapacitance: 8e-12, dispersionExponent: 0.2 },
    ]) {
      const lossless = createLineModel(params);
      // derived: the lossless line has an exact zero there
      expect(magnitude(lossless, params.firstSeriesResonance) / params.characteristicImpedance).toBeLessThan(1e-12);
      const lossy = createLineModel({ ...params, q: 50 });
      // with loss the minimum of |Z| moves by O(1/Q²) only
      const [first] = extremaOnGrid(lossy, params.firstSeriesResonance * 0.5, params.firstSeriesResonance * 1.5, 40_001);
      expect(first?.kind).toBe(-1);
      expect(Math.abs((first?.frequency ?? 0) / params.firstSeriesResonance - 1)).toBeLessThan(1e-3);
    }
  });

  it("alternates minima and maxima of |Z|", () => {
    // Foster's reactance theorem for the lossless line; loss only rounds the extremes (from memory)
    const model = createLineModel({
      firstSeriesResonance: 150e3,
      characteristicImpedance: 15e3,
      topCapacitance: 10e-12,
      dispersionExponent: 0.25,
      q: 40,
    });
    const found = extremaOnGrid(model, 50e3, 3e6, 60_001);
    expect(found.length).toBeGreaterThan(10);
    expect(found[0]?.kind).toBe(-1);
    found.forEach((e, i) => {
      if (i > 0) expect(e.kind).toBe(-(found[i - 1]?.kind ?? 0));
    });
  });

  it("does not put overtones at odd multiples: dispersion pulls them down, a top load pushes them up", () => {
    // docs/references.md, "Why higher resonances are not odd multiples"
    const f1 = 200e3;
    const dispersive = createLineModel({ firstSeriesResonance: f1, characteristicImpedance: 10e3, dispersionExponent: 0.2 });
    for (let n = 2; n <= 5; n++) {
      // derived: βℓ ∝ f^(1+p) puts the n-th zero at f₁·(2n − 1)^(1/(1+p))
      const expected = f1 * (2 * n - 1) ** (1 / 1.2);
      expect(magnitude(dispersive, expected) / 10e3).toBeLessThan(1e-9);
      expect(expected).toBeLessThan((2 * n - 1) * f1);
    }
    const loaded = createLineModel({ firstSeriesResonance: f1, characteristicImpedance: 10e3, topCapacitance: 25e-12 });
    const secondZero = bisect((f) => lineModelImpedance(loaded, f).im, 3.01 * f1, 3.99 * f1);
    expect(magnitude(loaded, secondZero) / 10e3).toBeLessThan(1e-9);
    expect(secondZero / f1).toBeGreaterThan(3);
  });

  it("treats q and the equivalent attenuation alike", () => {
    // derived: Q = (1 + p)·θ₁/(2αℓ)
    const base = { firstSeriesResonance: 300e3, characteristicImpedance: 7e3, topCapacitance: 5e-12, dispersionExponent: 0.1 };
    const byQ = createLineModel({ ...base, q: 35 });
    const byAlpha = createLineModel({ ...base, attenuationNepers: (1.1 * byQ.electricalLengthAtFirst) / (2 * 35) });
    expect(byAlpha.q).toBeCloseTo(35, 10);
    const a = lineModelImpedance(byQ, 417e3);
    const b = lineModelImpedance(byAlpha, 417e3);
    expect(b.re).toBeCloseTo(a.re, 6);
    expect(b.im).toBeCloseTo(a.im, 6);
  });

  it("gives a bare lossy line's first resonance the series resistance Z0·αℓ", () => {
    // derived: Z0·coth(αℓ + jπ/2) = Z0·tanh(αℓ) ≈ Z0·αℓ
    const model = createLineModel({ firstSeriesResonance: 100e3, characteristicImpedance: 5e3, q: 80 });
    const alphaL = Math.PI / 2 / (2 * 80);
    const z = lineModelImpedance(model, 100e3);
    expect(z.re / (5e3 * Math.tanh(alphaL))).toBeCloseTo(1, 10);
    expect(Math.abs(z.im)).toBeLessThan(1e-9 * z.re);
  });

  it("refuses impossible parameters", () => {
    expect(() => createLineModel({ firstSeriesResonance: 0, characteristicImpedance: 1e3 })).toThrowError(CalcInputError);
    expect(() => createLineModel({ firstSeriesResonance: 1e5, characteristicImpedance: 1e3, q: 20, attenuationNepers: 0.1 })).toThrow(
      /attenuationNepers/,
    );
    expect(() => createLineModel({ firstSeriesResonance: 1e5, characteristicImpedance: 1e3, dispersionExponent: -0.1 })).toThrow(
      /dispersionExponent/,
    );
    const model = createLineModel({ firstSeriesResonance: 1e5, characteristicImpedance: 1e3 });
    expect(() => lineModelImpedance(model, -5)).toThrow(/frequency/);
  });
});

describe("simulateSweep", () => {
  const model = createLineModel({ firstSeriesResonance: 200e3, characteristicImpedance: 10e3, topCapacitance: 10e-12, q: 30 });

  it("produces the readings from which the divider recovers |Z| exactly (given the phase)", () => {
    // cross-check with divider.ts: |Vout| = Vin·|Z/(R+Z)| inverted with the phase of Z (derived)
    const frequencies = [120e3, 200e3, 333e3, 480e3, 1.1e6];
    const points = simulateSweep({ model, seriesResistance: 22e3, sourceAmplitude: 10, frequencies });
    points.forEach((p, i) => {
      const z = lineModelImpedance(model, frequencies[i] as number);
      const recovered = dividerImpedance({
        seriesResistance: 22e3,
        sourceAmplitude: 10,
        measuredAmplitude: p.amplitude,
        phase: Math.atan2(z.im, z.re),
      });
      expect(recovered / Math.hypot(z.re, z.im)).toBeCloseTo(1, 9);
    });
  });

  it("adds reproducible noise of the requested size", () => {
    const frequencies = Array.from({ length: 4_000 }, (_, i) => 100e3 + 100 * i);
    const clean = simulateSweep({ model, seriesResistance: 20e3, sourceAmplitude: 20, frequencies });
    const run = (seed: number) =>
      simulateSweep({ model, seriesResistance: 20e3, sourceAmplitude: 20, frequencies, noise: { relative: 0.02 }, rng: createSeededRandom(seed) });
    const a = run(3);
    expect(run(3)).toEqual(a);
    expect(run(4)).not.toEqual(a);
    const relative = a.map((p, i) => p.amplitude / (clean[i]?.amplitude ?? 1) - 1);
    const sd = Math.sqrt(relative.reduce((s, r) => s + r * r, 0) / relative.length);
    // sampling error of a standard deviation from 4 000 values is about 1.1 %
    expect(sd / 0.02).toBeGreaterThan(0.95);
    expect(sd / 0.02).toBeLessThan(1.05);
    const floor = simulateSweep({ model, seriesResistance: 20e3, sourceAmplitude: 20, frequencies, noise: { absolute: 0.01 } });
    const absSd = Math.sqrt(floor.reduce((s, p, i) => s + (p.amplitude - (clean[i]?.amplitude ?? 0)) ** 2, 0) / floor.length);
    expect(absSd / 0.01).toBeGreaterThan(0.95);
    expect(absSd / 0.01).toBeLessThan(1.05);
  });
});
