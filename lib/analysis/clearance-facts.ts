/**
 * The facts a clearance is judged on, built from one coil's stored history: for each margin the hardest of the recent
 * sessions at the coil's current setup (lowest headroom, judged by the policy), the longest run a usable warm-up fit
 * can defend, the latest sweep taken with the top load now fitted, open failures, and the clean sessions since the
 * last failure or repair. The policy's rules (lib/calc) do the judging.
 */
import type { ClearanceFacts } from "../calc/clearance-policy";
import type { Margin, MarginKind } from "../calc/margin";
import { analyzeRunSession, type SessionAnalysis, type SessionPolicy } from "./session-analysis";
import { partsFittedAt } from "./fitted-parts";
import type { StoredSinkFit } from "./session-fit";
import { findLatestSweepWithCurrentTopLoad } from "./current-top-load";
import type { CoilRecord, ComponentRecord, SampleRecord, SessionRecord, SweepRecord } from "./records";

/**
 * How many of the latest sessions at the current setup lending is judged on: enough to catch one hard run among
 * gentler ones, recent enough to describe the coil as it is (common practice).
 */
export const LENDING_RECENT_SESSIONS = 5;

export interface FailureRecord {
  occurredAt: Date;
  status: "open" | "closed";
  mode: string;
}

export interface ClearanceHistory {
  coil: CoilRecord;
  /** Every part ever fitted, in any order. */
  components: readonly ComponentRecord[];
  /** Chronological, with each session's stored warm-up fit. */
  sessions: readonly (SessionRecord & Partial<StoredSinkFit>)[];
  /** Chronological. */
  sweeps: readonly SweepRecord[];
  failures: readonly FailureRecord[];
  /** Heat-sink samples of the latest session (for its warm-up and run-time figure). */
  latestSessionSamples: readonly SampleRecord[];
}

export interface ClearanceFactsResult {
  facts: ClearanceFacts;
  latestSession: SessionRecord | null;
  latestAnalysis: SessionAnalysis | null;
  latestSweep: SweepRecord | null;
  /** When the count of clean sessions starts: the later of the last failure and the last repair. */
  cleanSince: Date | null;
  /** The recent sessions at the current setup that lending is judged on, analysed (latest last). */
  recent: { session: SessionRecord; analysis: SessionAnalysis }[];
  /** Which session each margin in facts.margins comes from (its hardest). */
  hardestSessionIds: Partial<Record<MarginKind, string>>;
  maxRun: MaxRunBound;
}

/** The longest run a clearance may allow, from a lower confidence bound of a usable warm-up fit, or none and why. */
export interface MaxRunBound {
  /** Seconds, or null when no usable fit offers a bound (Infinity: the junction limit is not reached at that supply). */
  seconds: number | null;
  sessionId: string | null;
  supplyVoltageV: number | null;
  confidence: number | null;
  reason: string;
}

/**
 * Parts fitted after the build was first put together: replacements and repairs. The first day's parts
 * are the build itself, so they are not repairs.
 */
export function findPartReplacements(components: readonly ComponentRecord[]): { at: Date; partDescription: string }[] {
  if (components.length === 0) return [];
  const firstFit = Math.min(...components.map((c) => c.installedAt.getTime()));
  return components
    .filter((c) => c.installedAt.getTime() > firstFit)
    .map((c) => ({ at: c.installedAt, partDescription: `${c.kind.replace(/_/g, " ")} ${c.partNumber}` }))
    .sort((a, b) => a.at.getTime() - b.at.getTime());
}

/** Facts for evaluateClearance; `checklist` holds the steward's answers by item id. */
export function buildClearanceFacts(
  history: ClearanceHistory,
  checklist: Readonly<Record<string, boolean>>,
  policy: SessionPolicy,
): ClearanceFactsResult {
  const latestSession = history.sessions.at(-1) ?? null;
  const recent = selectRecentAtCurrentSetup(history.sessions, history.components).map((session) => ({
    session,
    analysis: analyzeRunSession(history.coil, session, history.components, session === latestSession ? history.latestSessionSamples : null, { policy }),
  }));
  const latestAnalysis = recent.at(-1)?.analysis ?? null;
  const hardest = findHardestMargins(recent);
  const latestSweep = findLatestSweepForCurrentTopLoad(history.sweeps, latestSession);

  const lastFailure = maxTime(history.failures.map((f) => f.occurredAt));
  const lastRepair = maxTime(findPartReplacements(history.components).map((p) => p.at));
  const cleanSince = maxTime([lastFailure, lastRepair].filter((d): d is Date => d !== null));
  const failureFreeSessions = history.sessions.filter(
    (s) => s.outcome !== "failed" && (cleanSince === null || s.startedAt.getTime() > cleanSince.getTime()),
  ).length;

  return {
    facts: {
      margins: hardest.margins,
      firstSeriesResonanceHz: latestSweep?.firstSeriesResonanceHz ?? null,
      runningFrequencyHz: latestSession?.runningFrequencyHz ?? null,
      openFailures: history.failures.filter((f) => f.status === "open").length,
      lastSweepAt: latestSweep?.takenAt ?? null,
      failureFreeSessions,
      checklist,
    },
    latestSession,
    latestAnalysis,
    latestSweep,
    cleanSince,
    recent,
    hardestSessionIds: hardest.sessionIds,
    maxRun: findMaxRunBound(recent),
  };
}

