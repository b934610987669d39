/**
 * Self-capacitance of a single-layer solenoid from Medhurst's measurements.
 *
 * Caveat (D. W. Knight, "The self-resonance and self-capacitance of solenoid coils", 2016): Medhurst's
 * capacitance belongs to the resonance measured across both ends of the coil. Pairing it with L to predict
 * the first resonance of a coil grounded at its base is an engineering approximation, typically ±10–20 %
 * against measurement. The commonly quoted curve fits of the table are several percent off in the
 * ℓ/D 3–6 range most secondaries use, so the table itself is interpolated here.
 */
import { CalcInputError, requirePositive } from "./errors";

/**
 * Medhurst's H = C[pF]/D[cm] against ℓ/D (R. G. Medhurst, "H.F. resistance and self-capacitance of
 * single-layer solenoids", Wireless Engineer 24, 1947, pp. 35–43 and 80–92; as reproduced in
 * docs/references.md). Pairs of [ℓ/D, H].
 */
export const MEDHURST_TABLE: readonly (readonly [lengthOverDiameter: number, h: number])[] = [
  [0.1, 0.96], [0.15, 0.79], [0.2, 0.7], [0.25, 0.64], [0.3, 0.6], [0.35, 0.57], [0.4, 0.54], [0.45, 0.52],
  [0.5, 0.5], [0.6, 0.48], [0.7, 0.47], [0.8, 0.46], [0.9, 0.46], [1.0, 0.46], [1.5, 0.47], [2.0, 0.5],
  [2.5, 0.56], [3.0, 0.61], [3.5, 0.67], [4.0, 0.72], [4.5, 0.77], [5.0, 0.81], [6.0, 0.92], [7.0, 1.01],
  [8.0, 1.12], [9.0, 1.22], [10, 1.32], [15, 1.86], [20, 2.36], [25, 2.9], [30, 3.4], [40, 4.6], [50, 5.8],
];

/** Smallest and largest ℓ/D Medhurst measured; outside them the table says nothing. */
export const MEDHURST_MIN_LENGTH_OVER_DIAMETER = 0.1;
export const MEDHURST_MAX_LENGTH_OVER_DIAMETER = 50;

/** Slack for ratios such as 0.01/0.1 = 0.09999999999999999 that are meant to sit on a table end. */
const RATIO_ROUNDING_SLACK = 1e-12;

const logRatios = MEDHURST_TABLE.map(([ratio]) => Math.log(ratio));
const hValues = MEDHURST_TABLE.map(([, h]) => h);
const nodeSlopes = computePchipSlopes(logRatios, hValues);

/**
 * Node derivatives of the monotone piecewise-cubic Hermite interpolant (PCHIP; F. N. Fritsch & J. Butland,
 * SIAM J. Sci. Stat. Comput. 5(2), 1984: weighted harmonic mean inside, shape-preserving three-point ends).
 */
function computePchipSlopes(x: readonly number[], y: readonly number[]): number[] {
  const n = x.length;
  const h: number[] = [];
  const delta: number[] = [];
  for (let i = 0; i < n - 1; i += 1) {
    h.push(x[i + 1]! - x[i]!);
    delta.push((y[i + 1]! - y[i]!) / h[i]!);
  }
  const d = new Array<number>(n).fill(0);
  for (let i = 1; i < n - 1; i += 1) {
    const left = delta[i - 1]!;
    const right = delta[i]!;
    // A local extremum or a flat stretch must stay flat, or the curve would overshoot the data.
    if (left === 0 || right === 0 || Math.sign(left) !== Math.sign(right)) continue;
    const w1 = 2 * h[i]! + h[i - 1]!;
    const w2 = h[i]! + 2 * h[i - 1]!;
    d[i] = (w1 + w2) / (w1 / left + w2 / right);
  }
  d[0] = endSlope(h[0]!, h[1]!, delta[0]!, delta[1]!);
  d[n - 1] = endSlope(h[n - 2]!, h[n - 3]!, delta[n - 2]!, delta[n - 3]!);
  return d;
}

/** Non-centred three-point end derivative, clipped so the end interval stays monotone (Fritsch & Butland 1984). */
function endSlope(h0: number, h1: number, delta0: number, delta1: number): number {
  const slope = ((2 * h0 + h1) * delta0 - h0 * delta1) / (h0 + h1);
  if (Math.sign(slope) !== Math.sign(delta0)) return 0;
  if (Math.sign(delta0) !== Math.sign(delta1) && Math.abs(slope) > Math.abs(3 * delta0)) return 3 * delta0;
  return slope;
}

/**
 * Medhurst's H for a given ℓ/D, interpolated in the table.
 * Interpolation is PCHIP in log(ℓ/D): the table's nodes are roughly geometrically spaced over 0.1–50,
 * the curve is smooth in log(ℓ/D), and PCHIP reproduces every node exactly, never leaves the range of the
 * two neighbouring nodes (no overshoot at the flat minimum near ℓ/D = 0.8–1.0) and, unlike straight
 * lines, has no slope kinks at the nodes.
 */
export function medhurstH(lengthOverDiameter: number): number {
  requirePositive("lengthOverDiameter", lengthOverDiameter);
  const min = MEDHURST_MIN_LENGTH_OVER_DIAMETER;
  const max = MEDHURST_MAX_LENGTH_OVER_DIAMETER;
  if (lengthOverDiameter < min * (1 - RATIO_ROUNDING_SLACK) || lengthOverDiameter > max * (1 + RATIO_ROUNDING_SLACK)) {
    throw new CalcInputError(
      "lengthOverDiameter",
      `a length-to-diameter ratio from ${min} to ${max} (the range of Medhurst's table)`,
      lengthOverDiameter,
    );
  }
  const t = Math.log(Math.min(max, Math.max(min, lengthOverDiameter)));
  let i = 0;
  while (i < logRatios.length - 2 && t > logRatios[i + 1]!) i += 1;
  const x0 = logRatios[i]!;
  const width = logRatios[i + 1]! - x0;
  const s = (t - x0) / width;
  // Cubic Hermite basis on [x_i, x_{i+1}].
  const h00 = (1 + 2 * s) * (1 - s) * (1 - s);
  const h10 = s * (1 - s) * (1 - s);
  const h01 = s * s * (3 - 2 * s);
  const h11 = s * s * (s - 1);
  return h00 * hValues[i]! + h10 * width * nodeSlopes[i]! + h01 * hValues[i + 1]! + h11 * width * nodeSlopes[i + 1]!;
}

/**
 * Self-capacitance of a single-layer solenoid, F: C[pF] = H·D[cm] (Medhurst, Wireless Engineer 24, 1947).
 * Throws CalcInputError outside 0.1 ≤ ℓ/D ≤ 50.
 * @param diameter coil diameter D, m
 * @param length winding length ℓ, m
 */
export function medhurstSelfCapacitance({ diameter, length }: { diameter: number; length: number }): number {
  requirePositive("diameter", diameter);
  requirePositive("length", length);
  const ratio = length / diameter;
  let h: number;
  try {
    h = medhurstH(ratio);
  } catch (error) {
    if (error instanceof CalcInputError) {
      throw new CalcInputError("length", `a winding length from 0.1 to 50 times the diameter (Medhurst's table), ℓ/D = ${ratio}`, length);
    }
    throw error;
  }
  const diameterCm = diameter * 100;
  return h * diameterCm * 1e-12;
}
