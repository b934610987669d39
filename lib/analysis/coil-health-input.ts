/** A coil's logbook, analysed session by session, turned into lib/calc's health assessment. */
import { assessCoilHealth, type CoilHealth } from "../calc/coil-health";
import type { CoilSession, CoilSweep } from "../calc/coil-logbook";
import { findCurrentTopLoadId } from "./current-top-load";
import { analyzeRunSession, type SessionAnalysis } from "./session-analysis";
import { DEFAULT_CLEARANCE_POLICY, type ClearancePolicyRules } from "../calc/clearance-policy";
import type { CoilRecord, ComponentRecord, SessionRecord, SweepRecord } from "./records";

export interface AnalyzedSession {
  session: SessionRecord;
  analysis: SessionAnalysis;
}

/** Margins for every session (without warm-up fits, which need the samples). */
export function analyzeSessions(coil: CoilRecord, sessions: readonly SessionRecord[], components: readonly ComponentRecord[]): AnalyzedSession[] {
  return sessions.map((session) => ({ session, analysis: analyzeRunSession(coil, session, components) }));
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
  policy: Pick<ClearancePolicyRules, "minVoltageHeadroom" | "minCurrentHeadroom" | "minThermalHeadroom"> = DEFAULT_CLEARANCE_POLICY,
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
  });
}
