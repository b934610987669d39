/**
 * One run session read through lib/calc: its voltage, current and thermal margins with the parts fitted that day,
 * judged by the current lending policy's thresholds, and its heat-sink warm-up carried to the junction. A run still
 * warming up is judged where it was heading (the fit's steady state at its upper confidence bound); a run with no
 * usable fit at a clearly marked worst case.
 */
import { sessionMargins, type SessionMarginOptions, type SessionMargins, type SwitchRatings, type ThermalPath } from "../calc/session-margins";
import { sessionHeadrooms, type SessionHeadrooms } from "../calc/session-headrooms";
import { analyzeWarmUp, DEFAULT_WARM_UP_CONFIDENCE, type WarmUpAnalysis } from "../calc/warm-up";
import { CalcInputError } from "../calc/errors";
import { marginThresholdsOf, type ClearancePolicyRules } from "../calc/clearance-policy";
import { sinkResistanceForRun, type SinkResistance } from "../calc/fan-cooling";
import { steadyStateUpperBound } from "../calc/heating";
import { TYPICAL_CASE_TO_SINK_K_PER_W, worstCaseSink, worstCaseSinkProjection, type SinkProjection } from "../calc/thermal-margin";
import { partsFittedAt, type FittedParts } from "./fitted-parts";
import { fitFromSamples, readStoredSinkFit, type SessionFit, type StoredSinkFit } from "./session-fit";
import type { CoilRecord, ComponentRecord, SampleRecord, SessionRecord } from "./records";

export interface SessionAnalysis {
  margins: SessionMargins;
  warmUp: WarmUpAnalysis | null;
  /** Why there is no warm-up analysis, when there is none. */
  warmUpNote: string | null;
  parts: FittedParts;
  /** The junction temperature the run-time figure keeps under, °C. */
  junctionLimitC: number | null;
  /** What the thermal margin was judged at, when not the recorded temperatures. */
  sinkProjection: SinkProjection | null;
}

/** The policy rules a session's analysis reads: the margin thresholds and the junction margin. */
export type SessionPolicy = Pick<ClearancePolicyRules, "minVoltageHeadroom" | "minCurrentHeadroom" | "minThermalHeadroom" | "minJunctionMarginK">;

export interface SessionAnalysisOptions {
  /** The current lending policy: its thresholds are the only ones a margin's status is judged by. */
  policy: SessionPolicy;
  /** One-sided confidence of the projection and the run-time bound (default DEFAULT_WARM_UP_CONFIDENCE). */
  confidence?: number;
  /**
   * partsFittedAt(components, session.startedAt), when the caller has it already (analyzeSessions works it out once
   * for each set of parts its sessions ran with, instead of once a session).
   */
  parts?: FittedParts;
  /** sessionRigOf(parts, policy), when the caller has it already (for the same parts and policy). */
  rig?: SessionRig;
}

let noSamples: SessionFit | undefined;

/**
 * fitFromSamples([]): what a session with neither a stored fit nor samples in hand is judged by. Always the same
 * answer (a note, no fit), worked out once: a dashboard judges tens of thousands of such sessions.
 */
function noSamplesFit(): SessionFit {
  return (noSamples ??= fitFromSamples([]));
}

/**
 * What a session's margins read from the parts fitted that day and the policy, the same for every session run with
 * those parts: worked out once per set of parts by a caller that judges many sessions (sessionRigOf).
 */
export interface SessionRig {
  parts: FittedParts;
  /** The junction temperature the run-time figure keeps under, °C. */
  junctionLimitC: number | null;
  junctionToSink: number | undefined;
  switchesOnSink: number;
  /** The sink's Rθsa for a run with these parts (a fan's factor applied), or null when the sink has none recorded. */
  sinkR: SinkResistance | null;
  switchRatings: SwitchRatings;
  thermalPath: ThermalPath;
}

/**
 * The rig of a session run with `parts` under `policy`. Its one check (the sink's Rθsa) runs where analyzeRunSession
 * always ran it, before the stored fit is read, so a session judged with a rig fails as one judged without.
 */
