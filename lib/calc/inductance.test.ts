import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { nagaokaCoefficient, solenoidInductance, wheelerInductance } from "./inductance";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

/**
 * Independent check: R. Lundin, "A handbook formula for the inductance of a single-layer circular coil",
 * Proc. IEEE 73(9), 1985 — a rational/logarithmic closed form within a few ppm of the exact coefficient.
 * Coefficients from memory; their ppm agreement with the elliptic-integral form below is itself the check.
 */
function lundinCoefficient(diameter: number, length: number): number {
  const f1 = (x: number) => (1 + 0.383901 * x + 0.017108 * x * x) / (1 + 0.258952 * x);
  const f2 = (x: number) => 0.093842 * x + 0.002029 * x * x - 0.000801 * x * x * x;
  if (diameter <= length) {
    const x = diameter / length;
    return f1(x * x) - (4 * x) / (3 * Math.PI);
  }
  const y = length / diameter;
  return ((2 * y) / Math.PI) * ((Math.log(4 / y) - 0.5) * f1(y * y) + f2(y * y));
}

describe("Nagaoka's coefficient", () => {
  it("is 0.6884 for a coil as long as it is wide", () => {
    // Nagaoka / Rosa & Grover 1916 value, quoted in docs/references.md: K = 0.6884 at D = ℓ.
    expect(nagaokaCoefficient(1, 1)).toBeCloseTo(0.6884, 4);
  });

  it("matches a 30-digit evaluation of the same elliptic form (1e-13 for ℓ/D ≥ 0.1)", () => {
    // Reference library: mpmath 1.3.0 (ellipk/ellipe at 30 digits) evaluating Nagaoka's formula, D = 1.
    // Very short coils lose digits in E − k (both ≈ 1), hence the looser tolerance below ℓ/D = 0.1.
    const cases: [number, number, number][] = [
      [0.001, 0.00496184678748983735, 1e-10],
      [0.01, 0.03496024577411498634, 1e-11],
      [0.1, 0.2033235175219133156, 1e-13],
      [0.5, 0.52551002425192747597, 1e-13],
      [1, 0.68842260732037668632, 1e-13],
      [4, 0.90164932997743983151, 1e-13],
      [100, 0.99576836802797100698, 1e-13],
      [10000, 0.99995755993184215968, 1e-13],
    ];
    for (const [lengthOverDiameter, expected, tolerance] of cases) {
      expect(relativeError(nagaokaCoefficient(1, lengthOverDiameter), expected)).toBeLessThan(tolerance);
    }
  });

  it("agrees with Lundin's 1985 handbook formula within a few ppm from ℓ/D = 0.01 to 1000", () => {
    // Lundin, Proc. IEEE 73(9), 1985 (confirmed in docs/references.md to be within a few ppm of the exact K).
    fc.assert(
      fc.property(fc.double({ min: -2, max: 3, noNaN: true }), (log10Ratio) => {
        const lengthOverDiameter = 10 ** log10Ratio;
        const exact = nagaokaCoefficient(0.1, 0.1 * lengthOverDiameter);
        expect(relativeError(exact, lundinCoefficient(0.1, 0.1 * lengthOverDiameter))).toBeLessThan(5e-6);
      }),
    );
  });

  it("tends to 1 − 4D/(3πℓ) for long coils and hence to 1", () => {
    // Exact asymptote of Nagaoka's formula for k → 0 (series of K and E, A&S 17.3.11–12, from memory): K ≈ 1 − 4D/(3πℓ) + O((D/ℓ)²).
    for (const lengthOverDiameter of [1e2, 1e3, 1e4, 1e6]) {
      const x = 1 / lengthOverDiameter;
      expect(Math.abs(nagaokaCoefficient(1, lengthOverDiameter) - (1 - (4 * x) / (3 * Math.PI)))).toBeLessThan(x * x);
    }
    expect(nagaokaCoefficient(1, 1e8)).toBeCloseTo(1, 8);
  });

  it("falls monotonically as D/ℓ grows and stays within (0, 1)", () => {
    // Physical property of the current-sheet model: end effects grow with D/ℓ (Rosa & Grover 1916 tables are monotone).
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 3, noNaN: true }),
        fc.double({ min: 1e-6, max: 0.5, noNaN: true }),
        (log10Ratio, step) => {
          const shorter = 10 ** log10Ratio;
          const longer = shorter * (1 + step);
          const kShort = nagaokaCoefficient(1, shorter);
          expect(kShort).toBeGreaterThan(0);
          expect(kShort).toBeLessThan(1);
          expect(nagaokaCoefficient(1, longer)).toBeGreaterThan(kShort);
        },
      ),
    );
  });

  it("depends only on the ratio D/ℓ", () => {
    // Exact: K is dimensionless and a function of D/ℓ alone.
    expect(relativeError(nagaokaCoefficient(0.07, 0.28), nagaokaCoefficient(7, 28))).toBeLessThan(1e-14);
  });

  it("refuses non-positive or non-finite dimensions", () => {
    expect(() => nagaokaCoefficient(0, 1)).toThrow(CalcInputError);
    expect(() => nagaokaCoefficient(1, -1)).toThrow(/length/);
    expect(() => nagaokaCoefficient(Number.POSITIVE_INFINITY, 1)).toThrow(/diameter/);
  });
});

