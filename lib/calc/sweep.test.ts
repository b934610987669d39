import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { createLineModel, lineModelImpedance, simulateSweep, type LineModel } from "./line-model";
import { createSeededRandom } from "./seeded-random";
import { analyzeSweep, type SweepPoint } from "./sweep";

const R = 20_000;
const VIN = 20;

/** Uneven, increasing frequencies: steps drawn between 0.3× and 1.7× the mean log step. */
function unevenFrequencies(count: number, fLow: number, fHigh: number, seed: number): number[] {
  const rng = createSeededRandom(seed);
  const steps = Array.from({ length: count - 1 }, () => 0.3 + 1.4 * rng.uniform());
  const total = steps.reduce((s, v) => s + v, 0);
  const out = [fLow];
  let acc = 0;
  for (const step of steps) {
    acc += step;
    out.push(fLow * (fHigh / fLow) ** (acc / total));
  }
  return out;
}

/**
 * The model's true extrema of |Z| in a band, found independently of the analysis: a fine grid to
 * bracket them, then golden-section search on the exact, noise-free impedance.
 */
function trueExtrema(model: LineModel, fLow: number, fHigh: number) {
  const mag = (f: number) => {
    const z = lineModelImpedance(model, f);
    return Math.hypot(z.re, z.im);
  };
  const steps = 20_000;
  const fs = Array.from({ length: steps }, (_, i) => fLow * (fHigh / fLow) ** (i / (steps - 1)));
  const series: { frequency: number; impedance: number }[] = [];
  const parallel: { frequency: number; impedance: number }[] = [];
  for (let i = 1; i < steps - 1; i++) {
    const [a, b, c] = [mag(fs[i - 1] as number), mag(fs[i] as number), mag(fs[i + 1] as number)];
    const isMin = b < a && b < c;
    const isMax = b > a && b > c;
    if (!isMin && !isMax) continue;
    const sign = isMin ? 1 : -1;
    let lo = fs[i - 1] as number;
    let hi = fs[i + 1] as number;
    const g = (Math.sqrt(5) - 1) / 2;
    for (let k = 0; k < 100; k++) {
      const x1 = hi - g * (hi - lo);
      const x2 = lo + g * (hi - lo);
      if (sign * mag(x1) < sign * mag(x2)) hi = x2;
      else lo = x1;
    }
    const frequency = (lo + hi) / 2;
    (isMin ? series : parallel).push({ frequency, impedance: mag(frequency) });
  }
  return { series, parallel };
}

/** Index of the entry nearest to f. */
const nearest = (list: { frequency: number }[], f: number) =>
  list.reduce((best, e, i) => (Math.abs(e.frequency - f) < Math.abs((list[best]?.frequency ?? Infinity) - f) ? i : best), 0);

/** Series RLC: Z = Rs + j(ωL − 1/(ωC)). */
const seriesRlc = (rs: number, l: number, c: number) => (f: number) => {
  const w = 2 * Math.PI * f;
  return { re: rs, im: w * l - 1 / (w * c) };
};

/** Parallel RLC: Y = 1/Rp + j(ωC − 1/(ωL)). */
const parallelRlc = (rp: number, l: number, c: number) => (f: number) => {
  const w = 2 * Math.PI * f;
  const g = 1 / rp;
  const b = w * c - 1 / (w * l);
  const d = g * g + b * b;
  return { re: g / d, im: -b / d };
};

/** Divider readings (behind `resistance`) for an impedance function, with optional relative noise. */
function readings(
  z: (f: number) => { re: number; im: number },
  frequencies: number[],
  { noise = 0, seed = 1, resistance = R } = {},
): SweepPoint[] {
  const rng = createSeededRandom(seed);
  return frequencies.map((frequency) => {
    const v = z(frequency);
    const clean = (VIN * Math.hypot(v.re, v.im)) / Math.hypot(resistance + v.re, v.im);
    return { frequency, amplitude: Math.abs(clean * (1 + noise * rng.normal())) };
  });
}

