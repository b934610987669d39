/**
 * A coil's logbook, analysed session by session, turned into lib/calc's health assessment. judgeCoil is the one coil
 * judgement: the dashboard's stored summary (lib/db/coil-summary.ts), the coil page, the trends page and the
 * benchmark all call it with (history, policy, now), so they cannot disagree.
 */
import { assessCoilHealth, type CoilHealth, type OpenFailure } from "../calc/coil-health";
import type { CoilSession, CoilSweep } from "../calc/coil-logbook";
import { findCurrentTopLoadId } from "./current-top-load";
import { CalcInputError } from "../calc/errors";
import { analyzeRunSession, type SessionAnalysis } from "./session-analysis";
import { isFittedAt, partsFittedAt, type FittedParts } from "./fitted-parts";
import type { ClearancePolicyRules } from "../calc/clearance-policy";
import { selectHealthWindow } from "./health-window";
import type { StoredSinkFit } from "./session-fit";
import type { CoilRecord, ComponentRecord, SessionRecord, SweepRecord } from "./records";

export interface AnalyzedSession {
  session: SessionRecord;
  analysis: SessionAnalysis;
}

/** A session as the health path reads it: the row with its stored warm-up fit (no samples). */
export type StoredSessionRecord = SessionRecord & Partial<StoredSinkFit>;

/** Margins for every session, judged by `policy`, from each session's stored warm-up fit. */
export function analyzeSessions(
  coil: CoilRecord,
  sessions: readonly StoredSessionRecord[],
  components: readonly ComponentRecord[],
  policy: ClearancePolicyRules,
): AnalyzedSession[] {
  // Sessions run with the same parts share one partsFittedAt answer (the same for every session between two part
  // changes); the set fitted is a bit per part, so up to 30 parts are keyed, more are worked out session by session.
  const keyed = components.length <= 30;
  const partsBySet = new Map<number, FittedParts>();
  return sessions.map((session) => {
    let parts: FittedParts | undefined;
    if (keyed) {
      let set = 0;
      for (let i = 0; i < components.length; i++) if (isFittedAt(components[i]!, session.startedAt)) set |= 1 << i;
      parts = partsBySet.get(set);
      if (parts === undefined) partsBySet.set(set, (parts = partsFittedAt(components, session.startedAt)));
    }
    return { session, analysis: analyzeRunSession(coil, session, components, null, { policy, parts }) };
  });
}

export function toCoilSession({ session, analysis }: AnalyzedSession): CoilSession {
  return {
    startedAt: session.startedAt,
    supplyVoltageV: session.supplyVoltageV,
    supplyCurrentA: session.supplyCurrentA,
    runningFrequencyHz: session.runningFrequencyHz,
    voltageHeadroom: analysis.margins.voltage.headroom,
    currentHeadroom: analysis.margins.current.headroom,
    thermalHeadroom: analysis.margins.thermal.headroom,
    heatSinkRiseK: session.heatSinkEndC === null ? null : session.heatSinkEndC - session.ambientTempC,
    durationS: session.durationS,
  };
}

export function toCoilSweeps(sweeps: readonly SweepRecord[]): CoilSweep[] {
  return sweeps.filter((s) => s.firstSeriesResonanceHz !== null).map((s) => ({ takenAt: s.takenAt, firstSeriesResonanceHz: s.firstSeriesResonanceHz! }));
}

/**
 * The coil's health against the lending policy's margin thresholds, so "hold" on the dashboard and a
 * refused clearance speak of the same limits. A top load changes the resonance by design, so running
 * frequency and sweeps are compared only among those taken with the top load fitted last.
 */
export function assessCoil(
  analyzed: readonly AnalyzedSession[],
  sweeps: readonly SweepRecord[],
  now: Date,
  policy: ClearancePolicyRules,
  openFailures: readonly OpenFailure[] = [],
): CoilHealth {
  const currentTopLoad = findCurrentTopLoadId(sweeps, analyzed.map((a) => a.session));
  const sessions = analyzed.map((a) => {
    const row = toCoilSession(a);
    return (a.session.topLoadId ?? null) === currentTopLoad ? row : { ...row, runningFrequencyHz: null };
  });
  return assessCoilHealth({
    sessions,
    sweeps: toCoilSweeps(sweeps.filter((s) => (s.topLoadId ?? null) === currentTopLoad)),
    now,
    thresholds: { voltageHeadroom: policy.minVoltageHeadroom, currentHeadroom: policy.minCurrentHeadroom, thermalHeadroom: policy.minThermalHeadroom },
    openFailures,
  });
}

/** What judgeCoil reads: the coil, every part ever fitted, its sessions (chronological, with stored fits) and sweeps. */
export interface CoilJudgementHistory {
  coil: CoilRecord;
  components: readonly ComponentRecord[];
  sessions: readonly StoredSessionRecord[];
  sweeps: readonly SweepRecord[];
  /** Failures without a completed post-mortem; each holds the coil. */
  openFailures: readonly OpenFailure[];
}

export interface CoilJudgement {
  /** Null when the logbook could not be assessed; `reasons` then says why. */
  health: CoilHealth | null;
  reasons: string[];
  /** The sessions judged (the health window, lib/analysis/health-window.ts), analysed under the policy. */
  analyzed: AnalyzedSession[];
  /** The latest of them: the margins every list shows for the coil. */
  latest: AnalyzedSession | null;
}

/** The one coil judgement, from (history, policy, now): health over the health window, and the latest margins. */
export function judgeCoil(history: CoilJudgementHistory, policy: ClearancePolicyRules, now: Date): CoilJudgement {
  try {
    const analyzed = analyzeSessions(history.coil, selectHealthWindow(history.sessions), history.components, policy);
    const health = assessCoil(analyzed, history.sweeps, now, policy, history.openFailures);
    return { health, reasons: health.reasons, analyzed, latest: analyzed.at(-1) ?? null };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { health: null, reasons: [`The logbook could not be assessed: ${error.message}.`], analyzed: [], latest: null };
  }
}
