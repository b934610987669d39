import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { capacitanceForResonance, inductanceForResonance, resonantFrequency } from "./resonance";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);
const inductances = fc.double({ min: 1e-7, max: 1, noNaN: true });
const capacitances = fc.double({ min: 1e-13, max: 1e-6, noNaN: true });
const frequencies = fc.double({ min: 1e3, max: 1e8, noNaN: true });

describe("LC resonance", () => {
  it("puts 1 µH with 1 nF at 5.0329 MHz", () => {
    // Worked example by hand: 1/(2π√(1e-6 · 1e-9)) = 1/(2π · 3.16228e-8) = 5.03292 MHz.
    expect(resonantFrequency(1e-6, 1e-9)).toBeCloseTo(5.03292e6, -1);
  });

  it("makes ω²LC = 1 at resonance", () => {
    // Definition of series resonance: the reactances ωL and 1/(ωC) are equal.
    fc.assert(
      fc.property(inductances, capacitances, (l, c) => {
        const omega = 2 * Math.PI * resonantFrequency(l, c);
        expect(omega * omega * l * c).toBeCloseTo(1, 12);
      }),
    );
  });

  it("round-trips between frequency, capacitance and inductance", () => {
    // Exact algebraic inverses of f = 1/(2π√(LC)).
    fc.assert(
      fc.property(inductances, capacitances, frequencies, (l, c, f) => {
        expect(relativeError(capacitanceForResonance(l, resonantFrequency(l, c)), c)).toBeLessThan(1e-13);
        expect(relativeError(inductanceForResonance(c, resonantFrequency(l, c)), l)).toBeLessThan(1e-13);
        expect(relativeError(resonantFrequency(l, capacitanceForResonance(l, f)), f)).toBeLessThan(1e-13);
        expect(relativeError(resonantFrequency(inductanceForResonance(c, f), c), f)).toBeLessThan(1e-13);
      }),
    );
  });

  it("halves the frequency when the capacitance quadruples", () => {
    // Exact: f ∝ 1/√C.
    fc.assert(
      fc.property(inductances, capacitances, (l, c) => {
        expect(relativeError(resonantFrequency(l, 4 * c), resonantFrequency(l, c) / 2)).toBeLessThan(1e-14);
      }),
    );
  });

  it("refuses non-positive inputs", () => {
    expect(() => resonantFrequency(0, 1e-12)).toThrow(/^inductance:/);
    expect(() => resonantFrequency(1e-3, -1e-12)).toThrow(/^capacitance:/);
    expect(() => capacitanceForResonance(1e-3, 0)).toThrow(/^frequency:/);
    expect(() => inductanceForResonance(Number.NaN, 1e5)).toThrow(CalcInputError);
  });
});