describe("analyzeSweep on synthetic coils", () => {
  const model = createLineModel({
    firstSeriesResonance: 180e3,
    characteristicImpedance: 5e3,
    topCapacitance: 12e-12,
    dispersionExponent: 0.15,
    q: 40,
  });
  // Band edges chosen between resonances so every true extremum inside is bracketed by data.
  const fLow = 70e3;
  const fHigh = 1.9e6;
  const truth = trueExtrema(model, fLow, fHigh);

  it("has several series and parallel resonances to find", () => {
    expect(truth.series.length).toBeGreaterThanOrEqual(5);
    expect(truth.parallel.length).toBeGreaterThanOrEqual(5);
  });

  it("finds every resonance, and only those, at a small fraction of their spacing", () => {
    for (const [count, noise, seed] of [
      [400, 0.005, 1],
      [3_000, 0.01, 2],
      [20_000, 0.03, 3],
    ] as const) {
      const points = simulateSweep({
        model,
        seriesResistance: R,
        sourceAmplitude: VIN,
        frequencies: unevenFrequencies(count, fLow, fHigh, seed),
        noise: { relative: noise },
        rng: createSeededRandom(seed + 10),
      });
      const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
      expect(result.seriesResonances.length).toBe(truth.series.length);
      expect(result.parallelResonances.length).toBe(truth.parallel.length);
      for (const [found, expected] of [
        [result.seriesResonances, truth.series],
        [result.parallelResonances, truth.parallel],
      ] as const) {
        found.forEach((r, i) => {
          const t = expected[i];
          if (t === undefined) throw new Error("count mismatch");
          const spacing = (truth.series[1]?.frequency ?? 0) - (truth.series[0]?.frequency ?? 0);
          expect(Math.abs(r.frequency - t.frequency) / spacing).toBeLessThan(0.01);
          if (i > 0) expect(r.frequency).toBeGreaterThan(found[i - 1]?.frequency ?? 0);
        });
      }
      // series |Z| is read well; parallel peaks sit at readings near Vin, where noise costs more
      result.seriesResonances.forEach((r, i) => {
        expect(Math.abs(r.impedance / (truth.series[i]?.impedance ?? 1) - 1)).toBeLessThan(0.1);
      });
      result.parallelResonances.forEach((r, i) => {
        expect(Math.abs(r.impedance / (truth.parallel[i]?.impedance ?? 1) - 1)).toBeLessThan(0.3);
      });
      if (count >= 3_000) {
        // dense enough that the curve is locally straight between neighbours (noise-estimate.ts)
        expect(result.readingNoise.relative / noise).toBeGreaterThan(0.85);
        expect(result.readingNoise.relative / noise).toBeLessThan(1.2);
      }
    }
  });

  it("gives the same answer whatever the order of the readings", () => {
    const points = simulateSweep({
      model,
      seriesResistance: R,
      sourceAmplitude: VIN,
      frequencies: unevenFrequencies(1_000, fLow, fHigh, 4),
      noise: { relative: 0.01 },
      rng: createSeededRandom(5),
    });
    const shuffled = [...points];
    const rng = createSeededRandom(6);
    for (let i = shuffled.length - 1; i > 0; i--) {
      const j = Math.floor(rng.uniform() * (i + 1));
      [shuffled[i], shuffled[j]] = [shuffled[j] as SweepPoint, shuffled[i] as SweepPoint];
    }
    expect(analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: shuffled })).toEqual(
      analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points }),
    );
  });

  it("never reports a noise wiggle as a resonance, over many seeds and noise levels", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 ** 31 }),
        // up to 3 %: the highest parallel peak reads 0.85·Vin, and a reading ≥ Vin is refused
        fc.double({ min: 0.001, max: 0.03, noNaN: true }),
        fc.integer({ min: 150, max: 2_500 }),
        (seed, noise, count) => {
          const points = simulateSweep({
            model,
            seriesResistance: R,
            sourceAmplitude: VIN,
            frequencies: unevenFrequencies(count, fLow, fHigh, seed),
            noise: { relative: noise, absolute: noise * 0.01 },
            rng: createSeededRandom(seed ^ 0x5a5a),
          });
          const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
          expect(result.seriesResonances.length).toBeLessThanOrEqual(truth.series.length);
          expect(result.parallelResonances.length).toBeLessThanOrEqual(truth.parallel.length);
          for (const r of result.seriesResonances) {
            const t = truth.series[nearest(truth.series, r.frequency)];
            expect(Math.abs(r.frequency / (t?.frequency ?? 0) - 1)).toBeLessThan(0.05);
          }
          for (const r of result.parallelResonances) {
            const t = truth.parallel[nearest(truth.parallel, r.frequency)];
            expect(Math.abs(r.frequency / (t?.frequency ?? 0) - 1)).toBeLessThan(0.05);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it("is not fooled by the scope's noise floor at the bottom of deep dips", () => {
    // high-Q dips reach some tens of mV of 20 V, where a fixed floor is a large part of the reading
    const models = [80, 150].map((q) => {
      const model = createLineModel({
        firstSeriesResonance: 180e3,
        characteristicImpedance: 5e3,
        topCapacitance: 12e-12,
        dispersionExponent: 0.15,
        q,
      });
      return { model, truth: trueExtrema(model, fLow, fHigh) };
    });
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 ** 31 }),
        fc.constantFrom(300, 1_000, 5_000, 20_000),
        fc.constantFrom(0, 1),
        fc.double({ min: 0.002, max: 0.012, noNaN: true }),
        fc.double({ min: 0, max: 0.02, noNaN: true }),
        (seed, count, which, relative, absolute) => {
          const { model: sharp, truth: sharpTruth } = models[which] as (typeof models)[number];
          const points = simulateSweep({
            model: sharp,
            seriesResistance: R,
            sourceAmplitude: VIN,
            frequencies: unevenFrequencies(count, fLow, fHigh, seed),
            noise: { relative, absolute },
            rng: createSeededRandom(seed + 1),
          });
          const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
          expect(result.seriesResonances.length).toBeLessThanOrEqual(sharpTruth.series.length);
          expect(result.parallelResonances.length).toBeLessThanOrEqual(sharpTruth.parallel.length);
          const all = [...sharpTruth.series, ...sharpTruth.parallel];
          for (const r of [...result.seriesResonances, ...result.parallelResonances]) {
            const t = all[nearest(all, r.frequency)];
            expect(Math.abs(r.frequency / (t?.frequency ?? 0) - 1)).toBeLessThan(0.02);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it("stays quiet on hand-style sweeps of a tall coil whose readings sit mostly near Vin", () => {
    // 400 jittered log steps from f₁/2 to 4f₁, Z0 ≫ R: only a few samples reach the deep, sharp dip,
    // and the noise estimate must not let the many high readings make it too small
    const f1 = 400e3;
    for (let seed = 0; seed < 300; seed++) {
      const rng = createSeededRandom(seed);
      const tall = createLineModel({
        firstSeriesResonance: f1,
        characteristicImpedance: 65e3,
        topCapacitance: 4e-12,
        dispersionExponent: 0.12,
        q: 70 + 50 * rng.uniform(),
      });
      const frequencies = Array.from({ length: 400 }, (_, i) => {
        const jitter = i === 0 || i === 399 ? 0 : (rng.uniform() - 0.5) * 0.6;
        return f1 * 0.5 * 8 ** ((i + jitter) / 399);
      });
      const points = simulateSweep({
        model: tall,
        seriesResistance: 22e3,
        sourceAmplitude: VIN,
        frequencies,
        noise: { relative: 0.008, absolute: 0.002 },
        rng,
      }).map((p) => ({ ...p, amplitude: Math.min(p.amplitude, 0.995 * VIN) }));
      const result = analyzeSweep({ seriesResistance: 22e3, sourceAmplitude: VIN, points });
      // the band holds the first two series and first parallel resonance at most
      expect(result.seriesResonances.length).toBeLessThanOrEqual(2);
      expect(result.parallelResonances.length).toBeLessThanOrEqual(2);
      expect(Math.abs((result.seriesResonances[0]?.frequency ?? 0) / f1 - 1)).toBeLessThan(0.01);
    }
  });

  it("recognises a noise floor for what it is in a dense sweep", () => {
    const sharp = createLineModel({ firstSeriesResonance: 180e3, characteristicImpedance: 5e3, topCapacitance: 12e-12, dispersionExponent: 0.15, q: 150 });
    const points = simulateSweep({
      model: sharp,
      seriesResistance: R,
      sourceAmplitude: VIN,
      frequencies: unevenFrequencies(20_000, fLow, fHigh, 21),
      noise: { relative: 0.003, absolute: 0.01 },
      rng: createSeededRandom(22),
    });
    const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
    expect(result.seriesResonances.length).toBe(trueExtrema(sharp, fLow, fHigh).series.length);
    expect(result.readingNoise.absolute / 0.01).toBeGreaterThan(0.7);
    expect(result.readingNoise.absolute / 0.01).toBeLessThan(1.4);
    expect(result.readingNoise.relative / 0.003).toBeGreaterThan(0.7);
    expect(result.readingNoise.relative / 0.003).toBeLessThan(1.4);
  });

  it("finds nothing in a resistor, a capacitor or an inductor, however noisy", () => {
    // derived: |Z| of a single R, C or L has no extremum, so every reported one would be noise
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 ** 31 }),
        fc.double({ min: 0.0005, max: 0.1, noNaN: true }),
        fc.constantFrom("resistor", "capacitor", "inductor"),
        (seed, noise, part) => {
          const z =
            part === "resistor"
              ? () => ({ re: 15e3, im: 0 })
              : part === "capacitor"
                ? (f: number) => ({ re: 0, im: -1 / (2 * Math.PI * f * 330e-12) })
                : (f: number) => ({ re: 0, im: 2 * Math.PI * f * 1e-3 });
          const points = readings(z, unevenFrequencies(2_000, 50e3, 2e6, seed), { noise, seed: seed + 1 });
          const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
          expect(result.seriesResonances).toEqual([]);
          expect(result.parallelResonances).toEqual([]);
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe("analyzeSweep Q", () => {
  it("matches the analytic Q of a bare lossy line where the bandwidth is resolved", () => {
    // derived: each resonance of the bare line has Q = ω·β′/(2α) = q to first order in αℓ
    const q = 60;
    const model = createLineModel({ firstSeriesResonance: 200e3, characteristicImpedance: 8e3, dispersionExponent: 0.1, q });
    const points = simulateSweep({
      model,
      seriesResistance: R,
      sourceAmplitude: VIN,
      frequencies: unevenFrequencies(20_000, 120e3, 900e3, 8),
      noise: { relative: 0.005 },
      rng: createSeededRandom(9),
    });
    const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
    // the first three series and two parallel resonances lie in the band, with αℓ ≤ 0.08
    expect(result.seriesResonances.length).toBe(3);
    expect(result.parallelResonances.length).toBe(2);
    for (const r of result.seriesResonances) {
      expect(r.q).toBeDefined();
      expect(Math.abs((r.q ?? 0) / q - 1)).toBeLessThan(0.05);
    }
    // parallel peaks read close to Vin, where the bandwidth is harder to pin: at least one resolved
    const parallelQs = result.parallelResonances.flatMap((r) => (r.q === undefined ? [] : [r.q]));
    expect(parallelQs.length).toBeGreaterThanOrEqual(1);
    for (const value of parallelQs) expect(Math.abs(value / q - 1)).toBeLessThan(0.08);
  });

  it("reads Q from the resonance itself, not from the divider output at √2 × its minimum", () => {
    // textbook series RLC: Q = ω₀L/Rs; with R only a few times Rs the √2-reading method is far off
    // (docs/references.md, "Sweeps through a series resistor")
    const rs = 1_000;
    const l = 10e-3;
    const c = 100e-12;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(l * c));
    const qTrue = (2 * Math.PI * f0 * l) / rs; // 10
    const resistance = 1_000; // the divider's R, no larger than Rs
    const frequencies = unevenFrequencies(3_000, f0 * 0.7, f0 * 1.4, 12);
    const points = readings(seriesRlc(rs, l, c), frequencies, { resistance });
    const result = analyzeSweep({ seriesResistance: resistance, sourceAmplitude: VIN, points });
    expect(result.seriesResonances.length).toBe(1);
    const found = result.seriesResonances[0];
    // at Q = 10 the reactance is visibly non-linear across the band: allow 3 % of the bandwidth
    expect(Math.abs((found?.frequency ?? 0) / f0 - 1)).toBeLessThan(3e-3);
    expect(Math.abs((found?.impedance ?? 0) / rs - 1)).toBeLessThan(0.01);
    expect(Math.abs((found?.q ?? 0) / qTrue - 1)).toBeLessThan(0.03);
    // the naive reading: bandwidth where Vout = √2 × its minimum
    const minimum = Math.min(...points.map((p) => p.amplitude));
    const above = points.filter((p) => p.amplitude <= Math.SQRT2 * minimum);
    const naiveQ = f0 / ((above.at(-1)?.frequency ?? 0) - (above[0]?.frequency ?? 0));
    expect(Math.abs(naiveQ / qTrue - 1)).toBeGreaterThan(0.1);
  });

  it("reads the Q and peak impedance of a parallel resonance", () => {
    // textbook parallel RLC: Q = Rp/(ω₀L)
    const rp = 100_000;
    const l = 1e-3;
    const c = 250e-12;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(l * c));
    const qTrue = rp / (2 * Math.PI * f0 * l); // 50
    const points = readings(parallelRlc(rp, l, c), unevenFrequencies(4_000, f0 * 0.8, f0 * 1.25, 13), { noise: 0.002, seed: 14 });
    const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points });
    expect(result.seriesResonances).toEqual([]);
    expect(result.parallelResonances.length).toBe(1);
    const found = result.parallelResonances[0];
    expect(Math.abs((found?.frequency ?? 0) / f0 - 1)).toBeLessThan(1e-3);
    expect(Math.abs((found?.impedance ?? 0) / rp - 1)).toBeLessThan(0.03);
    expect(Math.abs((found?.q ?? 0) / qTrue - 1)).toBeLessThan(0.05);
  });

  it("leaves Q out when the sweep is too coarse to bracket the half-power points", () => {
    const rs = 500;
    const l = 10e-3;
    const c = 100e-12;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(l * c)); // Q ≈ 20, half-power band ±2.5 %
    const frequencies = unevenFrequencies(30, f0 * 0.5, f0 * 1.6, 15);
    const result = analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: readings(seriesRlc(rs, l, c), frequencies) });
    expect(result.seriesResonances.length).toBe(1);
    expect(result.seriesResonances[0]?.q).toBeUndefined();
    expect(Math.abs((result.seriesResonances[0]?.frequency ?? 0) / f0 - 1)).toBeLessThan(0.03);
  });
});

