import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { sumToroidalCapacitanceSeries, toroidalLegendreP, toroidalLegendreQ } from "./toroidal-legendre";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

/**
 * Trapezoidal rule on [0, π] for an even, 2π-periodic integrand: spectrally accurate, so a few thousand
 * points give near machine precision for the smooth integrands below.
 */
function integrateEvenPeriodic(f: (phi: number) => number, points = 4000): number {
  const h = Math.PI / points;
  let sum = (f(0) + f(Math.PI)) / 2;
  for (let i = 1; i < points; i += 1) sum += f(i * h);
  return sum * h;
}

describe("toroidal (half-integer Legendre) functions", () => {
  it("match mpmath at 20 digits", () => {
    // Reference library: mpmath 1.3.0 legenp(n − ½, 0, z, type=3) and legenq(n − ½, 0, z, type=3).
    const reference: { z: number; P: number[]; Q: number[] }[] = [
      {
        z: 1.01,
        P: [0.99875350346451032546, 1.0037441576549926493, 1.0187909644872200045, 1.0441197040183519521],
        Q: [4.0316687795887194887, 2.049318451462074005, 1.4158592547726865215, 1.0584374848354170358],
      },
      {
        z: 1.5,
        P: [0.945006330929758054, 1.1746724294455385146, 2.0343427485811576779, 4.1776191389274553183],
        Q: [2.0189058199784232156, 0.39317514837200473104, 0.11338169008453505689, 0.036210967179681297904],
      },
      {
        z: 5,
        P: [0.74574918731632960996, 2.0355638390559679078, 13.321842531267676182, 105.35340194670782871],
        Q: [1.0010773804561062361, 0.050629509754072014013, 0.0038376048751113480624, 0.00032313314844757609111],
      },
      {
        z: 1000,
        P: [0.12793502088460993367, 28.470528382230304875, 37960.661864633444964, 60737041.901096482604],
        Q: [0.070248160481942087817, 0.00001756204505981198131, 6.5857686124738401832e-9, 2.7440709555073857791e-12],
      },
    ];
    for (const { z, P, Q } of reference) {
      const p = toroidalLegendreP(z, 4);
      const q = toroidalLegendreQ(z, 4);
      for (let n = 0; n < 4; n += 1) {
        expect(relativeError(p[n]!, P[n]!)).toBeLessThan(1e-14);
        expect(relativeError(q[n]!, Q[n]!)).toBeLessThan(1e-13);
      }
    }
  });

  it("keep full accuracy far down the decaying Q (Miller's recurrence)", () => {
    // Reference library: mpmath 1.3.0, Q_{29.5}(1.5) = 6.2173996788252281339e-14, P_{29.5}(1.5) = 239791252282.56508497.
    expect(relativeError(toroidalLegendreQ(1.5, 31)[30]!, 6.2173996788252281339e-14)).toBeLessThan(1e-13);
    expect(relativeError(toroidalLegendreP(1.5, 31)[30]!, 239791252282.56508497)).toBeLessThan(1e-13);
  });

  it("agree with Laplace's and Heine's integrals", () => {
    // P_{n−½}(cosh η) = (1/π)∫₀^π (cosh η + sinh η cos φ)^{n−½} dφ (Laplace's first integral, from memory);
    // Q_{n−½}(cosh η) = ∫₀^π cos(nφ)/√(2(cosh η − cos φ)) dφ (Heine's toroidal expansion, from memory).
    fc.assert(
      fc.property(fc.double({ min: 0.2, max: 4, noNaN: true }), fc.integer({ min: 0, max: 6 }), (eta, n) => {
        const z = Math.cosh(eta);
        const sinhEta = Math.sinh(eta);
        const pIntegral = integrateEvenPeriodic((phi) => (z + sinhEta * Math.cos(phi)) ** (n - 0.5)) / Math.PI;
        const qIntegral = integrateEvenPeriodic((phi) => Math.cos(n * phi) / Math.sqrt(2 * (z - Math.cos(phi))));
        expect(relativeError(toroidalLegendreP(z, n + 1)[n]!, pIntegral)).toBeLessThan(1e-11);
        // Q decays like e^{−nη}; the quadrature's absolute error (~1e-16 of Q₋½) bounds what we can assert.
        expect(Math.abs(toroidalLegendreQ(z, n + 1)[n]! - qIntegral)).toBeLessThan(1e-13 * toroidalLegendreQ(z, 1)[0]!);
      }),
    );
  });

  it("satisfy the Casoratian identity P_{n+½}Q_{n−½} − P_{n−½}Q_{n+½} = 1/(n + ½)", () => {
    // Casoratian of the Legendre recurrence, P_{ν+1}Q_ν − P_ν Q_{ν+1} = 1/(ν + 1) (DLMF §14.10, from memory;
    // confirmed numerically with mpmath 1.3.0), here ν = n − ½. It ties the independently seeded P and
    // Miller-computed Q together, so a wrong seed or normalisation breaks it.
    for (const z of [1.05, 2, 30]) {
      const p = toroidalLegendreP(z, 8);
      const q = toroidalLegendreQ(z, 8);
      for (let n = 0; n < 7; n += 1) {
        const casoratian = p[n + 1]! * q[n]! - p[n]! * q[n + 1]!;
        expect(relativeError(casoratian, 1 / (n + 0.5))).toBeLessThan(1e-12);
      }
    }
  });

  it("sum the torus series to convergence, and the sum is stable against more terms", () => {
    // Reference library: mpmath 1.3.0, Σ w_n Q_{n−½}/P_{n−½} at z = 2 summed to 1e-25 gives C/(8ε0c) with c = √3;
    // 30.5572716148618660886/(8√3) from the torus capacitance for R = 2, r = 1.
    const expected = 30.5572716148618660886 / (8 * Math.sqrt(3));
    expect(relativeError(sumToroidalCapacitanceSeries(2), expected)).toBeLessThan(1e-14);
  });

  it("refuse arguments at or below 1 and absurd counts", () => {
    expect(() => toroidalLegendreP(1, 3)).toThrow(CalcInputError);
    expect(() => toroidalLegendreQ(0.5, 3)).toThrow(/^z:/);
    expect(() => toroidalLegendreQ(2, 0)).toThrow(/^count:/);
    expect(() => sumToroidalCapacitanceSeries(Number.NaN)).toThrow(CalcInputError);
  });
});
