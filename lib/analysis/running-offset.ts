/**
 * Sessions' running frequencies paired with the sweeps before them, as the observations the running-offset
 * model learns from (lib/calc/running-frequency.ts), and each session's out-of-sample prediction: made only
 * from observations dated before that session (cross-validation in time, Stone 1974, docs/references.md).
 */
import { estimateRunningOffset, estimateRunningOffsetFromMoments, MIN_RUNNING_OFFSET_OBSERVATIONS, predictRunningFrequency, type RatioMoments, type RunningFrequencyPrediction } from "../calc/running-frequency";

export interface RunningSessionRow {
  id: string;
  coilId?: string;
  startedAt: Date;
  topLoadId?: string | null;
  runningFrequencyHz: number | null;
}

export interface ResonanceSweepRow {
  id: string;
  takenAt: Date;
  topLoadId: string | null;
  firstSeriesResonanceHz: number | null;
}

/** One observation: a session's running frequency over the latest sweep before it with the same top load. */
export interface RunningOffsetObservation {
  /** The coil, when known (the fleet's observations leave out the coil's own by it). */
  coilId: string | null;
  sessionId: string;
  sweepId: string;
  /** When the sweep was taken. */
  sweptAt: Date;
  /** When the session started. */
  at: Date;
  sweptHz: number;
  runningHz: number;
  /** f_run / f_sweep. */
  ratio: number;
}

/** The latest sweep strictly before `at` with this top load that found a first series resonance (sweeps chronological). */
export function findSweepBefore<W extends ResonanceSweepRow>(sweeps: readonly W[], topLoadId: string | null, at: Date): W | null {
  return sweeps.findLast((w) => w.takenAt.getTime() < at.getTime() && (w.topLoadId ?? null) === topLoadId && w.firstSeriesResonanceHz !== null) ?? null;
}

/** Pair each session that logged a running frequency with the latest earlier sweep on the same top load; unpaired sessions are left out. */
export function pairRunningWithSweeps(sessions: readonly RunningSessionRow[], sweeps: readonly ResonanceSweepRow[]): RunningOffsetObservation[] {
  const pairs: RunningOffsetObservation[] = [];
  for (const s of sessions) {
    if (s.runningFrequencyHz === null || !(s.runningFrequencyHz > 0)) continue;
    const sweep = findSweepBefore(sweeps, s.topLoadId ?? null, s.startedAt);
    if (!sweep) continue;
    pairs.push({ coilId: s.coilId ?? null, sessionId: s.id, sweepId: sweep.id, sweptAt: sweep.takenAt, at: s.startedAt, sweptHz: sweep.firstSeriesResonanceHz!, runningHz: s.runningFrequencyHz, ratio: s.runningFrequencyHz / sweep.firstSeriesResonanceHz! });
  }
  return pairs;
}

export interface RunningFrequencyCheck {
  observation: RunningOffsetObservation;
  prediction: RunningFrequencyPrediction;
  /** (measured − predicted)/predicted. */
  deviation: number;
}

/**
 * The running frequency of the session in `observation` as it would have been predicted beforehand: from the
 * swept resonance it is paired with and the offset learnt from own and fleet observations strictly earlier.
 */
export function checkRunningFrequency(observation: RunningOffsetObservation, own: readonly RunningOffsetObservation[], fleet: readonly RunningOffsetObservation[]): RunningFrequencyCheck {
  const before = (o: RunningOffsetObservation) => o.at.getTime() < observation.at.getTime();
  const ownRatios = own.filter(before).map((o) => o.ratio);
  // The fleet is read only when the coil's own history is too short; its observations of this coil are not "the fleet's".
  const fleetRatios =
    ownRatios.length >= MIN_RUNNING_OFFSET_OBSERVATIONS ? [] : fleet.filter((o) => before(o) && (o.coilId === null || o.coilId !== observation.coilId)).map((o) => o.ratio);
  const prediction = predictRunningFrequency(observation.sweptHz, estimateRunningOffset(ownRatios, fleetRatios));
  return { observation, prediction, deviation: (observation.runningHz - prediction.frequency) / prediction.frequency };
}

