/**
 * A coil's logbook, analysed session by session, turned into lib/calc's health assessment. judgeCoil is the one coil
 * judgement: the dashboard's stored summary (lib/db/coil-summary.ts), the coil page, the trends page and the
 * benchmark all call it with (history, policy, now), so they cannot disagree.
 */
import { assessCoilHealth, assessCoilVerdict, toCoilVerdict, type CoilHealth, type CoilHealthInput, type CoilVerdict, type OpenFailure } from "../calc/coil-health";
import type { CoilSession, CoilSweep } from "../calc/coil-logbook";
import { findCurrentTopLoadId } from "./current-top-load";
import { CalcInputError } from "../calc/errors";
import { analyzeRunSession, analyzeRunSessionHeadrooms, sessionRigOf, type SessionAnalysis, type SessionPolicy, type SessionRig } from "./session-analysis";
import { isFittedAt, partsFittedAt } from "./fitted-parts";
import { marginThresholdsOf, type ClearancePolicyRules } from "../calc/clearance-policy";
import type { SessionHeadrooms } from "../calc/session-headrooms";
import type { SessionMargins } from "../calc/session-margins";
import { selectHealthWindow } from "./health-window";
import type { StoredSinkFit } from "./session-fit";
import type { CoilRecord, ComponentRecord, SessionRecord, SweepRecord } from "./records";

export interface AnalyzedSession {
  session: SessionRecord;
  analysis: SessionAnalysis;
}

/** A session as the health path reads it: the row with its stored warm-up fit (no samples). */
export type StoredSessionRecord = SessionRecord & Partial<StoredSinkFit>;

/**
 * The rig (parts fitted and what the margins read of them) of a session started at a given instant. Sessions run with
 * the same parts share one answer (the same for every session between two part changes); the set fitted is a bit per
 * part, so up to 30 parts are keyed, more are worked out session by session.
 */
function rigsOf(components: readonly ComponentRecord[], policy: SessionPolicy): (startedAt: Date) => SessionRig {
  const keyed = components.length <= 30;
  const rigBySet = new Map<number, SessionRig>();
  return (startedAt) => {
    if (!keyed) return sessionRigOf(partsFittedAt(components, startedAt), policy);
    let set = 0;
    for (let i = 0; i < components.length; i++) if (isFittedAt(components[i]!, startedAt)) set |= 1 << i;
    let rig = rigBySet.get(set);
    if (rig === undefined) rigBySet.set(set, (rig = sessionRigOf(partsFittedAt(components, startedAt), policy)));
    return rig;
  };
}

/** Margins for every session, judged by `policy`, from each session's stored warm-up fit. */
export function analyzeSessions(
  coil: CoilRecord,
  sessions: readonly StoredSessionRecord[],
  components: readonly ComponentRecord[],
  policy: ClearancePolicyRules,
): AnalyzedSession[] {
  const rigAt = rigsOf(components, policy);
  return sessions.map((session) => {
    const rig = rigAt(session.startedAt);
    return { session, analysis: analyzeRunSession(coil, session, components, null, { policy, parts: rig.parts, rig }) };
  });
}

/** A session's three headrooms, as its full margins give them. */
export function headroomsOf(margins: SessionMargins): SessionHeadrooms {
  return { voltage: margins.voltage.headroom, current: margins.current.headroom, thermal: margins.thermal.headroom };
}

export function toCoilSession({ session, analysis }: AnalyzedSession): CoilSession {
  return toCoilSessionOf(session, headroomsOf(analysis.margins));
}

