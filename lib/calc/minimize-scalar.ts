/**
 * Minimum of a function of one variable inside a bracket, for the fits whose only non-linear
 * parameter is a single number (the heat-sink time constant).
 */
import { CalcInputError, requireFinite, requirePositive } from "./errors";

/** Golden-section fraction (3 − √5)/2. */
const GOLDEN = (3 - Math.sqrt(5)) / 2;

/**
 * x in [lower, upper] minimising f, to within `tolerance` (absolute, in x), for f unimodal on the
 * bracket (otherwise a local minimum). Parabolic interpolation where it behaves, golden section
 * where it does not: typically a dozen evaluations instead of golden section's forty.
 * Source: R. P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 5, procedure
 * "localmin" (from memory).
 */
export function minimizeScalar(f: (x: number) => number, lower: number, upper: number, tolerance: number, maxEvaluations = 200): number {
  requireFinite("lower", lower);
  requireFinite("upper", upper);
  requirePositive("tolerance", tolerance);
  if (!(upper > lower)) throw new CalcInputError("upper", `a number greater than lower (${lower})`, upper);
  let a = lower;
  let b = upper;
  let x = a + GOLDEN * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  for (let evaluations = 1; evaluations < maxEvaluations; evaluations++) {
    const middle = (a + b) / 2;
    const tol1 = Number.EPSILON * Math.abs(x) + tolerance / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - middle) <= tol2 - (b - a) / 2) break;
    let parabolic = false;
    if (Math.abs(e) > tol1) {
      // Parabola through (v, fv), (w, fw), (x, fx); step p/q to its vertex.
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = x < middle ? tol1 : -tol1;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = (x < middle ? b : a) - x;
      d = GOLDEN * e;
    }
    const u = x + (Math.abs(d) >= tol1 ? d : d > 0 ? tol1 : -tol1);
    const fu = f(u);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return x;
}
