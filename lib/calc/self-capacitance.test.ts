import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { MEDHURST_TABLE, medhurstH, medhurstSelfCapacitance } from "./self-capacitance";

describe("Medhurst's H", () => {
  it("reproduces every node of Medhurst's 1947 table exactly", () => {
    // Medhurst, Wireless Engineer 24, 1947 — the table as reproduced in docs/references.md.
    const table: [number, number][] = [
      [0.1, 0.96], [0.15, 0.79], [0.2, 0.7], [0.25, 0.64], [0.3, 0.6], [0.35, 0.57], [0.4, 0.54], [0.45, 0.52],
      [0.5, 0.5], [0.6, 0.48], [0.7, 0.47], [0.8, 0.46], [0.9, 0.46], [1.0, 0.46], [1.5, 0.47], [2.0, 0.5],
      [2.5, 0.56], [3.0, 0.61], [3.5, 0.67], [4.0, 0.72], [4.5, 0.77], [5.0, 0.81], [6.0, 0.92], [7.0, 1.01],
      [8.0, 1.12], [9.0, 1.22], [10, 1.32], [15, 1.86], [20, 2.36], [25, 2.9], [30, 3.4], [40, 4.6], [50, 5.8],
    ];
    expect(MEDHURST_TABLE.length).toBe(table.length);
    for (const [ratio, h] of table) expect(medhurstH(ratio)).toBeCloseTo(h, 14);
  });

  it("stays between the two neighbouring nodes everywhere", () => {
    // Shape preservation of PCHIP (Fritsch & Butland 1984) applied to Medhurst's table.
    fc.assert(
      fc.property(fc.integer({ min: 0, max: MEDHURST_TABLE.length - 2 }), fc.double({ min: 0, max: 1, noNaN: true }), (i, s) => {
        const [x0, y0] = MEDHURST_TABLE[i]!;
        const [x1, y1] = MEDHURST_TABLE[i + 1]!;
        const h = medhurstH(x0 + s * (x1 - x0));
        expect(h).toBeGreaterThanOrEqual(Math.min(y0, y1) - 1e-15);
        expect(h).toBeLessThanOrEqual(Math.max(y0, y1) + 1e-15);
      }),
    );
  });

  it("matches SciPy's PCHIP through the same table in log(ℓ/D)", () => {
    // Reference library: SciPy 1.17.1 scipy.interpolate.PchipInterpolator(log(ℓ/D), H), evaluated independently.
    const reference: [number, number][] = [
      [0.12, 0.8772380535339774],
      [0.85, 0.46],
      [1.2, 0.4623823838852556],
      [3.3, 0.6463559529985006],
      [4.25, 0.7457282568854191],
      [5.5, 0.8645639157214591],
      [12, 1.5400657387003327],
      [45, 5.2007515279697545],
    ];
    for (const [ratio, h] of reference) expect(medhurstH(ratio)).toBeCloseTo(h, 12);
  });

  it("refuses ratios outside Medhurst's 0.1–50", () => {
    // Medhurst 1947 measured 0.1 ≤ ℓ/D ≤ 50; docs/references.md: refuse outside.
    expect(() => medhurstH(0.0999)).toThrow(CalcInputError);
    expect(() => medhurstH(50.01)).toThrow(CalcInputError);
    expect(() => medhurstH(Number.NaN)).toThrow(CalcInputError);
  });
});

describe("Medhurst self-capacitance", () => {
  it("is H times the diameter in centimetres, in picofarads", () => {
    // Medhurst 1947: C[pF] = H·D[cm]; at ℓ/D = 4, H = 0.72 (table node), D = 10 cm → 7.2 pF.
    expect(medhurstSelfCapacitance({ diameter: 0.1, length: 0.4 })).toBeCloseTo(7.2e-12, 24);
    // Table node ℓ/D = 1, H = 0.46; D = 25 cm → 11.5 pF.
    expect(medhurstSelfCapacitance({ diameter: 0.25, length: 0.25 })).toBeCloseTo(11.5e-12, 24);
  });

  it("scales linearly with size at a fixed ℓ/D", () => {
    // Exact from C = H(ℓ/D)·D.
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: 0.1, max: 50, noNaN: true }), fc.double({ min: 1.5, max: 10, noNaN: true }), (d, ratio, factor) => {
        const base = medhurstSelfCapacitance({ diameter: d, length: d * ratio });
        const scaled = medhurstSelfCapacitance({ diameter: d * factor, length: d * ratio * factor });
        expect(scaled / base).toBeCloseTo(factor, 9);
      }),
    );
  });

  it("accepts table ends reached through floating-point division", () => {
    // 0.01/0.1 evaluates to 0.09999999999999999 in binary floating point.
    expect(medhurstSelfCapacitance({ diameter: 0.1, length: 0.01 })).toBeCloseTo(0.96 * 10 * 1e-12, 24);
  });

  it("refuses coils outside the table, naming the length", () => {
    expect(() => medhurstSelfCapacitance({ diameter: 0.1, length: 6 })).toThrow(/^length:/);
    expect(() => medhurstSelfCapacitance({ diameter: 0.1, length: 0.005 })).toThrow(CalcInputError);
    expect(() => medhurstSelfCapacitance({ diameter: 0, length: 0.3 })).toThrow(/diameter/);
  });
});
