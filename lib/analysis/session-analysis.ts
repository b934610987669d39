/**
 * One run session read through lib/calc: its voltage, current and thermal margins with the parts
 * fitted that day, and its heat-sink warm-up carried to the junction.
 */
import { sessionMargins, type SessionMargins } from "../calc/session-margins";
import { analyzeWarmUp, type WarmUpAnalysis } from "../calc/warm-up";
import { CalcInputError } from "../calc/errors";
import { DEFAULT_CLEARANCE_POLICY } from "../calc/clearance-policy";
import { partsFittedAt, type FittedParts } from "./fitted-parts";
import type { CoilRecord, ComponentRecord, SampleRecord, SessionRecord } from "./records";

export interface SessionAnalysis {
  margins: SessionMargins;
  warmUp: WarmUpAnalysis | null;
  /** Why there is no warm-up analysis, when there is none. */
  warmUpNote: string | null;
  parts: FittedParts;
  /** The junction temperature the run-time figure keeps under, °C. */
  junctionLimitC: number | null;
}

export interface SessionAnalysisOptions {
  /** Kelvin kept below Tj,max for the longest-run figure (default: the lending policy's junction margin). */
  junctionMarginK?: number;
}

export function analyzeRunSession(
  coil: CoilRecord,
  session: SessionRecord,
  components: readonly ComponentRecord[],
  samples: readonly SampleRecord[] = [],
  options: SessionAnalysisOptions = {},
): SessionAnalysis {
  const parts = partsFittedAt(components, session.startedAt);
  const sw = parts.switches[0] ?? null;
  const switchesOnSink = Math.max(1, parts.switches.length);
  const junctionToSink = sw?.thermalResistanceJcKPerW != null ? sw.thermalResistanceJcKPerW + (sw.caseToSinkKPerW ?? 0.5) : undefined;
  const junctionLimitC = sw?.maxJunctionTempC != null ? sw.maxJunctionTempC - (options.junctionMarginK ?? DEFAULT_CLEARANCE_POLICY.minJunctionMarginK) : null;

  let warmUp: WarmUpAnalysis | null = null;
  let warmUpNote: string | null = null;
  if (samples.length < 3) {
    warmUpNote = "Fewer than three heat-sink samples were logged, so there is no warm-up curve.";
  } else if (junctionLimitC === null) {
    warmUpNote = "The switch's maximum junction temperature is not recorded, so the run time cannot be worked out.";
  } else {
    const sinkR = parts.sink?.sinkThermalResistanceKPerW ?? null;
    try {
      const firstPass = analyzeWarmUp({ samples: samples.map((s) => ({ time: s.elapsedS, temperature: s.temperatureC })), junctionLimitC });
      // Dissipation per switch from the fitted steady rise over the sink's rated resistance (P = ΔT/Rθsa).
      const dissipation = sinkR ? Math.max(0, firstPass.fit.steadyState - session.ambientTempC) / sinkR / switchesOnSink : undefined;
      warmUp =
        dissipation !== undefined && junctionToSink !== undefined
          ? analyzeWarmUp({ samples: samples.map((s) => ({ time: s.elapsedS, temperature: s.temperatureC })), junctionLimitC, dissipation, junctionToSink })
          : firstPass;
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      warmUpNote = `The heat-sink samples could not be fitted: ${error.message}.`;
    }
  }

  const margins = sessionMargins(
    {
      topology: coil.topology,
      voltageClamp: parts.clamp !== null,
      voltageClampV: parts.clamp?.clampVoltageV ?? null,
      supplyVoltageV: session.supplyVoltageV,
      supplyCurrentA: session.supplyCurrentA,
      ambientTempC: session.ambientTempC,
      heatSinkEndC: session.heatSinkEndC,
      sinkSteadyStateC: warmUp && warmUp.fit.extrapolation !== "too-short" ? warmUp.fit.steadyState : null,
      peakSwitchVoltageV: session.peakSwitchVoltageV,
      dutyCycle: session.dutyCycle,
    },
    sw ?? {},
    { sinkThermalResistanceKPerW: parts.sink?.sinkThermalResistanceKPerW ?? null, caseToSinkKPerW: sw?.caseToSinkKPerW ?? null, switchesOnSink },
  );
  return { margins, warmUp, warmUpNote, parts, junctionLimitC };
}
