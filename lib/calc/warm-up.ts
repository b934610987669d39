/**
 * From a logged heat-sink warm-up to the question a steward actually asks: how long can this coil
 * run at this supply before the switching transistor's junction reaches its limit?
 */
import { CalcInputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import {
  fitHeatingCurve,
  isUsableFit,
  pessimisticCurve,
  steadyStateUpperBound,
  timeToReachTemperature,
  type HeatingCurve,
  type HeatingSample,
} from "./heating";

/** One-sided confidence of the bounds a verdict rests on: a 1-in-20 chance the truth is worse (common practice). */
export const DEFAULT_WARM_UP_CONFIDENCE = 0.95;

export interface WarmUpInput {
  /** Sink temperatures logged during one run at constant supply (time in s since switch-on, °C). */
  samples?: readonly HeatingSample[];
  /** A fit already made of those samples (e.g. stored with the session); used instead of fitting `samples`. */
  fit?: HeatingCurve;
  /** P, W dissipated in the transistor during that run. */
  dissipation?: number;
  /**
   * Rθsa, K/W: when given without `dissipation`, P per switch is taken from the fit as ΔT∞/Rθsa (the power the sink is
   * heading for, so a run cut short of steady state does not under-read it), with ΔT∞ over `ambientC`.
   */
  sinkToAmbientKPerW?: number;
  /** Room temperature, °C, for that rise (default: the fit's start). */
  ambientC?: number;
  /** Switches sharing the sink (default 1). */
  switchesOnSink?: number;
  /** One-sided confidence of the bounds (default DEFAULT_WARM_UP_CONFIDENCE). */
  confidence?: number;
  /** Rθjc + Rθcs, K/W: junction to case plus case to sink. */
  junctionToSink?: number;
  /** Tj,max the steward wants to stay below, °C. */
  junctionLimitC: number;
}

export interface WarmUpAnalysis {
  fit: HeatingCurve;
  /** °C */
  predictedSteadySinkC: number;
  /** °C; null unless both dissipation and junctionToSink are given. */
  predictedSteadyJunctionC: number | null;
  /** The sink temperature at which the junction reaches its limit, °C. */
  sinkLimitC: number;
  /** Seconds after switch-on at which the junction estimate reaches junctionLimitC; Infinity when never. */
  longestRunBelowLimitS: number;
  /** Whether the fit can be carried beyond its run (heating.ts isUsableFit). */
  usable: boolean;
  confidence: number;
  /** Upper confidence bound of the steady sink temperature, °C; Infinity when the fit cannot bound it. */
  steadySinkUpperC: number;
  /** P per switch, W, used for the junction (given, or ΔT∞/Rθsa from the fit); null when unknown. */
  dissipationW: number | null;
  /**
   * Lower confidence bound of the longest run keeping the junction under junctionLimitC, s (the pessimistic curve of
   * heating.ts with the power it implies); null when the fit is not usable, so no bound can be defended.
   */
  longestRunLowerBoundS: number | null;
  /** Plain sentences for the steward, most important first. */
  explanations: string[];
}

/**
 * Fits the warm-up and carries it to the junction: Tj = Tsink + P·(Rθjc + Rθcs) (thermal chain;
 * docs/references.md, "The switching transistor"), so the sink may reach junctionLimitC − P·(Rθjc + Rθcs).
 * Without P and Rθ the junction is taken at sink temperature, which is optimistic; the explanation says so.
 */
export function analyzeWarmUp(input: WarmUpInput): WarmUpAnalysis {
  const junctionLimitC = requireFinite("junctionLimitC", input.junctionLimitC);
  const dissipation = input.dissipation === undefined ? undefined : requireNonNegative("dissipation", input.dissipation);
  const junctionToSink = input.junctionToSink === undefined ? undefined : requireNonNegative("junctionToSink", input.junctionToSink);
  const sinkToAmbient = input.sinkToAmbientKPerW === undefined ? undefined : requirePositive("sinkToAmbientKPerW", input.sinkToAmbientKPerW);
  const switches = input.switchesOnSink ?? 1;
  if (!Number.isInteger(switches) || switches < 1) throw new CalcInputError("switchesOnSink", "a whole number of switches, at least 1", switches);
  const confidence = input.confidence ?? DEFAULT_WARM_UP_CONFIDENCE;
  if (input.fit === undefined && input.samples === undefined) throw new CalcInputError("samples", "samples or a fit", "neither");
  const fit = input.fit ?? fitHeatingCurve(input.samples ?? []);
  const ambient = input.ambientC === undefined ? fit.ambient : requireFinite("ambientC", input.ambientC);
  const explanations = [fit.explanation];

  // P = ΔT∞/Rθsa: the power the fitted rise implies, not the under-read (T_end − Ta)/Rθsa of a short run.
  const powerAt = (sinkC: number) => (sinkToAmbient === undefined ? undefined : Math.max(0, sinkC - ambient) / sinkToAmbient / switches);
  const power = dissipation ?? powerAt(fit.steadyState);
  const offset = power !== undefined && junctionToSink !== undefined ? power * junctionToSink : null;
  if (offset === null) {
    explanations.push(
      "Without the transistor's dissipation and Rθjc + Rθcs the junction is taken at sink temperature; it is hotter, so the run time is an upper bound.",
    );
  }
  const sinkLimitC = junctionLimitC - (offset ?? 0);
  const predictedSteadyJunctionC = offset === null ? null : fit.steadyState + offset;
  const longestRunBelowLimitS = timeToReachTemperature(fit, sinkLimitC);

  if (longestRunBelowLimitS === 0) {
    explanations.push(`The sink is already at or above ${sinkLimitC.toFixed(1)} °C, the most it may reach at this supply.`);
  } else if (longestRunBelowLimitS === Number.POSITIVE_INFINITY) {
    explanations.push(`At this supply the sink levels off below ${sinkLimitC.toFixed(1)} °C: the junction limit is not reached.`);
  } else {
    const minutes = longestRunBelowLimitS / 60;
    explanations.push(`The junction reaches ${junctionLimitC.toFixed(0)} °C after about ${minutes.toFixed(1)} min at this supply.`);
  }
  if (longestRunBelowLimitS > fit.duration && fit.extrapolation !== "reliable") {
    explanations.push("That prediction lies beyond the logged run and rests on an extrapolation this run cannot pin down.");
  }

  const usable = isUsableFit(fit);
  const steadySinkUpperC = steadyStateUpperBound(fit, confidence);
  let longestRunLowerBoundS: number | null = null;
  if (usable) {
    const pessimistic = pessimisticCurve(fit, confidence);
    const powerHigh = dissipation ?? powerAt(pessimistic.steadyState);
    const sinkLimitLow = junctionLimitC - (powerHigh !== undefined && junctionToSink !== undefined ? powerHigh * junctionToSink : 0);
    longestRunLowerBoundS = Math.min(longestRunBelowLimitS, timeToReachTemperature(pessimistic, sinkLimitLow));
    const percent = Math.round(confidence * 100);
    explanations.push(
      Number.isFinite(longestRunLowerBoundS)
        ? `Longest run with ${percent} % confidence: ${(longestRunLowerBoundS / 60).toFixed(1)} min (the fit's lower bound).`
        : `With ${percent} % confidence the junction stays under ${junctionLimitC.toFixed(0)} °C however long the run.`,
    );
  } else {
    explanations.push("This warm-up fit cannot bound the longest run (too short or too uncertain to extrapolate): no run length is offered from it.");
  }
  return {
    fit,
    predictedSteadySinkC: fit.steadyState,
    predictedSteadyJunctionC,
    sinkLimitC,
    longestRunBelowLimitS,
    usable,
    confidence,
    steadySinkUpperC,
    dissipationW: power ?? null,
    longestRunLowerBoundS,
    explanations,
  };
}
