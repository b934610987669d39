/**
 * The frequency a self-oscillating driver runs at, predicted from a swept first series resonance.
 *
 * A small-signal sweep finds the secondary's own series resonance. Running, the secondary is loaded by the
 * primary (coupled reactance and the driver's output capacitance) and the feedback path adds its phase
 * delay, so the driver settles a few per cent away from the swept resonance; common practice puts the offset
 * within roughly 5 % (docs/references.md, "Honest prediction and uncertainty"). The offset depends on the
 * driver and its primary, so it is learnt per coil as the ratio r = f_run / f_sweep from its own earlier
 * sessions, else from the fleet's, else taken from that prior.
 */
import { CalcInputError, requireFinite, requirePositive } from "./errors";
import { rectangularStandardUncertainty } from "./uncertainty-propagation";

/** Prior for r = f_run / f_sweep when nothing is learnt: 1 ± 5 % as a rectangular bound (common practice). */
export const RUNNING_OFFSET_PRIOR = { ratio: 1, standardUncertainty: rectangularStandardUncertainty(0.05) } as const;

/** Fewest earlier observations that a learnt offset needs: two give a first estimate of the spread. */
export const MIN_RUNNING_OFFSET_OBSERVATIONS = 2;

export type RunningOffsetSource = "coil" | "fleet" | "prior";

export interface RunningOffsetEstimate {
  /** Expected f_run / f_sweep. */
  readonly ratio: number;
  /** Standard uncertainty of the ratio for the next session (spread of sessions plus that of the mean). */
  readonly standardUncertainty: number;
  readonly source: RunningOffsetSource;
  /** Observations the estimate was learnt from (0 for the prior). */
  readonly count: number;
}

/** Count, sum and sum of squares of observed ratios: enough to learn from, and cheap to keep as a running total. */
export interface RatioMoments {
  readonly count: number;
  readonly sum: number;
  readonly sumOfSquares: number;
}

/** Moments of a list of ratios. */
export function ratioMoments(ratios: readonly number[]): RatioMoments {
  return { count: ratios.length, sum: ratios.reduce((a, r) => a + r, 0), sumOfSquares: ratios.reduce((a, r) => a + r * r, 0) };
}

function learn({ count: n, sum, sumOfSquares }: RatioMoments, source: "coil" | "fleet"): RunningOffsetEstimate {
  const mean = sum / n;
  // Sample variance from the moments; ratios sit near 1 with spreads of 1e-4 and more, far above rounding.
  const variance = Math.max(0, (sumOfSquares - n * mean * mean) / (n - 1));
  // Predictive standard deviation of one new observation: s·√(1 + 1/n) (textbook prediction interval, from memory).
  return { ratio: mean, standardUncertainty: Math.sqrt(variance * (1 + 1 / n)), source, count: n };
}

function requireMoments(name: "own" | "fleet", m: RatioMoments): void {
  if (!Number.isInteger(m.count) || m.count < 0) throw new CalcInputError(`${name}.count`, "a whole number ≥ 0", m.count);
  if (!Number.isFinite(m.sum)) throw new CalcInputError(`${name}.sum`, "a finite number", m.sum);
  if (!Number.isFinite(m.sumOfSquares)) throw new CalcInputError(`${name}.sumOfSquares`, "a finite number", m.sumOfSquares);
}

/** estimateRunningOffset from the ratios' moments (the same rule), for callers that keep running totals. */
export function estimateRunningOffsetFromMoments(own: RatioMoments, fleet: RatioMoments): RunningOffsetEstimate {
  requireMoments("own", own);
  requireMoments("fleet", fleet);
  if (own.count >= MIN_RUNNING_OFFSET_OBSERVATIONS) return learn(own, "coil");
  if (fleet.count >= MIN_RUNNING_OFFSET_OBSERVATIONS) return learn(fleet, "fleet");
  return { ...RUNNING_OFFSET_PRIOR, source: "prior", count: 0 };
}

/**
 * Learn the running offset: the coil's own ratios when there are at least MIN_RUNNING_OFFSET_OBSERVATIONS,
 * else the fleet's, else RUNNING_OFFSET_PRIOR. Ratios are f_run / f_sweep (dimensionless, > 0).
 */
export function estimateRunningOffset(ownRatios: readonly number[], fleetRatios: readonly number[] = []): RunningOffsetEstimate {
  ownRatios.forEach((r, i) => requirePositive(`ownRatios[${i}]`, r));
  fleetRatios.forEach((r, i) => requirePositive(`fleetRatios[${i}]`, r));
  return estimateRunningOffsetFromMoments(ratioMoments(ownRatios), ratioMoments(fleetRatios));
}

export interface RunningFrequencyPrediction {
  /** Predicted running frequency, Hz. */
  readonly frequency: number;
  /** Its standard uncertainty, Hz (the sweep's own uncertainty neglected: it is far smaller). */
  readonly standardUncertainty: number;
  readonly offset: RunningOffsetEstimate;
}

/** f_run = r · f_sweep with u(f_run) = f_sweep · u(r) (JCGM 100:2008 eq. 10, one uncertain input). */
export function predictRunningFrequency(sweptFirstResonanceHz: number, offset: RunningOffsetEstimate): RunningFrequencyPrediction {
  requirePositive("sweptFirstResonanceHz", sweptFirstResonanceHz);
  requirePositive("offset.ratio", offset.ratio);
  if (!(requireFinite("offset.standardUncertainty", offset.standardUncertainty) >= 0)) {
    throw new CalcInputError("offset.standardUncertainty", "a finite number ≥ 0", offset.standardUncertainty);
  }
  return { frequency: offset.ratio * sweptFirstResonanceHz, standardUncertainty: offset.standardUncertainty * sweptFirstResonanceHz, offset };
}
