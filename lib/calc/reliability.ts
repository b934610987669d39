/**
 * Fleet reliability per part number: pooled operating hours and failures, the MTBF point estimate and its
 * two-sided confidence interval under a constant failure rate (exponential times between failures).
 *
 * Hours, not seconds: MTBF is read and compared in hours everywhere it is published, so this file works in
 * hours and says so in every name; `sumOperatingHours` converts the sessions' seconds.
 */
import chisquareQuantile from "@stdlib/stats-base-dists-chisquare-quantile";
import { CalcInputError, requireNonNegative } from "./errors";

/** One install's (or an already pooled) exposure of a part. */
export interface PartExposure {
  /** What identifies "the same part" across the fleet, e.g. a normalised part number. */
  partKey: string;
  operatingHours: number;
  /** Failures of this part during those hours (a whole number). */
  failures: number;
}

export interface PartReliability {
  partKey: string;
  /** How many records were pooled. */
  records: number;
  /** Total operating hours T. */
  operatingHours: number;
  /** Total failures r. */
  failures: number;
  /** T/r in hours; null when r = 0 (no failure yet, so no point estimate). */
  mtbfHours: number | null;
  /** Lower bound 2T/χ²(1 − α/2; 2r + 2), hours. */
  mtbfLowHours: number;
  /** Upper bound 2T/χ²(α/2; 2r), hours; Infinity when r = 0 (no failure sets no ceiling). */
  mtbfHighHours: number;
  /** Two-sided confidence level of the bounds. */
  confidence: number;
}

/**
 * Pools records by partKey (sorted by key) and gives each part's MTBF with the two-sided interval for a
 * time-terminated test (NIST/SEMATECH e-Handbook of Statistical Methods, ch. 8, exponential confidence bounds;
 * MIL-HDBK-781 — both from memory). Pooling assumes every install sees the same constant failure rate.
 */
export function partReliability(
  records: readonly PartExposure[],
  { confidence = 0.95 }: { confidence?: number } = {},
): PartReliability[] {
  if (!Number.isFinite(confidence) || confidence <= 0 || confidence >= 1) {
    throw new CalcInputError("confidence", "a fraction strictly between 0 and 1, e.g. 0.95", confidence);
  }
  const pooled = new Map<string, { records: number; hours: number; failures: number }>();
  records.forEach((record, i) => {
    const key = typeof record.partKey === "string" ? record.partKey.trim() : "";
    if (key === "") throw new CalcInputError(`records[${i}].partKey`, "a non-empty part key", record.partKey);
    const hours = requireNonNegative(`records[${i}].operatingHours`, record.operatingHours);
    const failures = requireNonNegative(`records[${i}].failures`, record.failures);
    if (!Number.isInteger(failures)) {
      throw new CalcInputError(`records[${i}].failures`, "a whole number of failures", failures);
    }
    const sum = pooled.get(key) ?? { records: 0, hours: 0, failures: 0 };
    pooled.set(key, { records: sum.records + 1, hours: sum.hours + hours, failures: sum.failures + failures });
  });
  const alpha = 1 - confidence;
  return [...pooled.entries()]
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([partKey, sum]) => {
      const t = sum.hours;
      const r = sum.failures;
      return {
        partKey,
        records: sum.records,
        operatingHours: t,
        failures: r,
        mtbfHours: r > 0 ? t / r : null,
        mtbfLowHours: (2 * t) / chisquareQuantile(1 - alpha / 2, 2 * r + 2),
        mtbfHighHours: r > 0 ? (2 * t) / chisquareQuantile(alpha / 2, 2 * r) : Number.POSITIVE_INFINITY,
        confidence,
      };
    });
}

/** Total running time of the given sessions, in hours (durations are stored in seconds). */
export function sumOperatingHours(sessions: readonly { durationS: number }[]): number {
  let seconds = 0;
  sessions.forEach((session, i) => {
    seconds += requireNonNegative(`sessions[${i}].durationS`, session.durationS);
  });
  return seconds / 3600;
}