describe("solenoid inductance", () => {
  it("reduces to μ0 N² A/ℓ times K", () => {
    // Exact definition of the current-sheet model; check against the infinite-solenoid formula × K.
    const geometry = { diameter: 0.1, length: 0.4, turns: 1000 };
    const infiniteSolenoid = (4e-7 * Math.PI * 1000 ** 2 * Math.PI * 0.05 ** 2) / 0.4;
    expect(relativeError(solenoidInductance(geometry), infiniteSolenoid * nagaokaCoefficient(0.1, 0.4))).toBeLessThan(1e-14);
  });

  it("scales as N² and linearly with size", () => {
    // Exact scaling of L = K μ0 π a² N²/ℓ: K depends on D/ℓ only, so L ∝ N² and L ∝ size.
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        fc.double({ min: 0.01, max: 2, noNaN: true }),
        fc.double({ min: 1, max: 5000, noNaN: true }),
        fc.double({ min: 1.01, max: 10, noNaN: true }),
        (diameter, length, turns, factor) => {
          const base = solenoidInductance({ diameter, length, turns });
          // Tolerance covers rounding of the scaled inputs in the short-coil regime (see the accuracy test above).
          expect(relativeError(solenoidInductance({ diameter, length, turns: turns * factor }), base * factor * factor)).toBeLessThan(1e-10);
          expect(relativeError(solenoidInductance({ diameter: diameter * factor, length: length * factor, turns }), base * factor)).toBeLessThan(1e-10);
          expect(solenoidInductance({ diameter: diameter * factor, length, turns })).toBeGreaterThan(base);
        },
      ),
    );
  });

  it("refuses zero turns", () => {
    expect(() => solenoidInductance({ diameter: 0.1, length: 0.3, turns: 0 })).toThrow(/turns/);
  });
});

describe("Wheeler's 1928 formula", () => {
  it("is within 1 % of Nagaoka for ℓ/D > 0.4", () => {
    // Wheeler, Proc. IRE 16, 1928: good to about 1 % for ℓ/D > 0.4 (docs/references.md, confirmed).
    fc.assert(
      fc.property(fc.double({ min: 0.4, max: 100, noNaN: true }), (lengthOverDiameter) => {
        const geometry = { diameter: 0.1, length: 0.1 * lengthOverDiameter, turns: 500 };
        expect(relativeError(wheelerInductance(geometry), solenoidInductance(geometry))).toBeLessThan(0.01);
      }),
    );
  });

  it("reads about 0.6 % below Nagaoka at ℓ/D = 4", () => {
    // docs/references.md (Wheeler 1928 against Nagaoka): about 0.6 % low for ℓ/D ≈ 4.
    const geometry = { diameter: 0.1, length: 0.4, turns: 900 };
    const deviation = wheelerInductance(geometry) / solenoidInductance(geometry) - 1;
    expect(deviation).toBeLessThan(-0.005);
    expect(deviation).toBeGreaterThan(-0.007);
  });

  it("drifts by more than 1 % for short coils", () => {
    // docs/references.md: Wheeler drifts badly for short coils (outside ℓ/D > 0.4).
    const geometry = { diameter: 0.1, length: 0.02, turns: 20 };
    expect(Math.abs(wheelerInductance(geometry) / solenoidInductance(geometry) - 1)).toBeGreaterThan(0.01);
  });

  it("grows as N² and with diameter", () => {
    // Exact from the formula's form a²N²/(9a + 10ℓ).
    const base = wheelerInductance({ diameter: 0.1, length: 0.3, turns: 400 });
    expect(relativeError(wheelerInductance({ diameter: 0.1, length: 0.3, turns: 800 }), 4 * base)).toBeLessThan(1e-14);
    expect(wheelerInductance({ diameter: 0.12, length: 0.3, turns: 400 })).toBeGreaterThan(base);
    expect(wheelerInductance({ diameter: 0.1, length: 0.35, turns: 400 })).toBeLessThan(base);
  });

  it("refuses bad geometry", () => {
    expect(() => wheelerInductance({ diameter: -0.1, length: 0.3, turns: 400 })).toThrow(/diameter/);
  });
});
