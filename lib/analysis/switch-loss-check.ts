/**
 * A run session's power cross-check: one switch's conduction + switching loss estimated from the
 * session's currents, supply and running frequency (lib/calc/switch-losses.ts), beside the heat the
 * sink's temperature rise implies (P = ΔT/Rθsa, shared by the switches on the sink).
 */
import { estimateSwitchCurrents } from "../calc/current-margin";
import { CalcInputError } from "../calc/errors";
import { crossCheckSinkPower, estimateSwitchLosses, type PowerCrossCheck, type SwitchLossEstimate } from "../calc/switch-losses";
import { inferSinkDissipation } from "../calc/thermal-margin";
import type { SessionAnalysis } from "./session-analysis";
import type { CoilRecord, SessionRecord } from "./records";

export type SwitchLossCheck =
  | { ok: true; estimate: SwitchLossEstimate; sinkInferredW: number; sinkBasis: string; crossCheck: PowerCrossCheck }
  | { ok: false; reason: string };

export function checkSwitchLosses(coil: Pick<CoilRecord, "topology">, session: SessionRecord, analysis: Pick<SessionAnalysis, "parts" | "warmUp">): SwitchLossCheck {
  const sw = analysis.parts.switches[0];
  if (!sw) return { ok: false, reason: "No switching transistor is recorded as fitted that day." };
  if (!sw.switchType) return { ok: false, reason: "The switch's type (MOSFET, BJT or IGBT) is not recorded, so its losses cannot be estimated." };
  if (session.runningFrequencyHz === null) return { ok: false, reason: "The running frequency was not recorded, so the switching loss cannot be estimated." };
  const sinkR = analysis.parts.sink?.sinkThermalResistanceKPerW ?? null;
  const warmUp = analysis.warmUp;
  const fitted = warmUp !== null && warmUp.fit.extrapolation !== "too-short";
  const sinkTemp = fitted ? warmUp.fit.steadyState : session.heatSinkEndC;
  if (sinkR === null || sinkTemp === null) {
    return { ok: false, reason: "The sink's temperature or its thermal resistance is not recorded, so there is no sink-inferred power to check against." };
  }
  try {
    const currents = estimateSwitchCurrents({ supplyCurrentA: session.supplyCurrentA, topology: coil.topology, dutyCycle: session.dutyCycle });
    const estimate = estimateSwitchLosses({
      switchType: sw.switchType,
      frequencyHz: session.runningFrequencyHz,
      // The off switch of a centre-tapped push-pull blocks twice the supply; a single switch or a bridge leg the supply.
      switchingVoltageV: coil.topology === "push_pull" ? 2 * session.supplyVoltageV : session.supplyVoltageV,
      rmsCurrentA: currents.rmsA,
      averageCurrentA: currents.averageA,
      // A single switch's ramp starts near zero current; rectangular pulses switch on at their full height.
      turnOnCurrentA: currents.waveform === "ramp" ? 0 : currents.peakA,
      turnOffCurrentA: currents.peakA,
    });
    const switches = Math.max(1, analysis.parts.switches.length);
    const sinkInferredW = inferSinkDissipation({ sinkTempC: sinkTemp, ambientTempC: session.ambientTempC, sinkToAmbientKPerW: sinkR }) / switches;
    const sinkBasis = `${fitted ? "fitted steady-state" : "end-of-run"} sink temperature over its Rθsa${switches > 1 ? `, shared by ${switches} switches` : ""}`;
    return { ok: true, estimate, sinkInferredW, sinkBasis, crossCheck: crossCheckSinkPower({ estimatedW: estimate.totalW, sinkInferredW }) };
  } catch (error) {
    if (error instanceof CalcInputError) return { ok: false, reason: `The losses could not be estimated: ${error.message}.` };
    throw error;
  }
}
