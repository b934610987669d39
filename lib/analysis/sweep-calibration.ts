/**
 * From stored rows to lib/calc's build model: a coil's secondary, a top load's shape, and the coil's
 * environment capacitance calibrated over all its sweeps with the top load each was taken with.
 */
import { calibrateEnvironmentCapacitance, type EnvironmentCalibration, type SecondaryBuild, type TopLoadSpec } from "../calc/build-prediction";
import type { TopLoadRecord } from "./records";
import { topLoadSpecOf } from "./top-load-spec";

export interface SecondaryRecord {
  formDiameterM: number;
  windingLengthM: number;
  turns: number;
  wireDiameterM: number;
}

/**
 * The secondary as lib/calc models it. The wire's material is left at copper: it changes only the
 * predicted resistance and Q, never the resonance, which is all the sweep pages use.
 */
export function secondaryBuildOf(coil: SecondaryRecord, topLoad: TopLoadSpec | null = null, environmentCapacitanceF?: number | null): SecondaryBuild {
  return {
    formDiameter: coil.formDiameterM,
    windingLength: coil.windingLengthM,
    turns: coil.turns,
    wireDiameter: coil.wireDiameterM,
    topLoad,
    ...(environmentCapacitanceF === null || environmentCapacitanceF === undefined ? {} : { environmentCapacitance: environmentCapacitanceF }),
  };
}

export interface CalibrationSweep {
  id: string;
  takenAt: Date;
  firstSeriesResonanceHz: number | null;
  topLoad: Omit<TopLoadRecord, "id"> | null;
}

export interface CoilCalibration {
  calibration: EnvironmentCalibration;
  /** The sweeps used, in the order of calibration.perMeasurement. */
  sweeps: CalibrationSweep[];
}

/**
 * Calibrate over every sweep that found a first series resonance; null when none did. Throws CalcInputError for
 * a build lib/calc refuses. This is the value for predicting the NEXT sweep; to compare with a measured sweep use
 * calibrateOnEarlierSweeps, so the comparison is out of sample.
 */
export function calibrateCoilFromSweeps(coil: SecondaryRecord, sweeps: readonly CalibrationSweep[]): CoilCalibration | null {
  const used = sweeps.filter((s) => s.firstSeriesResonanceHz !== null);
  if (used.length === 0) return null;
  const calibration = calibrateEnvironmentCapacitance(
    secondaryBuildOf(coil),
    used.map((s) => ({ firstSeriesResonance: s.firstSeriesResonanceHz!, topLoad: topLoadSpecOf(s.topLoad) })),
  );
  return { calibration, sweeps: used };
}

/**
 * Calibrate only on sweeps taken strictly before `before`, so a prediction compared with the sweep taken then was
 * never fitted on it (cross-validation, Stone 1974, docs/references.md). Null when no earlier sweep found a
 * resonance: there is nothing to calibrate on yet.
 */
export function calibrateOnEarlierSweeps(coil: SecondaryRecord, sweeps: readonly CalibrationSweep[], before: Date): CoilCalibration | null {
  return calibrateCoilFromSweeps(
    coil,
    sweeps.filter((s) => s.takenAt.getTime() < before.getTime()),
  );
}
