/**
 * What the sweep page shows, computed from the stored sweep: the |Z| curve (thinned for display),
 * the first series resonance against predictions made without it (geometry only; calibrated on earlier sweeps), the coil's calibration, and the
 * "what would this top load do?" prediction.
 */
import { predictBuild, predictTopLoadChange, type TopLoadChangePrediction, type TopLoadSpec } from "../calc/build-prediction";
import { broadcastBandAt, broadcastBands, type ItuRegion, type NamedBroadcastBand } from "../calc/broadcast-band";
import { DEFAULT_CLEARANCE_POLICY } from "../calc/clearance-policy";
import { compareMeasured, type Comparison } from "../calc/comparison";
import { dividerImpedance } from "../calc/divider";
import { CalcInputError } from "../calc/errors";
import { decimateMinMax, type XY } from "./decimate-min-max";
import { predictFromGeometry } from "../calc/prediction-band";
import { calibrateCoilFromSweeps, calibrateOnEarlierSweeps, secondaryBuildOf, type CalibrationSweep, type CoilCalibration, type SecondaryRecord } from "./sweep-calibration";
import { topLoadSpecOf } from "./top-load-spec";
import type { TopLoadRecord } from "./records";
import type { WhatIfTopLoad } from "../validation/sweep";

/** Pixel columns the chart is thinned to: about a wide screen's plot width. */
export const CHART_BUCKETS = 600;

export interface ImpedanceCurve {
  points: XY[];
  /** Points in the stored sweep. */
  total: number;
  decimated: boolean;
}

/** |Z| = R·m/(1 − m) for each reading (dividerImpedance without phase: Z taken as in phase). */
export function impedanceCurve(
  sweep: { seriesResistanceOhm: number; sourceAmplitudeV: number; points: readonly { frequencyHz: number; amplitudeV: number }[] },
  buckets = CHART_BUCKETS,
): ImpedanceCurve {
  const points = sweep.points.map((p) => ({
    x: p.frequencyHz,
    y: dividerImpedance({ seriesResistance: sweep.seriesResistanceOhm, sourceAmplitude: sweep.sourceAmplitudeV, measuredAmplitude: p.amplitudeV }),
  }));
  const thinned = decimateMinMax(points, buckets, true);
  return { points: thinned, total: points.length, decimated: thinned.length < points.length };
}

export interface OutOfSampleCalibrated {
  predictedHz: number;
  comparison: Comparison;
  /** The earlier sweeps the environment capacitance was fitted on. */
  fittedOn: { id: string; takenAt: Date }[];
}

export type PredictionComparison =
  | {
      ok: true;
      measuredHz: number;
      /** From geometry and parts alone, with its GUM band. */
      geometryOnly: { predictedHz: number; lowHz: number; highHz: number; comparison: Comparison };
      /** Calibrated on the coil's sweeps strictly before this one; a reason when there were none. */
      calibrated: ({ ok: true } & OutOfSampleCalibrated) | { ok: false; reason: string };
    }
  | { ok: false; reason: string };

type CoilForPrediction = SecondaryRecord & { environmentCapacitanceF: number | null };

/**
 * This sweep's first series resonance against two predictions made without it: from geometry and parts alone
 * (predictFromGeometry), and with the environment capacitance calibrated on the coil's sweeps taken strictly
 * before this one (cross-validation, Stone 1974, docs/references.md) — never the coil's stored value, which
 * this sweep helped calibrate.
 */