describe("analyzeSweep on broad resonances (Q 5–10), coarse uneven steps, seeded noise", () => {
  // Exact series-RLC and parallel-RLC impedances behind the series resistor (docs/references.md,
  // "Sweeps through a series resistor": the divider reading is exact for a known Z), 30 readings
  // over 0.5–1.8 × f0 with steps between 0.3× and 1.7× the mean (about 4 % of f0 each), 1 % noise.
  const f0 = 250e3;
  const w0 = 2 * Math.PI * f0;
  const seeds = Array.from({ length: 200 }, (_, i) => 1_000 + i);
  const cases = [
    { kind: "series" as const, q: 5 },
    { kind: "series" as const, q: 10 },
    { kind: "parallel" as const, q: 5 },
    { kind: "parallel" as const, q: 10 },
  ];
  for (const { kind, q } of cases) {
    it(`locates a ${kind} resonance at Q = ${q} closer than the raw extreme sample, with an honest standard error`, () => {
      const resistance = kind === "series" ? 2_000 : 20_000;
      let impedance: (f: number) => { re: number; im: number };
      if (kind === "series") {
        const rs = 200;
        const l = (q * rs) / w0; // Q = ω0·L/Rs
        impedance = seriesRlc(rs, l, 1 / (w0 * w0 * l));
      } else {
        const rp = 20_000;
        const l = rp / (q * w0); // Q = Rp/(ω0·L)
        impedance = parallelRlc(rp, l, 1 / (w0 * w0 * l));
      }
      let fitError = 0;
      let sampleError = 0;
      let fitCloser = 0;
      let withinOne = 0;
      let withinThree = 0;
      for (const seed of seeds) {
        const points = readings(impedance, unevenFrequencies(30, 0.5 * f0, 1.8 * f0, seed), { noise: 0.01, seed: seed + 7, resistance });
        const result = analyzeSweep({ seriesResistance: resistance, sourceAmplitude: VIN, points });
        const found = kind === "series" ? result.seriesResonances : result.parallelResonances;
        const other = kind === "series" ? result.parallelResonances : result.seriesResonances;
        expect(found.length).toBe(1);
        expect(other).toEqual([]);
        const resonance = found[0] as (typeof found)[number];
        const extreme = points.reduce((best, p) =>
          (kind === "series" ? p.amplitude < best.amplitude : p.amplitude > best.amplitude) ? p : best,
        );
        const error = Math.abs(resonance.frequency - f0);
        fitError += error;
        sampleError += Math.abs(extreme.frequency - f0);
        if (error < Math.abs(extreme.frequency - f0)) fitCloser++;
        const standardError = resonance.frequencyStandardError;
        expect(standardError).toBeGreaterThan(0);
        if (error <= (standardError ?? 0)) withinOne++;
        if (error <= 3 * (standardError ?? 0)) withinThree++;
      }
      // closer than the raw sample on average, and in most sweeps
      expect(fitError).toBeLessThan(0.2 * sampleError);
      expect(fitCloser / seeds.length).toBeGreaterThan(0.75);
      // coverage: a Gaussian error lies within 1σ 68 % and within 3σ 99.7 % of the time (textbook)
      expect(withinThree / seeds.length).toBeGreaterThanOrEqual(0.95);
      expect(withinOne / seeds.length).toBeGreaterThan(0.5);
      expect(withinOne / seeds.length).toBeLessThan(0.98); // an inflated error would cover everything
    });
  }
});

