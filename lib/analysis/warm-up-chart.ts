/**
 * The series a warm-up chart draws: the logged samples, the fitted curve over the run and a little
 * beyond, the predicted steady temperature and the sink temperature at which the junction reaches its
 * limit. Plain points, so the page can hand them to the chart component.
 */
import { temperatureAt } from "../calc/heating";
import type { WarmUpAnalysis } from "../calc/warm-up";
import type { SampleRecord } from "./records";

export interface WarmUpSeries {
  samples: { x: number; y: number }[];
  fitted: { x: number; y: number }[];
  steady: { x: number; y: number }[];
  sinkLimit: { x: number; y: number }[];
  /** Last time drawn, s. */
  endS: number;
}

/** How far past the run the fitted curve is drawn: half the run again, or to the limit crossing if that comes soon after. */
const BEYOND_RUN = 1.5;
const CURVE_POINTS = 80;

export function buildWarmUpSeries(samples: readonly SampleRecord[], warmUp: WarmUpAnalysis): WarmUpSeries {
  const runEnd = samples.at(-1)?.elapsedS ?? warmUp.fit.duration;
  const crossing = warmUp.longestRunBelowLimitS;
  const endS = Number.isFinite(crossing) && crossing > runEnd && crossing < runEnd * 3 ? crossing * 1.1 : runEnd * BEYOND_RUN;
  const fitted = Array.from({ length: CURVE_POINTS + 1 }, (_, i) => {
    const x = (endS * i) / CURVE_POINTS;
    return { x, y: temperatureAt(warmUp.fit, x) };
  });
  return {
    samples: samples.map((s) => ({ x: s.elapsedS, y: s.temperatureC })),
    fitted,
    steady: [
      { x: 0, y: warmUp.predictedSteadySinkC },
      { x: endS, y: warmUp.predictedSteadySinkC },
    ],
    sinkLimit: [
      { x: 0, y: warmUp.sinkLimitC },
      { x: endS, y: warmUp.sinkLimitC },
    ],
    endS,
  };
}
