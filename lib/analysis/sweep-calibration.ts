/**
 * From stored rows to lib/calc's build model: a coil's secondary, a top load's shape, and the coil's
 * environment capacitance calibrated over all its sweeps with the top load each was taken with.
 */
import { calibrateEnvironmentCapacitance, type EnvironmentCalibration, type SecondaryBuild, type TopLoadSpec } from "../calc/build-prediction";
import type { TopLoadRecord } from "./records";

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

/** A stored top load as lib/calc's spec; null for a bare coil or a row missing the dimensions its shape needs. */
export function topLoadSpecOf(topLoad: Omit<TopLoadRecord, "id"> | null | undefined): TopLoadSpec | null {
  if (!topLoad) return null;
  const { shape, diameterM, tubeDiameterM, heightM, measuredCapacitanceF } = topLoad;
  switch (shape) {
    case "sphere":
    case "disc":
      return diameterM === null ? null : { kind: shape, diameter: diameterM };
    case "toroid":
      return diameterM === null || tubeDiameterM === null ? null : { kind: "toroid", outerDiameter: diameterM, tubeDiameter: tubeDiameterM };
    case "cylinder":
      return diameterM === null || heightM === null ? null : { kind: "cylinder", diameter: diameterM, height: heightM };
    case "measured":
      return measuredCapacitanceF === null ? null : { capacitance: measuredCapacitanceF };
    default:
      return null;
  }
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

/** Calibrate over every sweep that found a first series resonance; null when none did. Throws CalcInputError for a build lib/calc refuses. */
export function calibrateCoilFromSweeps(coil: SecondaryRecord, sweeps: readonly CalibrationSweep[]): CoilCalibration | null {
  const used = sweeps.filter((s) => s.firstSeriesResonanceHz !== null);
  if (used.length === 0) return null;
  const calibration = calibrateEnvironmentCapacitance(
    secondaryBuildOf(coil),
    used.map((s) => ({ firstSeriesResonance: s.firstSeriesResonanceHz!, topLoad: topLoadSpecOf(s.topLoad) })),
  );
  return { calibration, sweeps: used };
}