export function sessionRigOf(parts: FittedParts, policy: SessionPolicy): SessionRig {
  const sw = parts.switches[0] ?? null;
  const switchesOnSink = Math.max(1, parts.switches.length);
  const junctionToSink = sw?.thermalResistanceJcKPerW != null ? sw.thermalResistanceJcKPerW + (sw.caseToSinkKPerW ?? TYPICAL_CASE_TO_SINK_K_PER_W) : undefined;
  const junctionLimitC = sw?.maxJunctionTempC != null ? sw.maxJunctionTempC - policy.minJunctionMarginK : null;
  const naturalSinkR = parts.sink?.sinkThermalResistanceKPerW ?? null;
  const sinkR = naturalSinkR === null ? null : sinkResistanceForRun({ naturalKPerW: naturalSinkR, fanFitted: parts.fan !== null, withFanKPerW: parts.fan?.sinkThermalResistanceKPerW });
  return {
    parts,
    junctionLimitC,
    junctionToSink,
    switchesOnSink,
    sinkR,
    switchRatings: sw ?? {},
    thermalPath: {
      sinkThermalResistanceKPerW: sinkR?.value ?? null,
      sinkThermalResistanceEstimate: sinkR?.estimated ? sinkR.source : null,
      caseToSinkKPerW: sw?.caseToSinkKPerW ?? null,
      switchesOnSink,
    },
  };
}

/** What sessionMargins reads of a session run on `rig`, judged at `sinkProjection`. */
function marginsInputOf<P>(coil: CoilRecord, session: SessionRecord, rig: SessionRig, sinkProjection: P) {
  return {
    topology: coil.topology,
    voltageClamp: rig.parts.clamp !== null,
    voltageClampV: rig.parts.clamp?.clampVoltageV ?? null,
    supplyVoltageV: session.supplyVoltageV,
    supplyCurrentA: session.supplyCurrentA,
    ambientTempC: session.ambientTempC,
    heatSinkEndC: session.heatSinkEndC,
    sinkSteadyStateC: null,
    sinkProjection,
    peakSwitchVoltageV: session.peakSwitchVoltageV,
    dutyCycle: session.dutyCycle,
  };
}

/**
 * The session's margins and warm-up. The warm-up fit stored with the session is used when there is one; otherwise
 * `samples` are fitted the same way (session-fit.ts), so a view with samples and a view without agree.
 */
export function analyzeRunSession(
  coil: CoilRecord,
  session: SessionRecord & Partial<StoredSinkFit>,
  components: readonly ComponentRecord[],
  samples: readonly SampleRecord[] | null,
  options: SessionAnalysisOptions,
): SessionAnalysis {
  const confidence = options.confidence ?? DEFAULT_WARM_UP_CONFIDENCE;
  const parts = options.parts ?? partsFittedAt(components, session.startedAt);
  const rig = options.rig ?? sessionRigOf(parts, options.policy);
  const { junctionLimitC, junctionToSink, switchesOnSink, sinkR } = rig;

  const sessionFit: SessionFit = readStoredSinkFit(session) ?? (samples === null || samples.length === 0 ? noSamplesFit() : fitFromSamples(samples));
  let warmUp: WarmUpAnalysis | null = null;
  let warmUpNote: string | null = sessionFit.note;
  if (sessionFit.fit !== null) {
    if (junctionLimitC === null) {
      warmUpNote = "The switch's maximum junction temperature is not recorded, so the run time cannot be worked out.";
    } else {
      try {
        warmUp = analyzeWarmUp({
          fit: sessionFit.fit,
          junctionLimitC,
          junctionToSink,
          sinkToAmbientKPerW: sinkR?.value,
          ambientC: session.ambientTempC,
          switchesOnSink,
          confidence,
        });
      } catch (error) {
        if (!(error instanceof CalcInputError)) throw error;
        warmUpNote = `The warm-up could not be carried to the junction: ${error.message}.`;
      }
    }
  }

  const sinkProjection = projectSink(session, sessionFit, sinkR?.value ?? null, confidence);
  const margins = sessionMargins(marginsInputOf(coil, session, rig, sinkProjection), rig.switchRatings, rig.thermalPath, { thresholds: marginThresholdsOf(options.policy) });
  return { margins, warmUp, warmUpNote, parts: rig.parts, junctionLimitC, sinkProjection };
}