type Totals = { count: number; sum: number; sumOfSquares: number };
const minus = (a: RatioMoments, b: RatioMoments): RatioMoments => ({ count: a.count - b.count, sum: a.sum - b.sum, sumOfSquares: a.sumOfSquares - b.sumOfSquares });

/** Running totals of ratios over observations in time order: totals[i] covers the first i. */
function prefixTotals(observations: readonly RunningOffsetObservation[]): RatioMoments[] {
  const totals: RatioMoments[] = [{ count: 0, sum: 0, sumOfSquares: 0 }];
  const t: Totals = { count: 0, sum: 0, sumOfSquares: 0 };
  for (const o of observations) {
    t.count++;
    t.sum += o.ratio;
    t.sumOfSquares += o.ratio * o.ratio;
    totals.push({ ...t });
  }
  return totals;
}

/** How many of the time-ordered observations are strictly before `at` (binary search). */
function countBefore(observations: readonly RunningOffsetObservation[], at: number): number {
  let [lo, hi] = [0, observations.length];
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (observations[mid]!.at.getTime() < at) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * checkRunningFrequency for every observation of every coil, by running totals instead of re-filtering: the same
 * rule (own observations strictly earlier, else other coils' strictly earlier, else the prior) in O(n log n) for a
 * fleet's thousands of sessions. Each coil's observations must carry its coilId.
 */
export function checkAllRunningFrequencies(observationsByCoil: ReadonlyMap<string, readonly RunningOffsetObservation[]>): Map<string, RunningFrequencyCheck[]> {
  const byTime = (a: RunningOffsetObservation, b: RunningOffsetObservation) => a.at.getTime() - b.at.getTime();
  const fleet = [...observationsByCoil.values()].flat().sort(byTime);
  const fleetTotals = prefixTotals(fleet);
  const checks = new Map<string, RunningFrequencyCheck[]>();
  for (const [coilId, observations] of observationsByCoil) {
    const own = [...observations].sort(byTime);
    const ownTotals = prefixTotals(own);
    checks.set(
      coilId,
      own.map((observation) => {
        const at = observation.at.getTime();
        const ownBefore = ownTotals[countBefore(own, at)]!;
        const offset = estimateRunningOffsetFromMoments(ownBefore, minus(fleetTotals[countBefore(fleet, at)]!, ownBefore));
        const prediction = predictRunningFrequency(observation.sweptHz, offset);
        return { observation, prediction, deviation: (observation.runningHz - prediction.frequency) / prediction.frequency };
      }),
    );
  }
  return checks;
}

export const OFFSET_SOURCE_WORDS = {
  coil: "this coil's own earlier sessions",
  fleet: "the fleet's earlier sessions (this coil has fewer than two of its own)",
  prior: "the common-practice prior of 1 ± 5 % (no earlier sessions to learn from)",
} as const;

/** Every coil's observations from fleet-wide rows (sweeps and sessions chronological, each with its coilId). */
export function pairFleetRunning(sweeps: readonly (ResonanceSweepRow & { coilId: string })[], sessions: readonly (RunningSessionRow & { coilId: string })[]): RunningOffsetObservation[] {
  const sweepsByCoil = new Map<string, (ResonanceSweepRow & { coilId: string })[]>();
  for (const w of sweeps) (sweepsByCoil.get(w.coilId) ?? sweepsByCoil.set(w.coilId, []).get(w.coilId)!).push(w);
  const sessionsByCoil = new Map<string, (RunningSessionRow & { coilId: string })[]>();
  for (const s of sessions) (sessionsByCoil.get(s.coilId) ?? sessionsByCoil.set(s.coilId, []).get(s.coilId)!).push(s);
  return [...sessionsByCoil].flatMap(([coilId, rows]) => pairRunningWithSweeps(rows, sweepsByCoil.get(coilId) ?? []));
}

/**
 * Whether the coil's latest prediction could fall back on the fleet: its own observations, less the one being
 * predicted, are fewer than the model needs. Lets the coil page skip the fleet-wide read otherwise.
 */
export function needsFleetObservations(own: readonly RunningOffsetObservation[]): boolean {
  return own.length <= MIN_RUNNING_OFFSET_OBSERVATIONS;
}