function toCoilSessionOf(session: SessionRecord, headrooms: SessionHeadrooms): CoilSession {
  return {
    startedAt: session.startedAt,
    supplyVoltageV: session.supplyVoltageV,
    supplyCurrentA: session.supplyCurrentA,
    runningFrequencyHz: session.runningFrequencyHz,
    voltageHeadroom: headrooms.voltage,
    currentHeadroom: headrooms.current,
    thermalHeadroom: headrooms.thermal,
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
  return assessCoilHealth(
    healthInputOf(
      analyzed.map((a) => a.session),
      analyzed.map((a) => headroomsOf(a.analysis.margins)),
      sweeps,
      now,
      policy,
      openFailures,
    ),
  );
}

/** assessCoil's input from the sessions and their headrooms (index for index): all the health assessment reads of a margin. */
function healthInputOf(
  sessions: readonly SessionRecord[],
  headrooms: readonly SessionHeadrooms[],
  sweeps: readonly SweepRecord[],
  now: Date,
  policy: ClearancePolicyRules,
  openFailures: readonly OpenFailure[],
): CoilHealthInput {
  const currentTopLoad = findCurrentTopLoadId(sweeps, sessions);
  const rows = sessions.map((session, i) => {
    const row = toCoilSessionOf(session, headrooms[i]!);
    return (session.topLoadId ?? null) === currentTopLoad ? row : { ...row, runningFrequencyHz: null };
  });
  return {
    sessions: rows,
    sweeps: toCoilSweeps(sweeps.filter((s) => (s.topLoadId ?? null) === currentTopLoad)),
    now,
    thresholds: { voltageHeadroom: policy.minVoltageHeadroom, currentHeadroom: policy.minCurrentHeadroom, thermalHeadroom: policy.minThermalHeadroom },
    openFailures,
  };
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

/** What the dashboard's stored summary needs of the one judgement (judgeCoilFigures). */
export interface CoilFiguresJudgement {
  /** judgeCoil's health as a verdict (no trends: the summary stores none); null when the logbook could not be assessed. */
  health: CoilVerdict | null;
  reasons: string[];
  /** The headrooms of the sessions judged (the health window), oldest first. */
  headrooms: SessionHeadrooms[];
  /** The latest session, analysed in full: the margins every list shows for the coil. */
  latest: AnalyzedSession | null;
}

/**
 * judgeCoil's health, reasons, latest margins and window headrooms, with the window's older sessions analysed for
 * their headrooms only (analyzeRunSessionHeadrooms: no warm-up, notes or sentences, which were about half the cold
 * dashboard's judgement beyond its floor; only the latest session's margins are shown and stored). The health is
 * assessed from the same numbers as judgeCoil's, as a verdict (lib/calc/coil-health.ts assessCoilVerdict: the summary
 * stores no trend, so only those that can raise a finding are fitted), so every figure is the same. When anything cannot be analysed the
 * whole coil is judged again by judgeCoil, whose reason names the first session it could not analyse in its own
 * words. test/coil-figures-headrooms.test.ts checks the two against each other on generated logbooks.
 */
export function judgeCoilFigures(history: CoilJudgementHistory, policy: ClearancePolicyRules, now: Date): CoilFiguresJudgement {
  try {
    const window = selectHealthWindow(history.sessions);
    const rigAt = rigsOf(history.components, policy);
    const marginOptions = { thresholds: marginThresholdsOf(policy) };
    const headrooms: SessionHeadrooms[] = [];
    const last = window.length - 1;
    for (let i = 0; i < last; i++) headrooms.push(analyzeRunSessionHeadrooms(history.coil, window[i]!, rigAt(window[i]!.startedAt), marginOptions));
    let latest: AnalyzedSession | null = null;
    if (last >= 0) {
      const session = window[last]!;
      const rig = rigAt(session.startedAt);
      latest = { session, analysis: analyzeRunSession(history.coil, session, history.components, null, { policy, parts: rig.parts, rig }) };
      headrooms.push(headroomsOf(latest.analysis.margins));
    }
    const health = assessCoilVerdict(healthInputOf(window, headrooms, history.sweeps, now, policy, history.openFailures));
    return { health, reasons: health.reasons, headrooms, latest };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    const judged = judgeCoil(history, policy, now);
    return { health: judged.health && toCoilVerdict(judged.health), reasons: judged.reasons, headrooms: judged.analyzed.map((a) => headroomsOf(a.analysis.margins)), latest: judged.latest };
  }
}
