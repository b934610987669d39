/**
 * The facts a clearance is judged on, built from one coil's stored history: the latest session's margins
 * with the parts fitted that day, the latest sweep taken with the top load now fitted, open failures, and
 * the clean sessions since the last failure or repair. The policy's rules (lib/calc) do the judging.
 */
import type { ClearanceFacts, ClearancePolicyRules } from "../calc/clearance-policy";
import { findLatestSweepWithCurrentTopLoad } from "./current-top-load";
import { analyzeRunSession, type SessionAnalysis } from "./session-analysis";
import type { CoilRecord, ComponentRecord, SampleRecord, SessionRecord, SweepRecord } from "./records";

export interface FailureRecord {
  occurredAt: Date;
  status: "open" | "closed";
  mode: string;
}

export interface ClearanceHistory {
  coil: CoilRecord;
  /** Every part ever fitted, in any order. */
  components: readonly ComponentRecord[];
  /** Chronological. */
  sessions: readonly SessionRecord[];
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
  policy: Pick<ClearancePolicyRules, "minJunctionMarginK">,
): ClearanceFactsResult {
  const latestSession = history.sessions.at(-1) ?? null;
  const latestAnalysis = latestSession
    ? analyzeRunSession(history.coil, latestSession, history.components, history.latestSessionSamples, { junctionMarginK: policy.minJunctionMarginK })
    : null;
  const latestSweep = findLatestSweepForCurrentTopLoad(history.sweeps, latestSession);

  const lastFailure = maxTime(history.failures.map((f) => f.occurredAt));
  const lastRepair = maxTime(findPartReplacements(history.components).map((p) => p.at));
  const cleanSince = maxTime([lastFailure, lastRepair].filter((d): d is Date => d !== null));
  const failureFreeSessions = history.sessions.filter(
    (s) => s.outcome !== "failed" && (cleanSince === null || s.startedAt.getTime() > cleanSince.getTime()),
  ).length;

  return {
    facts: {
      margins: latestAnalysis ? latestAnalysis.margins : {},
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
  };
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
