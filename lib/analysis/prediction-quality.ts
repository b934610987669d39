/**
 * How well each prediction model has done across the fleet, every deviation out of sample: the geometry-only
 * first resonance against every sweep, the calibrated first resonance against every sweep that has an earlier
 * one to calibrate on (fitted on the earlier ones only, Stone 1974, docs/references.md), and the running
 * frequency of every session against its prediction from the data before it.
 */
import { predictFirstResonance } from "../calc/build-prediction";
import { summarizeDeviations, type DeviationSummary, type LabelledDeviation } from "../calc/deviation-summary";
import { CalcInputError } from "../calc/errors";
import { predictFromGeometry } from "../calc/prediction-band";
import { topLoadCapacitance } from "../calc/top-load";
import { toCalibrationSweeps } from "./coil-comparison";
import type { CoilRecord, SweepRecord, TopLoadRecord } from "./records";
import { checkAllRunningFrequencies, pairRunningWithSweeps, type RunningOffsetObservation, type RunningSessionRow } from "./running-offset";
import { calibrateOnEarlierSweeps } from "./sweep-calibration";
import { topLoadSpecOf } from "./top-load-spec";

export type PredictionModel = "geometryOnly" | "calibrated" | "runningFrequency";

export interface DeviationLabel {
  coilTag: string;
  /** The sweep (first-resonance models) or session (running frequency) compared. */
  recordId: string;
  recordKind: "sweep" | "session";
  at: Date;
}

export interface PredictionQualityInputs {
  coils: readonly (CoilRecord & { id: string; tag: string })[];
  topLoads: readonly (TopLoadRecord & { coilId: string })[];
  /** Chronological. */
  sweeps: readonly (SweepRecord & { coilId: string })[];
  /** Sessions that logged a running frequency, chronological. */
  sessions: readonly (RunningSessionRow & { coilId: string })[];
}

export type PredictionQuality = Record<PredictionModel, DeviationSummary<DeviationLabel> | null>;

function groupByCoil<T extends { coilId: string }>(rows: readonly T[]): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const row of rows) (map.get(row.coilId) ?? map.set(row.coilId, []).get(row.coilId)!).push(row);
  return map;
}

/** A build the models refuse contributes nothing rather than stopping the fleet's figures. */
function orSkip<T>(compute: () => T): T | null {
  try {
    return compute();
  } catch (error) {
    if (error instanceof CalcInputError) return null;
    throw error;
  }
}

/**
 * A top load with its free-space capacitance worked out once: every sweep's calibration would otherwise sum the
 * toroid series again for the same part (tens of seconds over a 500-coil fleet). topLoadSpecOf reads a recorded
 * capacitance first, so the result is the same figure.
 */
function withCapacitanceWorkedOut<T extends TopLoadRecord>(topLoad: T): T {
  if (topLoad.measuredCapacitanceF !== null) return topLoad;
  const spec = topLoadSpecOf(topLoad);
  const capacitance = spec && "kind" in spec ? orSkip(() => topLoadCapacitance(spec)) : null;
  return capacitance === null ? topLoad : { ...topLoad, measuredCapacitanceF: capacitance };
}

/** Out-of-sample deviations of every model across the fleet, and their summaries. */
export function assessPredictionQuality(inputs: PredictionQualityInputs): { summaries: PredictionQuality; deviations: Record<PredictionModel, LabelledDeviation<DeviationLabel>[]> } {
  const topLoadsByCoil = groupByCoil(inputs.topLoads.map(withCapacitanceWorkedOut));
  const sweepsByCoil = groupByCoil(inputs.sweeps);
  const sessionsByCoil = groupByCoil(inputs.sessions);
  const deviations: Record<PredictionModel, LabelledDeviation<DeviationLabel>[]> = { geometryOnly: [], calibrated: [], runningFrequency: [] };
  const observationsByCoil = new Map<string, RunningOffsetObservation[]>();

  for (const coil of inputs.coils) {
    const sweeps = (sweepsByCoil.get(coil.id) ?? []).filter((s) => s.firstSeriesResonanceHz !== null);
    const calibrationSweeps = toCalibrationSweeps(sweeps, topLoadsByCoil.get(coil.id) ?? []);
    const geometryByTopLoad = new Map<object | null, number | null>();
    const secondary = { formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: coil.wireDiameterM };
    calibrationSweeps.forEach((sweep) => {
      const measured = sweep.firstSeriesResonanceHz!;
      const label: DeviationLabel = { coilTag: coil.tag, recordId: sweep.id, recordKind: "sweep", at: sweep.takenAt };
      const topLoad = topLoadSpecOf(sweep.topLoad);
      // The geometry-only prediction depends on the build and the top load only, not on the sweep.
      if (!geometryByTopLoad.has(sweep.topLoad)) geometryByTopLoad.set(sweep.topLoad, orSkip(() => predictFromGeometry({ ...secondary, topLoad }).firstResonance));
      const geometry = geometryByTopLoad.get(sweep.topLoad)!;
      if (geometry !== null) deviations.geometryOnly.push({ deviation: (measured - geometry) / geometry, label });
      const fit = orSkip(() => calibrateOnEarlierSweeps(coil, calibrationSweeps, sweep.takenAt));
      const calibrated = fit ? orSkip(() => predictFirstResonance({ ...secondary, topLoad, environmentCapacitance: fit.calibration.environmentCapacitance })) : null;
      if (calibrated !== null) deviations.calibrated.push({ deviation: (measured - calibrated) / calibrated, label });
    });
    observationsByCoil.set(coil.id, pairRunningWithSweeps(sessionsByCoil.get(coil.id) ?? [], sweeps));
  }

  const checks = checkAllRunningFrequencies(observationsByCoil);
  for (const coil of inputs.coils) {
    for (const check of checks.get(coil.id) ?? []) {
      deviations.runningFrequency.push({ deviation: check.deviation, label: { coilTag: coil.tag, recordId: check.observation.sessionId, recordKind: "session", at: check.observation.at } });
    }
  }

  return {
    summaries: {
      geometryOnly: summarizeDeviations(deviations.geometryOnly),
      calibrated: summarizeDeviations(deviations.calibrated),
      runningFrequency: summarizeDeviations(deviations.runningFrequency),
    },
    deviations,
  };
}
