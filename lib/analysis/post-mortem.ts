/**
 * What a post-mortem reads: the parts fitted when the failure occurred, the margins of the sessions
 * before it (each analysed with the parts fitted that day) and lib/calc's ranked likely causes.
 */
import { rankLikelyCauses, type FailedComponentKind, type FailureCause, type RankedCause, type SessionHistoryEntry, type SwitchType } from "../calc/failure-analysis";
import { partsFittedAt, type FittedParts } from "./fitted-parts";
import { analyzeRunSession, type SessionAnalysis, type SessionPolicy } from "./session-analysis";
import type { CoilRecord, ComponentRecord, SampleRecord, SessionRecord } from "./records";

export interface AnalysedSession {
  session: SessionRecord;
  analysis: SessionAnalysis;
}

export interface PostMortemAnalysis {
  partsAtFailure: FittedParts;
  sessions: AnalysedSession[];
  causes: RankedCause[];
}

export interface PostMortemInputs {
  coil: CoilRecord;
  components: readonly ComponentRecord[];
  failure: { occurredAt: Date; mode: FailureCause; component: { kind: string; switchType?: string | null } | null };
  /** The current lending policy, whose thresholds judge each session's margins. */
  policy: SessionPolicy;
  /** The sessions before the failure, oldest first, each with its heat-sink samples. */
  sessionsBefore: readonly (SessionRecord & { samples: readonly SampleRecord[] })[];
}

/** The SessionHistoryEntry rankLikelyCauses reads, from a stored session and its analysis. */
export function toHistoryEntry({ session, analysis }: AnalysedSession): SessionHistoryEntry {
  return {
    startedAt: session.startedAt,
    margins: analysis.margins,
    supplyVoltage: session.supplyVoltageV,
    supplyCurrent: session.supplyCurrentA,
    runningFrequency: session.runningFrequencyHz,
    outcome: session.outcome,
    heatSinkEnd: session.heatSinkEndC,
    ambientTemp: session.ambientTempC,
    durationS: session.durationS,
  };
}

export function analyzePostMortem(input: PostMortemInputs): PostMortemAnalysis {
  const partsAtFailure = partsFittedAt(input.components, input.failure.occurredAt);
  const sessions = input.sessionsBefore.map((session) => ({ session, analysis: analyzeRunSession(input.coil, session, input.components, session.samples, { policy: input.policy }) }));
  const failedSwitch = input.failure.component?.kind === "switch" ? input.failure.component : partsAtFailure.switches[0];
  const causes = rankLikelyCauses({
    failure: { mode: input.failure.mode, componentKind: (input.failure.component?.kind ?? null) as FailedComponentKind | null, occurredAt: input.failure.occurredAt },
    recentSessions: sessions.map(toHistoryEntry),
    switchType: (failedSwitch?.switchType ?? null) as SwitchType | null,
    topology: input.coil.topology,
  });
  return { partsAtFailure, sessions, causes };
}
