/**
 * A fan on a heat sink: forced air lowers the sink-to-ambient resistance Rθsa below its natural-convection rating.
 * The with-fan value is recorded on the fan part (its sinkThermalResistanceKPerW: the sink's Rθsa with that fan
 * running); without it, a common-practice factor stands in and is flagged as an estimate.
 */
import { requirePositive } from "./errors";

/**
 * Forced air at the airflow of a small bench fan takes a finned sink's Rθsa to roughly a half to a third of its
 * natural-convection rating (common practice). The half is used: with a fan fitted the inferred power ΔT/Rθsa is
 * then the smaller of the range's, so the estimate is flagged and a recorded value asked for.
 */
export const FORCED_AIR_RESISTANCE_FACTOR = 0.5;

export interface SinkResistance {
  /** Rθsa, K/W, as the run had it. */
  value: number;
  estimated: boolean;
  source: string;
}

/** The sink's Rθsa for a run: the natural rating, the fan part's recorded with-fan value, or the rating × the factor. */
// Rθ with forced air: recorded value, else FORCED_AIR_RESISTANCE_FACTOR (common practice, see above).
export function sinkResistanceForRun(args: { naturalKPerW: number; fanFitted: boolean; withFanKPerW?: number | null }): SinkResistance {
  const natural = requirePositive("naturalKPerW", args.naturalKPerW);
  if (!args.fanFitted) return { value: natural, estimated: false, source: "heat-sink rating, sink to ambient" };
  if (args.withFanKPerW !== null && args.withFanKPerW !== undefined) {
    return { value: requirePositive("withFanKPerW", args.withFanKPerW), estimated: false, source: "recorded with-fan resistance (the fan part's Rθsa)" };
  }
  return {
    value: natural * FORCED_AIR_RESISTANCE_FACTOR,
    estimated: true,
    source: `estimated: a fan was fitted and no with-fan Rθsa is recorded, so ${FORCED_AIR_RESISTANCE_FACTOR} × the natural rating (common practice)`,
  };
}
