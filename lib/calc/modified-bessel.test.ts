import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { scaledBesselI, scaledBesselK, type BesselOrder } from "./modified-bessel";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe("scaled modified Bessel functions", () => {
  it("match mpmath across small, medium and large arguments", () => {
    // Reference library: mpmath 1.3.0, exp(−x)·besseli(n, x) and exp(x)·besselk(n, x) at 25 digits.
    const reference: [number, [number, number], [number, number]][] = [
      [1e-6, [0.99999900000075, 4.99999500000312477e-7], [13.9314560050754588, 1000000.99999328432]],
      [0.01, [0.990074585149707499, 0.00495031104711827571], [4.76869402854446188, 100.978648458240049]],
      [0.5, [0.645035270449150068, 0.156420803184871697], [1.52410938577390953, 2.73100970821178571]],
      [2, [0.30850832255367104, 0.215269289248937659], [0.841568215070771418, 1.03347684706868857]],
      [2.5, [0.27004644161220274, 0.206584649531266554], [0.759548690328099579, 0.900174423907878089]],
      [10, [0.127833337163428607, 0.121262681384455519], [0.391631934436598666, 0.410766570595788751]],
      [100, [0.0399443792990966826, 0.0397441530251302527], [0.125175621659126579, 0.125799950479578529]],
      [3000, [0.00728395974654569064, 0.00728274565205475249], [0.0228813275719324368, 0.0228851408088374196]],
    ];
    for (const [x, i, k] of reference) {
      for (const order of [0, 1] as BesselOrder[]) {
        expect(relativeError(scaledBesselI(order, x), i[order]!)).toBeLessThan(1e-13);
        expect(relativeError(scaledBesselK(order, x), k[order]!)).toBeLessThan(1e-13);
      }
    }
  });

  it("satisfy the Wronskian I_0 K_1 + I_1 K_0 = 1/x", () => {
    // A&S 9.6.15 (from memory): I_ν K_{ν+1} + I_{ν+1} K_ν = 1/x; the scalings cancel in each product.
    for (const x of [1e-4, 0.3, 1.9, 2.1, 7, 55, 800]) {
      const w = scaledBesselI(0, x) * scaledBesselK(1, x) + scaledBesselI(1, x) * scaledBesselK(0, x);
      expect(relativeError(w, 1 / x)).toBeLessThan(1e-13);
    }
  });

  it("refuse orders other than 0 and 1 and non-positive arguments", () => {
    expect(() => scaledBesselI(2 as BesselOrder, 1)).toThrow(/^order:/);
    expect(() => scaledBesselK(0, 0)).toThrow(CalcInputError);
    expect(() => scaledBesselI(0, -1)).toThrow(/^x:/);
  });
});