export function compareWithPrediction(
  coil: SecondaryRecord,
  topLoad: Omit<TopLoadRecord, "id"> | null,
  sweep: { takenAt: Date; firstSeriesResonanceHz: number | null },
  calibrationSweeps: readonly CalibrationSweep[],
): PredictionComparison {
  const measuredHz = sweep.firstSeriesResonanceHz;
  if (measuredHz === null) return { ok: false, reason: "This sweep shows no series resonance, so there is nothing to compare." };
  try {
    const spec = topLoadSpecOf(topLoad);
    const geometry = predictFromGeometry({ formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: coil.wireDiameterM, topLoad: spec });
    const geometryOnly = {
      predictedHz: geometry.firstResonance,
      lowHz: geometry.low,
      highHz: geometry.high,
      comparison: compareMeasured({ quantity: "firstResonance", predicted: geometry.firstResonance, measured: measuredHz }),
    };
    const fit = calibrateOnEarlierSweeps(coil, calibrationSweeps, sweep.takenAt);
    if (!fit) return { ok: true, measuredHz, geometryOnly, calibrated: { ok: false, reason: "Nothing to calibrate on yet: no earlier sweep of this coil shows a series resonance." } };
    const predictedHz = predictBuild(secondaryBuildOf(coil, spec, fit.calibration.environmentCapacitance)).firstResonance;
    return {
      ok: true,
      measuredHz,
      geometryOnly,
      calibrated: {
        ok: true,
        predictedHz,
        comparison: compareMeasured({ quantity: "firstResonance", predicted: predictedHz, measured: measuredHz }),
        fittedOn: fit.sweeps.map((s) => ({ id: s.id, takenAt: s.takenAt })),
      },
    };
  } catch (error) {
    if (error instanceof CalcInputError) return { ok: false, reason: `No prediction: ${error.message}.` };
    throw error;
  }
}

export type CalibrationSummary = ({ ok: true } & CoilCalibration) | { ok: false; reason: string };

export function summarizeCalibration(coil: SecondaryRecord, sweeps: readonly CalibrationSweep[]): CalibrationSummary {
  try {
    const result = calibrateCoilFromSweeps(coil, sweeps);
    return result ? { ok: true, ...result } : { ok: false, reason: "No sweep of this coil shows a series resonance yet." };
  } catch (error) {
    if (error instanceof CalcInputError) return { ok: false, reason: `Cannot calibrate: ${error.message}.` };
    throw error;
  }
}

export function whatIfSpec(input: WhatIfTopLoad): TopLoadSpec {
  switch (input.shape) {
    case "sphere":
    case "disc":
      return { kind: input.shape, diameter: input.diameter };
    case "toroid":
      return { kind: "toroid", outerDiameter: input.diameter, tubeDiameter: input.tubeDiameter };
    case "cylinder":
      return { kind: "cylinder", diameter: input.diameter, height: input.height };
    case "measured":
      return { capacitance: input.capacitance };
  }
}

export type WhatIfResult =
  | { ok: true; prediction: TopLoadChangePrediction; inBand: boolean; band: NamedBroadcastBand; region: number }
  | { ok: false; field: string; reason: string };

/**
 * The first resonance with a different top load, holding the coil's calibrated environment (0 F when not calibrated),
 * checked against the broadcast band of the club's ITU region (the lending policy's; the default policy's when none
 * is given).
 */
export function predictWhatIf(
  coil: CoilForPrediction,
  currentTopLoad: Omit<TopLoadRecord, "id"> | null,
  input: WhatIfTopLoad,
  region: ItuRegion = DEFAULT_CLEARANCE_POLICY.ituRegion,
): WhatIfResult {
  try {
    const prediction = predictTopLoadChange(secondaryBuildOf(coil, topLoadSpecOf(currentTopLoad)), coil.environmentCapacitanceF ?? 0, whatIfSpec(input));
    // The band the prediction lands in (long wave in Region 1, medium wave), else the region's medium-wave band for reference.
    const band = broadcastBandAt(prediction.predictedFirstResonance, region);
    return { ok: true, prediction, inBand: band !== null, band: band ?? (broadcastBands(region).at(-1) as NamedBroadcastBand), region };
  } catch (error) {
    if (error instanceof CalcInputError) {
      const field = error.field.replace(/^newTopLoad\./, "").replace(/^outerDiameter$/, "diameter");
      return { ok: false, field, reason: `That top load cannot be modelled: expected ${error.expected}.` };
    }
    throw error;
  }
}
