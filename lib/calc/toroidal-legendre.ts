/**
 * Toroidal functions: Legendre functions of half-integer degree P_{n−½}(z) and Q_{n−½}(z), z = cosh η > 1,
 * needed for the exact capacitance of a torus (W. R. Smythe, Static and Dynamic Electricity;
 * Morse & Feshbach, Methods of Theoretical Physics, 1953, p. 1304).
 *
 * Method:
 * - Starting values from complete elliptic integrals (closed forms, from memory; verified in the tests
 *   against Laplace's and Heine's integrals and against mpmath):
 *     P_{−½}(cosh η) = (2/π) e^{−η/2} K(k),  P_{½}(cosh η) = (2/π) e^{η/2} E(k),  k = √(1 − e^{−2η});
 *     Q_{−½}(z) = √(2/(z + 1)) K(√(2/(z + 1))).
 * - Three-term recurrence (ν + 1) F_{ν+1} = (2ν + 1) z F_ν − ν F_{ν−1}, ν = n − ½, for both P and Q.
 *   P grows with n (≈ e^{nη}): forward recurrence is stable for it. Q decays (≈ e^{−nη}): forward
 *   recurrence would drown it in the growing solution, so Q uses Miller's backward recurrence, written
 *   as a continued fraction for the ratios Q_{n+½}/Q_{n−½} and anchored on the exact Q_{−½}.
 * - Everything is carried as ratios, so neither P's growth nor Q's decay overflows.
 * Accuracy: about 1e-14 relative for 1 + 1e-6 ≤ z ≤ 1e8 (checked against mpmath in the tests).
 */
import { completeEllipticIntegrals } from "./elliptic";
import { CalcInputError, requireFinite } from "./errors";

/** Smallest z accepted: below it Miller's recurrence would need millions of steps. */
export const TOROIDAL_MIN_ARGUMENT = 1 + 1e-6;
/** Largest z accepted: beyond it e^{η} stops being representable comfortably across many terms. */
export const TOROIDAL_MAX_ARGUMENT = 1e8;

/** −ln(1e-17): truncation level used for Miller's start and the toroid series. */
const LOG_TARGET = 39.2;

interface Seeds {
  readonly eta: number;
  readonly pMinusHalf: number;
  readonly pHalf: number;
  readonly qMinusHalf: number;
}

function checkArgument(z: number): void {
  requireFinite("z", z);
  if (z < TOROIDAL_MIN_ARGUMENT || z > TOROIDAL_MAX_ARGUMENT) {
    throw new CalcInputError("z", `a number from ${TOROIDAL_MIN_ARGUMENT} to ${TOROIDAL_MAX_ARGUMENT}`, z);
  }
}

function checkCount(count: number): void {
  if (!Number.isInteger(count) || count < 1 || count > 100_000) {
    throw new CalcInputError("count", "a whole number of terms from 1 to 100000", count);
  }
}

/** P_{−½}, P_{½}, Q_{−½} from complete elliptic integrals (closed forms; see the file comment). */
function computeSeeds(z: number): Seeds {
  const root = Math.sqrt((z - 1) * (z + 1));
  const eta = Math.log(z + root);
  const q = 1 / (z + root); // e^{−η}
  const pIntegrals = completeEllipticIntegrals(Math.sqrt((1 - q) * (1 + q)), q);
  const qModulus = Math.sqrt(2 / (z + 1));
  const qIntegrals = completeEllipticIntegrals(Math.min(qModulus, 1), Math.sqrt((z - 1) / (z + 1)));
  return {
    eta,
    pMinusHalf: (2 / Math.PI) * Math.sqrt(q) * pIntegrals.K,
    pHalf: (2 / Math.PI) * pIntegrals.E / Math.sqrt(q),
    qMinusHalf: qModulus * qIntegrals.K,
  };
}

/** P_{n+½}/P_{n−½} for n = 0..count−2 by forward recurrence (P is the dominant solution). */
function computePRatios(z: number, seeds: Seeds, count: number): number[] {
  const ratios: number[] = [];
  if (count < 2) return ratios;
  ratios.push(seeds.pHalf / seeds.pMinusHalf);
  for (let n = 1; n < count - 1; n += 1) {
    // (n + ½) P_{n+½} = 2n z P_{n−½} − (n − ½) P_{n−3/2}, divided through by P_{n−½}.
    ratios.push((2 * n * z - (n - 0.5) / ratios[n - 1]!) / (n + 0.5));
  }
  return ratios;
}

/** Q_{n+½}/Q_{n−½} for n = 0..count−2 by Miller's backward recurrence as a continued fraction. */
function computeQRatios(z: number, seeds: Seeds, count: number): number[] {
  // Truncating at N perturbs ratio n by about e^{−2(N − n)η}: start far enough above the last one needed.
  const start = count + Math.ceil(LOG_TARGET / (2 * seeds.eta)) + 10;
  const ratios = new Array<number>(Math.max(count - 1, 0));
  let rho = 0; // Q_{N+½}/Q_{N−½} taken as 0
  for (let n = start; n >= 1; n -= 1) {
    // (n + ½) Q_{n+½} = 2n z Q_{n−½} − (n − ½) Q_{n−3/2}  ⇒  Q_{n−½}/Q_{n−3/2} = (n − ½)/(2n z − (n + ½) ρ_n).
    rho = (n - 0.5) / (2 * n * z - (n + 0.5) * rho);
    if (n - 1 < count - 1) ratios[n - 1] = rho;
  }
  return ratios;
}

/** P_{n−½}(z) for n = 0..count−1, 1 + 1e-6 ≤ z ≤ 1e8 (closed forms plus forward recurrence; see file comment). */
export function toroidalLegendreP(z: number, count: number): number[] {
  checkArgument(z);
  checkCount(count);
  const seeds = computeSeeds(z);
  const ratios = computePRatios(z, seeds, count);
  const values = [seeds.pMinusHalf];
  for (const ratio of ratios) values.push(values[values.length - 1]! * ratio);
  return values;
}

/** Q_{n−½}(z) for n = 0..count−1, 1 + 1e-6 ≤ z ≤ 1e8 (closed form plus Miller's backward recurrence). */
export function toroidalLegendreQ(z: number, count: number): number[] {
  checkArgument(z);
  checkCount(count);
  const seeds = computeSeeds(z);
  const ratios = computeQRatios(z, seeds, count);
  const values = [seeds.qMinusHalf];
  for (const ratio of ratios) values.push(values[values.length - 1]! * ratio);
  return values;
}

/**
 * Σ w_n Q_{n−½}(z)/P_{n−½}(z) with w_0 = 1, w_n = 2 (n ≥ 1), summed until the terms fall below 1e-17 of
 * the total: the bracket of the torus capacitance series (Smythe; Morse & Feshbach p. 1304).
 * Terms decay as about e^{−2nη}, so about 20/η terms are needed.
 */
export function sumToroidalCapacitanceSeries(z: number): number {
  checkArgument(z);
  const seeds = computeSeeds(z);
  const count = Math.ceil(LOG_TARGET / (2 * seeds.eta)) + 5;
  const pRatios = computePRatios(z, seeds, count);
  const qRatios = computeQRatios(z, seeds, count);
  let term = seeds.qMinusHalf / seeds.pMinusHalf;
  let sum = term;
  for (let n = 1; n < count; n += 1) {
    term *= qRatios[n - 1]! / pRatios[n - 1]!;
    sum += 2 * term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}
