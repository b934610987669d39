import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { awgDiameter, copperResistivity, skinDepth, wireAcResistance, wireDcResistance } from "./wire";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);
const INCH = 0.0254;

describe("AWG diameter", () => {
  it("pins AWG 36 at 0.005 in and AWG 0000 at 0.46 in", () => {
    // ASTM B258: the two defining sizes of the gauge (0.127 mm = 0.005 in, and 0.4600 in).
    expect(relativeError(awgDiameter(36), 0.127e-3)).toBeLessThan(1e-15);
    expect(relativeError(awgDiameter(-3), 0.46 * INCH)).toBeLessThan(1e-14);
    expect(awgDiameter("0000")).toBe(awgDiameter(-3));
    expect(awgDiameter("4/0")).toBe(awgDiameter(-3));
  });

  it("agrees with the standard's rounded table to within its rounding", () => {
    // ASTM B258 table values in inches to 0.0001 in (from memory). The table is rounded (docs/references.md: up to about
    // 0.3 % off the formula), so each entry must match to half a unit in its last place, 0.00005 in.
    const table: [number, number][] = [
      [10, 0.1019],
      [20, 0.032],
      [24, 0.0201],
      [28, 0.0126],
      [30, 0.01],
    ];
    for (const [gauge, inches] of table) expect(Math.abs(awgDiameter(gauge) / INCH - inches)).toBeLessThanOrEqual(0.00005);
    // AWG 28 ≈ 0.321 mm (ASTM B258 metric column, from memory), to half a unit in the last place.
    expect(Math.abs(awgDiameter("28") - 0.321e-3)).toBeLessThanOrEqual(0.0005e-3);
  });

  it("doubles the diameter about every six gauges", () => {
    // common practice: six gauges down doubles the diameter (92^(6/39) = 2.005, within 0.3 % of 2).
    fc.assert(
      fc.property(fc.integer({ min: -3, max: 50 }), (n) => {
        expect(relativeError(awgDiameter(n) / awgDiameter(n + 6), 2)).toBeLessThan(0.003);
      }),
    );
  });

  it("refuses sizes outside 0000..56 and non-integers", () => {
    expect(() => awgDiameter(57)).toThrow(CalcInputError);
    expect(() => awgDiameter(-4)).toThrow(/^gauge:/);
    expect(() => awgDiameter(24.5)).toThrow(/^gauge:/);
    expect(() => awgDiameter("00000")).toThrow(/^gauge:/);
    expect(() => awgDiameter("twenty")).toThrow(/^gauge:/);
    expect(awgDiameter("7")).toBe(awgDiameter(7));
  });
});

describe("copper resistivity", () => {
  it("is 1/58 Ω·mm²/m at 20 °C", () => {
    // IEC 60028, annealed copper standard.
    expect(relativeError(copperResistivity(20), 1 / 58 / 1e6)).toBeLessThan(1e-15);
  });

  it("rises about 0.4 %/K", () => {
    // docs/references.md: "about 0.4 %/K" (confirmed); α = 0.00393 /K from memory.
    const perKelvin = (copperResistivity(70) / copperResistivity(20) - 1) / 50;
    expect(perKelvin).toBeGreaterThan(0.0038);
    expect(perKelvin).toBeLessThan(0.0041);
  });

  it("refuses temperatures outside −100..250 °C", () => {
    expect(() => copperResistivity(400)).toThrow(/^temperatureC:/);
  });
});

describe("skin depth", () => {
  it("is about 8.5 mm in copper at 60 Hz and about 66 µm at 1 MHz", () => {
    // Textbook values (from memory): ≈ 8.4–8.5 mm at 60 Hz and 65–66 µm at 1 MHz. Annealed copper (IEC 60028,
    // 1.724e-8 Ω·m) sits slightly above the 1.68e-8 Ω·m that many textbooks use, hence the upper bounds.
    expect(skinDepth(60)).toBeGreaterThan(8.4e-3);
    expect(skinDepth(60)).toBeLessThan(8.6e-3);
    expect(skinDepth(1e6)).toBeGreaterThan(65e-6);
    expect(skinDepth(1e6)).toBeLessThan(66.5e-6);
  });

  it("falls as 1/√f and with permeability", () => {
    // Exact from δ = √(ρ/(π f μ0 μr)).
    expect(relativeError(skinDepth(4e5), skinDepth(1e5) / 2)).toBeLessThan(1e-15);
    expect(relativeError(skinDepth(1e5, 1e-7, 100), skinDepth(1e5, 1e-7) / 10)).toBeLessThan(1e-15);
  });

  it("refuses non-positive frequency", () => {
    expect(() => skinDepth(0)).toThrow(/^frequency:/);
  });
});

describe("wire resistance", () => {
  it("gives about 84.2 Ω/km for AWG 24 copper at DC", () => {
    // Standard wire tables (from memory): AWG 24 annealed copper ≈ 84.2 Ω/km (25.7 Ω/1000 ft) at 20 °C.
    expect(wireDcResistance({ length: 1000, diameter: awgDiameter(24) })).toBeCloseTo(84.2, 1);
  });

  it("equals DC while the skin depth exceeds the radius and meets it continuously at δ = d/2", () => {
    // Exact: ρ/(π δ (d − δ)) at δ = d/2 is 4ρ/(π d²), the DC value.
    const diameter = 0.5e-3;
    const crossover = 1.7241e-8 / (Math.PI * 4e-7 * Math.PI * (diameter / 2) ** 2);
    const dc = wireDcResistance({ length: 100, diameter });
    expect(wireAcResistance({ length: 100, diameter, frequency: crossover * 0.5 })).toBe(dc);
    expect(relativeError(wireAcResistance({ length: 100, diameter, frequency: crossover * (1 + 1e-9) }), dc)).toBeLessThan(1e-8);
    expect(wireAcResistance({ length: 100, diameter, frequency: 0 })).toBe(dc);
  });

  it("is never below DC and approaches ρℓ/(π d δ) for a thin skin", () => {
    // Exact: δ(d − δ) ≤ d²/4; for δ ≪ d the annulus is a strip of width π d and depth δ.
    fc.assert(
      fc.property(fc.double({ min: 0.05e-3, max: 3e-3, noNaN: true }), fc.double({ min: 1e3, max: 3e7, noNaN: true }), (diameter, frequency) => {
        const ac = wireAcResistance({ length: 10, diameter, frequency });
        expect(ac).toBeGreaterThanOrEqual(wireDcResistance({ length: 10, diameter }) * (1 - 1e-12));
      }),
    );
    const delta = skinDepth(1e8);
    const ac = wireAcResistance({ length: 1, diameter: 2e-3, frequency: 1e8 });
    expect(relativeError(ac, 1.7241e-8 / (Math.PI * 2e-3 * delta))).toBeLessThan(delta / 2e-3 * 1.01);
  });

  it("refuses bad dimensions", () => {
    expect(() => wireDcResistance({ length: -1, diameter: 1e-3 })).toThrow(/^length:/);
    expect(() => wireAcResistance({ length: 1, diameter: 0, frequency: 1e5 })).toThrow(/^diameter:/);
    expect(() => wireAcResistance({ length: 1, diameter: 1e-3, frequency: -5 })).toThrow(/^frequency:/);
  });
});