/**
 * The same session's three headrooms only (lib/calc/session-headrooms.ts): no warm-up, no notes, no sentences. What a
 * health window's older sessions need (their headrooms feed the trends; only the latest one's margins are shown).
 * Equal to analyzeRunSession(…).margins' headrooms, double for double, and throws a CalcInputError wherever it would
 * (test/coil-figures-headrooms.test.ts). The warm-up it leaves out never moves a margin: analyzeRunSession keeps
 * it apart and turns its CalcInputErrors into a note.
 */
export function analyzeRunSessionHeadrooms(
  coil: CoilRecord,
  session: SessionRecord & Partial<StoredSinkFit>,
  rig: SessionRig,
  /** { thresholds: marginThresholdsOf(policy) }, worked out once by the caller. */
  marginOptions: SessionMarginOptions,
  confidence = DEFAULT_WARM_UP_CONFIDENCE,
): SessionHeadrooms {
  const fit = (readStoredSinkFit(session) ?? noSamplesFit()).fit;
  const sinkR = rig.sinkR?.value ?? null;
  let sinkC: number | null = null;
  // projectSink's figure without its words: a usable fit's upper bound, else the worst case (when Rθsa is known).
  if (fit !== null && fit.extrapolation !== "too-short" && Number.isFinite(fit.standardErrors.steadyState)) {
    sinkC = Math.max(steadyStateUpperBound(fit, confidence), session.heatSinkEndC ?? Number.NEGATIVE_INFINITY);
  } else if (sinkR !== null) {
    sinkC = worstCaseSink({ ambientTempC: session.ambientTempC, supplyVoltageV: session.supplyVoltageV, supplyCurrentA: session.supplyCurrentA, sinkToAmbientKPerW: sinkR }).sinkC;
    const end = session.heatSinkEndC;
    if (end !== null && end > sinkC) sinkC = end;
  }
  return sessionHeadrooms(marginsInputOf(coil, session, rig, sinkC === null ? null : { sinkC }), rig.switchRatings, rig.thermalPath, marginOptions);
}

/**
 * Where the judged sink temperature comes from: a usable fit's steady state at its upper confidence bound; without a
 * usable fit, the worst case of thermal-margin.ts (needs the sink's Rθsa; without it the margin says what is missing).
 */
function projectSink(session: SessionRecord, sessionFit: SessionFit, sinkR: number | null, confidence: number): SinkProjection | null {
  const fit = sessionFit.fit;
  const percent = Math.round(confidence * 100);
  if (fit !== null && fit.extrapolation !== "too-short" && Number.isFinite(fit.standardErrors.steadyState)) {
    const upper = steadyStateUpperBound(fit, confidence);
    return {
      basis: "fit-upper-bound",
      sinkC: Math.max(upper, session.heatSinkEndC ?? Number.NEGATIVE_INFINITY),
      source: `upper ${percent} % bound of the warm-up fit's steady state, ${fit.steadyState.toFixed(1)} ± ${fit.standardErrors.steadyState.toFixed(1)} K`,
    };
  }
  if (sinkR === null) return null;
  const reason = fit === null ? "too few heat-sink samples to fit a warm-up" : "the warm-up fit is too short to show where the sink levels off";
  const worst = worstCaseSinkProjection({ ambientTempC: session.ambientTempC, supplyVoltageV: session.supplyVoltageV, supplyCurrentA: session.supplyCurrentA, sinkToAmbientKPerW: sinkR, reason });
  // A recorded reading above the bound means the sink's rating is optimistic: the reading is then the worse case.
  const end = session.heatSinkEndC;
  return end !== null && end > worst.sinkC ? { ...worst, sinkC: end, source: `${worst.source}; the recorded end temperature was hotter still and is used` } : worst;
}
