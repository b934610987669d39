/**
 * How far a model's predictions have landed from the measurements they were compared with: count, median,
 * interquartile range and the worst case, for a steward judging how far to trust the model on a new build.
 */
import { CalcInputError, requireFinite } from "./errors";

export interface LabelledDeviation<L> {
  /** Relative deviation (measured − predicted)/predicted. */
  readonly deviation: number;
  /** What the deviation belongs to (which coil, which sweep or session). */
  readonly label: L;
}

export interface DeviationSummary<L> {
  readonly count: number;
  readonly median: number;
  /** First and third quartiles. */
  readonly lowerQuartile: number;
  readonly upperQuartile: number;
  /** The deviation largest in size, with its label. */
  readonly worst: LabelledDeviation<L>;
}

/** Quantile of sorted values by linear interpolation between order statistics (Hyndman & Fan 1996, definition 7; from memory). */
export function quantileOfSorted(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) throw new CalcInputError("sorted", "at least one value", "none");
  if (!(p >= 0 && p <= 1)) throw new CalcInputError("p", "a probability from 0 to 1", p);
  const h = (sorted.length - 1) * p;
  const lower = Math.floor(h);
  const upper = Math.min(lower + 1, sorted.length - 1);
  return sorted[lower]! + (h - lower) * (sorted[upper]! - sorted[lower]!);
}

/** Summarise labelled deviations; null when there are none. */
export function summarizeDeviations<L>(deviations: readonly LabelledDeviation<L>[]): DeviationSummary<L> | null {
  if (deviations.length === 0) return null;
  // Checked without building a field name per element: fleets pass hundreds of thousands.
  const bad = deviations.findIndex((d) => !Number.isFinite(d.deviation));
  if (bad >= 0) requireFinite(`deviations[${bad}].deviation`, deviations[bad]!.deviation);
  const sorted = deviations.map((d) => d.deviation).sort((a, b) => a - b);
  const worst = deviations.reduce((a, b) => (Math.abs(b.deviation) > Math.abs(a.deviation) ? b : a));
  return {
    count: sorted.length,
    median: quantileOfSorted(sorted, 0.5),
    lowerQuartile: quantileOfSorted(sorted, 0.25),
    upperQuartile: quantileOfSorted(sorted, 0.75),
    worst,
  };
}
