/**
 * From a logged heat-sink warm-up to the question a steward actually asks: how long can this coil
 * run at this supply before the switching transistor's junction reaches its limit?
 */
import { requireFinite, requireNonNegative } from "./errors";
import { fitHeatingCurve, timeToReachTemperature, type HeatingCurve, type HeatingSample } from "./heating";

export interface WarmUpInput {
  /** Sink temperatures logged during one run at constant supply (time in s since switch-on, °C). */
  samples: readonly HeatingSample[];
  /** P, W dissipated in the transistor during that run. */
  dissipation?: number;
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
  const fit = fitHeatingCurve(input.samples);
  const explanations = [fit.explanation];

  const offset = dissipation !== undefined && junctionToSink !== undefined ? dissipation * junctionToSink : null;
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
  return { fit, predictedSteadySinkC: fit.steadyState, predictedSteadyJunctionC, sinkLimitC, longestRunBelowLimitS, explanations };
}
