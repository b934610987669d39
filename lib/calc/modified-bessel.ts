/**
 * Exponentially scaled modified Bessel functions of order 0 and 1: e^{−x} I_n(x) and e^{x} K_n(x), x > 0.
 * The scaling keeps products such as I_0(x) K_0(x) finite for large x, which is all the sheath-helix model needs.
 *
 * Equation numbers below are from memory. Methods (chosen for robustness over speed; about 1e-14 relative, checked against mpmath in the tests):
 * - I_n, x ≤ 2: the ascending series Σ (x/2)^{2k+n}/(k!(k+n)!) (A&S 9.6.10).
 * - I_n, x > 2: the integral (1/π)∫₀^π e^{x cos θ} cos(nθ) dθ (A&S 9.6.19) by the trapezoidal rule, which
 *   converges geometrically for a smooth periodic integrand.
 * - K_n: the integral ∫₀^∞ e^{−x cosh t} cosh(nt) dt (A&S 9.6.24) by the trapezoidal rule on an even,
 *   doubly-exponentially decaying integrand, again geometrically convergent.
 */
import { CalcInputError, requirePositive } from "./errors";

export type BesselOrder = 0 | 1;

const SERIES_LIMIT = 2;

function requireOrder(order: number): BesselOrder {
  if (order !== 0 && order !== 1) throw new CalcInputError("order", "0 or 1", order);
  return order;
}

/** e^{−x} I_n(x) for n = 0, 1 and x > 0 (series A&S 9.6.10 or integral A&S 9.6.19; see file comment). */
export function scaledBesselI(order: BesselOrder, x: number): number {
  requireOrder(order);
  requirePositive("x", x);
  if (x <= SERIES_LIMIT) {
    const quarterSquare = (x * x) / 4;
    let term = order === 0 ? 1 : x / 2;
    let sum = term;
    for (let k = 1; k < 60; k += 1) {
      term *= quarterSquare / (k * (k + order));
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return sum * Math.exp(-x);
  }
  // The integrand's peak at θ = 0 has width ~1/√x: resolve it with a few dozen points per width.
  const points = Math.ceil(40 + 12 * Math.sqrt(x));
  const h = Math.PI / points;
  let sum = 0;
  for (let i = 0; i <= points; i += 1) {
    const theta = i * h;
    const weight = i === 0 || i === points ? 0.5 : 1;
    sum += weight * Math.exp(x * (Math.cos(theta) - 1)) * Math.cos(order * theta);
  }
  return (sum * h) / Math.PI;
}

/** e^{x} K_n(x) for n = 0, 1 and x > 0 (integral A&S 9.6.24 by the trapezoidal rule; see file comment). */
export function scaledBesselK(order: BesselOrder, x: number): number {
  requireOrder(order);
  requirePositive("x", x);
  // Beyond x(cosh t − 1) = 50 the integrand is below e^{−50}·cosh t: negligible.
  const tMax = Math.acosh(1 + 50 / x) + 1;
  // Step chosen against the peak width ~1/√x (large x) and a fixed resolution in t (small x).
  const points = Math.ceil(Math.max(200, 20 * tMax * Math.sqrt(x)));
  const h = tMax / points;
  let sum = 0;
  for (let i = 0; i <= points; i += 1) {
    const t = i * h;
    const weight = i === 0 ? 0.5 : 1;
    sum += weight * Math.exp(-x * (Math.cosh(t) - 1)) * (order === 0 ? 1 : Math.cosh(t));
  }
  return sum * h;
}
