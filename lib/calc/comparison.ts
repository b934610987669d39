/**
 * Comparing a measured quantity with its prediction, against a tolerance that says how far apart the two
 * may honestly be for that kind of quantity.
 */
import { CalcInputError, requireInRange, requirePositive } from "./errors";

/** Quantities Coilyard compares with a prediction. */
export type ComparedQuantity = "inductance" | "firstResonance" | "runningFrequency";

/**
 * Default relative tolerances per quantity. common practice, with reasons:
 * - inductance 5 %: the current-sheet model is exact for its geometry, but measured diameters, winding
 *   length and round-wire effects (a few tenths of a percent, Rosa 1906) plus meter error add up to a few percent;
 * - firstResonance 15 %: pairing Medhurst's self-capacitance with L for a base-grounded coil is typically
 *   ±10–20 % against measurement (D. W. Knight 2016, docs/references.md), before any top load is added;
 * - runningFrequency 10 %: a self-oscillating driver runs within a few percent of the first series resonance
 *   swept with the same top load; 10 % leaves room for streamer loading.
 */
export const DEFAULT_COMPARISON_TOLERANCES: Readonly<Record<ComparedQuantity, number>> = {
  inductance: 0.05,
  firstResonance: 0.15,
  runningFrequency: 0.1,
};

/** Outcome of a comparison; all differences in the quantity's own SI unit (H or Hz). */
export interface Comparison {
  /** Relative deviation (measured − predicted)/predicted, signed. */
  readonly deviation: number;
  /** measured − predicted in the quantity's unit, signed like `deviation`. */
  readonly absoluteDifference: number;
  /** |deviation| ≤ tolerance. */
  readonly withinTolerance: boolean;
  /** Relative tolerance applied. */
  readonly tolerance: number;
}

/**
 * Compare a measured value with its prediction: relative deviation (measured − predicted)/predicted
 * (the usual definition of relative error against a reference) and whether it is within tolerance
 * (default from DEFAULT_COMPARISON_TOLERANCES).
 */
export function compareMeasured({
  quantity,
  predicted,
  measured,
  tolerance,
}: {
  quantity: ComparedQuantity;
  predicted: number;
  measured: number;
  tolerance?: number;
}): Comparison {
  // Callers pass form and import values: check at run time, not only through the type.
  if (!Object.hasOwn(DEFAULT_COMPARISON_TOLERANCES, quantity)) {
    throw new CalcInputError("quantity", `one of ${Object.keys(DEFAULT_COMPARISON_TOLERANCES).join(", ")}`, quantity);
  }
  requirePositive("predicted", predicted);
  requirePositive("measured", measured);
  const applied = tolerance === undefined ? DEFAULT_COMPARISON_TOLERANCES[quantity] : requireInRange("tolerance", tolerance, 0, 10);
  const absoluteDifference = measured - predicted;
  const deviation = absoluteDifference / predicted;
  return { deviation, absoluteDifference, withinTolerance: Math.abs(deviation) <= applied, tolerance: applied };
}
