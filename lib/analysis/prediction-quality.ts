/**
 * How well each prediction model has done across the fleet, every deviation out of sample: the geometry-only
 * first resonance against every sweep, the calibrated first resonance against every sweep that has an earlier
 * one to calibrate on (fitted on the earlier ones only, Stone 1974, docs/references.md), and the running
 * frequency of every session against its prediction from the data before it.
 */
import { predictBuild } from "../calc/build-prediction";
import { summarizeDeviations, type DeviationSummary, type LabelledDeviation } from "../calc/deviation-summary";
import { CalcInputError } from "../calc/errors";
import { predictFromGeometry } from "../calc/prediction-band";
import { toCalibrationSweeps } from "./coil-comparison";
import type { CoilRecord, SweepRecord, TopLoadRecord } from "./records";
import { checkRunningFrequency, pairRunningWithSweeps, type RunningOffsetObservation, type RunningSessionRow } from "./running-offset";
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

/** Out-of-sample deviations of every model across the fleet, and their summaries. */
export function assessPredictionQuality(inputs: PredictionQualityInputs): { summaries: PredictionQuality; deviations: Record<PredictionModel, LabelledDeviation<DeviationLabel>[]> } {
  const topLoadsByCoil = groupByCoil(inputs.topLoads);
  const sweepsByCoil = groupByCoil(inputs.sweeps);
  const sessionsByCoil = groupByCoil(inputs.sessions);
  const deviations: Record<PredictionModel, LabelledDeviation<DeviationLabel>[]> = { geometryOnly: [], calibrated: [], runningFrequency: [] };
  const observationsByCoil = new Map<string, RunningOffsetObservation[]>();

  for (const coil of inputs.coils) {
    const sweeps = (sweepsByCoil.get(coil.id) ?? []).filter((s) => s.firstSeriesResonanceHz !== null);
    const calibrationSweeps = toCalibrationSweeps(sweeps, topLoadsByCoil.get(coil.id) ?? []);
    const secondary = { formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: coil.wireDiameterM };
    calibrationSweeps.forEach((sweep) => {
      const measured = sweep.firstSeriesResonanceHz!;
      const label: DeviationLabel = { coilTag: coil.tag, recordId: sweep.id, recordKind: "sweep", at: sweep.takenAt };
      const topLoad = topLoadSpecOf(sweep.topLoad);
      const geometry = orSkip(() => predictFromGeometry({ ...secondary, topLoad }).firstResonance);
      if (geometry !== null) deviations.geometryOnly.push({ deviation: (measured - geometry) / geometry, label });
      const fit = orSkip(() => calibrateOnEarlierSweeps(coil, calibrationSweeps, sweep.takenAt));
      const calibrated = fit ? orSkip(() => predictBuild({ ...secondary, topLoad, environmentCapacitance: fit.calibration.environmentCapacitance }).firstResonance) : null;
      if (calibrated !== null) deviations.calibrated.push({ deviation: (measured - calibrated) / calibrated, label });
    });
    observationsByCoil.set(coil.id, pairRunningWithSweeps(sessionsByCoil.get(coil.id) ?? [], sweeps));
  }

  const fleet = [...observationsByCoil.values()].flat().sort((a, b) => a.at.getTime() - b.at.getTime());
  for (const coil of inputs.coils) {
    const own = observationsByCoil.get(coil.id) ?? [];
    for (const observation of own) {
      const check = checkRunningFrequency(observation, own, fleet);
      deviations.runningFrequency.push({ deviation: check.deviation, label: { coilTag: coil.tag, recordId: observation.sessionId, recordKind: "session", at: observation.at } });
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