describe("analyzeSweep input checks", () => {
  const ok = (frequency: number, amplitude = 5): SweepPoint => ({ frequency, amplitude });
  const fieldOf = (call: () => unknown) => {
    try {
      call();
    } catch (error) {
      expect(error).toBeInstanceOf(CalcInputError);
      return (error as CalcInputError).field;
    }
    throw new Error("expected a CalcInputError");
  };

  it("names the offending reading by its index as given", () => {
    const points = Array.from({ length: 20 }, (_, i) => ok(1e3 * (i + 1)));
    const bad = (i: number, p: SweepPoint) => points.map((q, k) => (k === i ? p : q));
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: bad(12, ok(-5)) }))).toBe(
      "points[12].frequency",
    );
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: bad(3, ok(Number.NaN)) }))).toBe(
      "points[3].frequency",
    );
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: bad(7, ok(7.5e3, 20)) }))).toBe(
      "points[7].amplitude",
    );
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: bad(5, ok(6e3, 0)) }))).toBe(
      "points[5].amplitude",
    );
    expect(
      fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: bad(9, ok(Number.POSITIVE_INFINITY)) })),
    ).toBe("points[9].frequency");
  });

  it("refuses duplicate frequencies, in or out of order", () => {
    const points = [ok(3e3), ok(1e3), ok(2e3), ok(1e3, 4)];
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points }))).toBe("points[3].frequency");
    const sortedDup = [ok(1e3), ok(2e3), ok(2e3, 4), ok(3e3)];
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: sortedDup }))).toBe(
      "points[2].frequency",
    );
  });

  it("refuses too few readings and impossible set-ups", () => {
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: VIN, points: [ok(1e3), ok(2e3)] }))).toBe("points");
    expect(fieldOf(() => analyzeSweep({ seriesResistance: 0, sourceAmplitude: VIN, points: [ok(1), ok(2), ok(3)] }))).toBe(
      "seriesResistance",
    );
    expect(fieldOf(() => analyzeSweep({ seriesResistance: R, sourceAmplitude: -1, points: [ok(1), ok(2), ok(3)] }))).toBe(
      "sourceAmplitude",
    );
  });
});
