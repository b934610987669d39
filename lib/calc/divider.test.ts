import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { amplitudeOnlyOverstatement, dividerImpedance, impedanceFromDividerRatio } from "./divider";
import { CalcInputError } from "./errors";

/** Vout/Vin as a phasor for Z = re + j·im behind a series R: H = Z/(R + Z). */
function dividerPhasor(r: number, re: number, im: number): { re: number; im: number } {
  const dr = r + re;
  const den = dr * dr + im * im;
  return { re: (re * dr + im * im) / den, im: (im * dr - re * im) / den };
}

describe("dividerImpedance", () => {
  it("reads a higher series resonance of a coil behind 20 kΩ as about 1.6 kΩ", () => {
    // common practice: 20 kΩ series resistor, 20 V p-p in, about 1.5 V p-p across the coil
    const z = dividerImpedance({ seriesResistance: 20_000, sourceAmplitude: 20, measuredAmplitude: 1.5 });
    expect(z).toBeGreaterThan(1_500);
    expect(z).toBeLessThan(1_700);
  });

  it("reads a parallel resonance at about 17 V p-p of 20 V as roughly 110 kΩ", () => {
    // common practice: same bench set-up, about 17 V p-p across the coil at a parallel resonance
    const z = dividerImpedance({ seriesResistance: 20_000, sourceAmplitude: 20, measuredAmplitude: 17 });
    expect(z).toBeGreaterThan(100_000);
    expect(z).toBeLessThan(120_000);
  });

  it("agrees with the exact phasor relation Z = R·H/(1 − H) for resistive loads", () => {
    // derived (docs/references.md, "Sweeps through a series resistor"): invert H = Z/(R + Z) as a phasor
    const r = 4_700;
    for (const zTrue of [1, 47, 1_000, 4_700, 33_000, 1e6]) {
      const h = dividerPhasor(r, zTrue, 0);
      // Z = R·H/(1 − H), evaluated as complex arithmetic independent of the amplitude formula
      const oneMinus = { re: 1 - h.re, im: -h.im };
      const den = oneMinus.re ** 2 + oneMinus.im ** 2;
      const zRe = (r * (h.re * oneMinus.re + h.im * oneMinus.im)) / den;
      const zIm = (r * (h.im * oneMinus.re - h.re * oneMinus.im)) / den;
      expect(zRe).toBeCloseTo(zTrue, 6);
      expect(Math.abs(zIm)).toBeLessThan(1e-9 * zTrue);
      const m = Math.hypot(h.re, h.im);
      expect(dividerImpedance({ seriesResistance: r, sourceAmplitude: 1, measuredAmplitude: m })).toBeCloseTo(zTrue, 6);
    }
  });

  it("recovers |Z| of a reactive load exactly when its phase is given", () => {
    // derived: forward phasor computation of |Z/(R+Z)| for known complex Z, then the inverse formula
    const r = 1_000;
    const cases = [
      { re: 300, im: 400 },
      { re: 300, im: -400 },
      { re: 10, im: 5_000 },
      { re: 50_000, im: -20_000 },
      { re: 0, im: 700 },
    ];
    for (const z of cases) {
      const h = dividerPhasor(r, z.re, z.im);
      const m = Math.hypot(h.re, h.im);
      const phase = Math.atan2(z.im, z.re);
      const got = dividerImpedance({ seriesResistance: r, sourceAmplitude: 2, measuredAmplitude: 2 * m, phase });
      expect(got / Math.hypot(z.re, z.im)).toBeCloseTo(1, 10);
    }
  });

  it("shows why amplitudes alone are only exact at resonance", () => {
    // derived: at ±45° the amplitude-only formula misreads |Z|; with the phase it is exact
    const r = 1_000;
    const z = { re: 500, im: 500 };
    const m = Math.hypot(dividerPhasor(r, z.re, z.im).re, dividerPhasor(r, z.re, z.im).im);
    const amplitudeOnly = impedanceFromDividerRatio(r, m);
    const withPhase = impedanceFromDividerRatio(r, m, Math.PI / 4);
    expect(Math.abs(amplitudeOnly / Math.hypot(z.re, z.im) - 1)).toBeGreaterThan(0.05);
    expect(withPhase / Math.hypot(z.re, z.im)).toBeCloseTo(1, 10);
  });

  it("overstates |Z| off resonance, by at most 1/cos φ", () => {
    // derived: |R + Z| ≤ R + |Z| gives the lower bound; |Z| ≫ R approaches |Z|/cos φ
    fc.assert(
      fc.property(fc.double({ min: -1.5, max: 1.5, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (phase, logRatio) => {
        const r = 1_000;
        const magnitude = r * 10 ** logRatio;
        const h = dividerPhasor(r, magnitude * Math.cos(phase), magnitude * Math.sin(phase));
        const amplitudeOnly = impedanceFromDividerRatio(r, Math.hypot(h.re, h.im));
        expect(amplitudeOnly).toBeGreaterThanOrEqual(magnitude * (1 - 1e-9));
        expect(amplitudeOnly).toBeLessThanOrEqual((magnitude / Math.cos(phase)) * (1 + 1e-9));
      }),
    );
  });

  it("returns 0 Ω for a zero reading (a short)", () => {
    expect(dividerImpedance({ seriesResistance: 50, sourceAmplitude: 1, measuredAmplitude: 0 })).toBe(0);
  });

  it("refuses readings a passive divider cannot produce", () => {
    const call = () => dividerImpedance({ seriesResistance: 20_000, sourceAmplitude: 20, measuredAmplitude: 20 });
    expect(call).toThrowError(CalcInputError);
    try {
      call();
    } catch (error) {
      expect((error as CalcInputError).field).toBe("measuredAmplitude");
    }
    expect(() => dividerImpedance({ seriesResistance: 0, sourceAmplitude: 1, measuredAmplitude: 0.5 })).toThrow(
      /seriesResistance/,
    );
    expect(() => dividerImpedance({ seriesResistance: 10, sourceAmplitude: Number.NaN, measuredAmplitude: 0.5 })).toThrow(
      /sourceAmplitude/,
    );
    expect(() => dividerImpedance({ seriesResistance: 10, sourceAmplitude: 1, measuredAmplitude: -0.1 })).toThrow(
      /measuredAmplitude/,
    );
    expect(() =>
      dividerImpedance({ seriesResistance: 10, sourceAmplitude: 1, measuredAmplitude: 0.5, phase: 2 }),
    ).toThrow(/phase/);
  });
});

describe("amplitudeOnlyOverstatement", () => {
  it("is the amplitude-only reading over the true |Z| of a reactive load, never below 1", () => {
    // exact solution: the divider phasor H = Z/(R + Z) (docs/references.md, "Sweeps through a series resistor")
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        fc.double({ min: -1.55, max: 1.55, noNaN: true }),
        (magnitude, phase) => {
          const r = 10_000;
          const h = dividerPhasor(r, magnitude * Math.cos(phase), magnitude * Math.sin(phase));
          const m = Math.hypot(h.re, h.im);
          const amplitudeOnly = (r * m) / (1 - m);
          const factor = amplitudeOnlyOverstatement(m, phase);
          expect(factor).toBeCloseTo(amplitudeOnly / magnitude, 6);
          expect(factor).toBeGreaterThanOrEqual(1 - 1e-12);
          expect(factor).toBeLessThanOrEqual(1 / Math.cos(phase) + 1e-9);
        },
      ),
    );
  });

  it("tends to 1/cos φ when |Z| ≫ R and to 1 when |Z| ≪ R", () => {
    // derived: m → 1 gives 2/(2 cos φ); m → 0 gives 1/1
    const phase = Math.PI / 4;
    expect(amplitudeOnlyOverstatement(0.9999, phase)).toBeCloseTo(Math.SQRT2, 3);
    expect(amplitudeOnlyOverstatement(1e-4, phase)).toBeCloseTo(1, 3);
    expect(amplitudeOnlyOverstatement(0.5, 0)).toBe(1);
    expect(() => amplitudeOnlyOverstatement(1, phase)).toThrow(/ratio/);
    expect(() => amplitudeOnlyOverstatement(0.5, 2)).toThrow(/phase/);
  });
});
