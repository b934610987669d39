/**
 * The coil page's small |Z| picture of a stored sweep: |Z| per reading as the sweep page works it out
 * (sweep-report.ts impedanceCurve), thinned min/max to about one point per pixel column so its peaks survive, as
 * log–log path data for a 180 × 72 box.
 */
import { CalcInputError } from "../calc/errors";
import { impedanceCurve } from "./sweep-report";
import { buildLogLogPath, type LogPlot } from "./log-plot-path";

export const SWEEP_THUMBNAIL_BOX = { width: 180, height: 72, pad: 3 } as const;

export function plotSweepThumbnail(sweep: Parameters<typeof impedanceCurve>[0]): LogPlot {
  try {
    // Two points (min and max) per bucket: ~one per pixel column of the box.
    const curve = impedanceCurve(sweep, Math.ceil(SWEEP_THUMBNAIL_BOX.width / 2));
    return buildLogLogPath(curve.points, SWEEP_THUMBNAIL_BOX);
  } catch (error) {
    // A reading at or above the source amplitude has no |Z|; the sweep page explains it, the thumbnail stays empty.
    if (error instanceof CalcInputError) return { path: "", xRange: null, yRange: null };
    throw error;
  }
}