/**
 * The latest LENDING_RECENT_SESSIONS sessions run with the parts and top load the latest session had: a session on
 * another switch or sink, or with another top load, says little about the coil as it would be lent.
 */
export function selectRecentAtCurrentSetup<T extends SessionRecord>(sessions: readonly T[], components: readonly ComponentRecord[]): T[] {
  const latest = sessions.at(-1);
  if (!latest) return [];
  const setupOf = (s: SessionRecord) =>
    `${s.topLoadId ?? ""}|${partsFittedAt(components, s.startedAt)
      .all.map((c) => c.id)
      .sort()
      .join(",")}`;
  const current = setupOf(latest);
  return sessions.filter((s) => setupOf(s) === current).slice(-LENDING_RECENT_SESSIONS);
}

/** For each margin, the recent session's with the least headroom; one that could not be worked out counts as hardest. */
function findHardestMargins(recent: readonly { session: SessionRecord; analysis: SessionAnalysis }[]) {
  const margins: Partial<Record<MarginKind, Margin>> = {};
  const sessionIds: Partial<Record<MarginKind, string>> = {};
  for (const kind of ["voltage", "current", "thermal"] as const) {
    let best: { margin: Margin; id: string } | null = null;
    for (const { session, analysis } of recent) {
      const margin = analysis.margins[kind];
      const key = margin.headroom ?? Number.NEGATIVE_INFINITY;
      // Ties go to the later session, so a coil with identical runs is described by its latest.
      if (best === null || key <= (best.margin.headroom ?? Number.NEGATIVE_INFINITY)) best = { margin, id: session.id };
    }
    if (best) {
      margins[kind] = best.margin;
      sessionIds[kind] = best.id;
    }
  }
  return { margins, sessionIds };
}

/** The shortest lower-bound run time among the recent sessions' usable warm-up fits. */
export function findMaxRunBound(recent: readonly { session: SessionRecord; analysis: SessionAnalysis }[]): MaxRunBound {
  let best: MaxRunBound | null = null;
  for (const { session, analysis } of recent) {
    const bound = analysis.warmUp?.longestRunLowerBoundS;
    if (bound === null || bound === undefined || !analysis.warmUp) continue;
    if (best === null || bound < (best.seconds ?? Number.POSITIVE_INFINITY)) {
      const percent = Math.round(analysis.warmUp.confidence * 100);
      best = {
        seconds: bound,
        sessionId: session.id,
        supplyVoltageV: session.supplyVoltageV,
        confidence: analysis.warmUp.confidence,
        reason: `Lower ${percent} % bound of the warm-up fit of the ${session.startedAt.toISOString().slice(0, 10)} session at ${session.supplyVoltageV} V.`,
      };
    }
  }
  return (
    best ?? {
      seconds: null,
      sessionId: null,
      supplyVoltageV: null,
      confidence: null,
      reason:
        recent.length === 0
          ? "No session at the coil's current setup is logged, so no run length can be offered."
          : "No recent session at the coil's current setup has a usable warm-up fit (enough samples, long enough to extrapolate), so no run length is offered: log a longer run with heat-sink samples.",
    }
  );
}

/** A sweep describes the coil with the top load it wore, so only sweeps with the current top load count (current-top-load.ts's rule). */
export function findLatestSweepForCurrentTopLoad(sweeps: readonly SweepRecord[], latestSession: SessionRecord | null): SweepRecord | null {
  return findLatestSweepWithCurrentTopLoad(sweeps, latestSession ? [latestSession] : []);
}

function maxTime(dates: readonly Date[]): Date | null {
  let best: Date | null = null;
  for (const d of dates) if (best === null || d.getTime() > best.getTime()) best = d;
  return best;
}
