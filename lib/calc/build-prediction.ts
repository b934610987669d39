/**
 * Lumped prediction of a secondary's first series resonance and losses from its build, and the
 * per-coil "environment capacitance" calibration that makes the prediction honest.
 *
 * Model: the secondary's inductance (Nagaoka current sheet) resonates with the sum of its Medhurst
 * self-capacitance, the top load's capacitance and an environment term (the mounting, ground plane, leads,
 * and everything the free-space formulas miss). The sum is an estimate — Medhurst's capacitance belongs to
 * a differently terminated resonance (Knight 2016) and a mounted top load differs from its free-space value
 * by tens of percent — so the environment term is calibrated per coil from measured sweeps and may come out
 * negative when the models overstate the capacitance.
 */
import { WIRE_RESISTIVITY_20C_OHM_M, type WireMaterial } from "./constants";
import { CalcInputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import { solenoidInductance, wheelerInductance } from "./inductance";
import { capacitanceForResonance, resonantFrequency } from "./resonance";
import { helixWireLength, windingCentreDiameter } from "./secondary-geometry";
import { medhurstSelfCapacitance } from "./self-capacitance";
import { topLoadCapacitance, type TopLoadShape } from "./top-load";
import { wireAcResistance, wireDcResistance } from "./wire";

/** A top load given by its shape (free-space capacitance computed) or by a measured capacitance, F. */
export type TopLoadSpec = TopLoadShape | { readonly capacitance: number };

/** A secondary as built. Lengths in m, resistivity in Ω·m, capacitance in F. */
export interface SecondaryBuild {
  /** Outside diameter of the coil form, m. */
  readonly formDiameter: number;
  /** Axial length of the winding, m. */
  readonly windingLength: number;
  readonly turns: number;
  /** Bare copper diameter of the wire, m. */
  readonly wireDiameter: number;
  /** Wire material; sets the resistivity at 20 °C (copper IEC 60028, aluminium IEC 60889). Default copper. */
  readonly wireMaterial?: WireMaterial;
  /** Wire resistivity, Ω·m; overrides wireMaterial when given. */
  readonly resistivity?: number;
  /** Top load on the coil; null or absent for a bare coil. */
  readonly topLoad?: TopLoadSpec | null;
  /** Calibrated environment capacitance, F (may be negative); absent means 0. */
  readonly environmentCapacitance?: number;
}

/** What the lumped model predicts for a build. SI units throughout. */
export interface BuildPrediction {
  /** Diameter through the wire centres used by the models, m. */
  readonly windingDiameter: number;
  /** Length of wire in the winding, m. */
  readonly wireLength: number;
  /** Current-sheet inductance (Nagaoka), H. */
  readonly inductance: number;
  /** Wheeler's 1928 value as a familiar cross-check, H. */
  readonly wheelerInductance: number;
  /** Medhurst self-capacitance, F. */
  readonly selfCapacitance: number;
  /** Top-load capacitance (free-space or measured), F; 0 for a bare coil. */
  readonly topLoadCapacitance: number;
  /** Environment capacitance used, F. */
  readonly environmentCapacitance: number;
  /** Sum of the three capacitances, F. */
  readonly totalCapacitance: number;
  /** First series resonance of the lumped model, Hz. */
  readonly firstResonance: number;
  /** DC resistance of the winding, Ω. */
  readonly dcResistance: number;
  /** Skin-effect resistance at the first resonance, Ω (proximity effect neglected). */
  readonly acResistanceAtResonance: number;
  /** ωL/R_ac at the first resonance: an upper bound on the coil's Q. */
  readonly qEstimate: number;
  /** The model's assumptions and caveats, in plain words for the UI. */
  readonly assumptions: string[];
}

const PICO = 1e-12;

/** Re-raise a CalcInputError from a lower-level function under the caller's own field name. */
function withFieldPrefix<T>(prefix: string, compute: () => T, rename: Readonly<Record<string, string>> = {}): T {
  try {
    return compute();
  } catch (error) {
    if (error instanceof CalcInputError) {
      const field = rename[error.field] ?? `${prefix}${error.field}`;
      throw new CalcInputError(field, error.expected, error.received);
    }
    throw error;
  }
}

function computeTopLoadCapacitance(topLoad: TopLoadSpec | null | undefined, field: string): number {
  if (topLoad === null || topLoad === undefined) return 0;
  if ("kind" in topLoad) return withFieldPrefix(`${field}.`, () => topLoadCapacitance(topLoad));
  return requireNonNegative(`${field}.capacitance`, topLoad.capacitance);
}

interface CoilModel {
  readonly windingDiameter: number;
  readonly pitch: number;
  readonly inductance: number;
  readonly selfCapacitance: number;
}

/** Validates the winding and computes what every prediction shares: diameter, L and C_self. */
function modelCoil(build: SecondaryBuild): CoilModel {
  requirePositive("formDiameter", build.formDiameter);
  requirePositive("windingLength", build.windingLength);
  requirePositive("turns", build.turns);
  requirePositive("wireDiameter", build.wireDiameter);
  // Turns of round wire cannot overlap in a single layer: the pitch is at least the bare diameter.
  if (build.turns * build.wireDiameter > build.windingLength * (1 + 1e-9)) {
    throw new CalcInputError(
      "turns",
      `no more turns than fit side by side in a single layer (windingLength / wireDiameter = ${build.windingLength / build.wireDiameter})`,
      build.turns,
    );
  }
  const windingDiameter = windingCentreDiameter({ formDiameter: build.formDiameter, wireDiameter: build.wireDiameter });
  const geometry = { diameter: windingDiameter, length: build.windingLength, turns: build.turns };
  const rename = { diameter: "formDiameter", length: "windingLength" };
  return {
    windingDiameter,
    pitch: build.windingLength / build.turns,
    inductance: withFieldPrefix("", () => solenoidInductance(geometry), rename),
    selfCapacitance: withFieldPrefix("", () => medhurstSelfCapacitance(geometry), rename),
  };
}

function describeTopLoad(topLoad: TopLoadSpec | null | undefined): string {
  if (topLoad === null || topLoad === undefined) return "No top load: the coil is treated as bare.";
  if ("kind" in topLoad) {
    return `The top load's capacitance is the free-space value of an isolated ${topLoad.kind}; mounted on the coil it differs by tens of percent.`;
  }
  return "The top load's capacitance is the measured value given.";
}

/**
 * Predict a build's first series resonance, resistance and Q from its geometry (lumped model: Nagaoka L,
 * Medhurst C_self, free-space or measured top load, environment term; see the file comment for sources).
 */
export function predictBuild(build: SecondaryBuild): BuildPrediction {
  const coil = modelCoil(build);
  const material = build.wireMaterial ?? "copper";
  if (!Object.hasOwn(WIRE_RESISTIVITY_20C_OHM_M, material)) throw new CalcInputError("wireMaterial", "copper or aluminium", material);
  const resistivity = requirePositive("resistivity", build.resistivity ?? WIRE_RESISTIVITY_20C_OHM_M[material]);
  const topLoad = computeTopLoadCapacitance(build.topLoad, "topLoad");
  const environment = requireFinite("environmentCapacitance", build.environmentCapacitance ?? 0);
  const total = coil.selfCapacitance + topLoad + environment;
  if (total <= 0) {
    throw new CalcInputError(
      "environmentCapacitance",
      `a value that leaves a positive total capacitance (self + top load = ${(coil.selfCapacitance + topLoad) / PICO} pF)`,
      environment,
    );
  }
  const firstResonance = resonantFrequency(coil.inductance, total);
  const wireLength = helixWireLength({ diameter: coil.windingDiameter, turns: build.turns, pitch: coil.pitch });
  const dcResistance = wireDcResistance({ length: wireLength, diameter: build.wireDiameter, resistivity });
  const acResistance = wireAcResistance({ length: wireLength, diameter: build.wireDiameter, frequency: firstResonance, resistivity });

  const assumptions = [
    "Inductance is the current-sheet (Nagaoka) value at the wire-centre diameter, form diameter plus one bare wire diameter; round-wire corrections of a few tenths of a percent are ignored. Wheeler's formula is shown only as a cross-check.",
    "Self-capacitance is Medhurst's, which belongs to a coil resonating across both ends; for a coil grounded at its base it is an approximation, typically within 10–20 %.",
    "Adding self-capacitance, top-load and environment capacitance is an estimate; a mounted top load differs from its free-space value by tens of percent.",
    describeTopLoad(build.topLoad),
    build.environmentCapacitance === undefined
      ? "No environment capacitance was given, so it is taken as 0 F; calibrate it from a measured sweep of this coil for a better prediction."
      : environment < 0
        ? "The environment capacitance is negative: it corrects models that overstate this coil's capacitance and is not a physical capacitance."
        : "The environment capacitance is the value given (normally calibrated from this coil's sweeps).",
    build.resistivity === undefined
      ? `Resistance uses ${material === "aluminium" ? "hard-drawn aluminium (0.028264 Ω·mm²/m, IEC 60889)" : "annealed copper (1/58 Ω·mm²/m, IEC 60028)"} at 20 °C.`
      : "Resistance uses the resistivity given.",
    "AC resistance counts skin effect only; the proximity effect between neighbouring turns (Medhurst's factor, about 1.2–5) is neglected.",
    "Q = ωL/R_ac neglects radiation, dielectric and proximity losses, so it is an upper bound on the real Q.",
  ];

  return {
    windingDiameter: coil.windingDiameter,
    wireLength,
    inductance: coil.inductance,
    wheelerInductance: wheelerInductance({ diameter: coil.windingDiameter, length: build.windingLength, turns: build.turns }),
    selfCapacitance: coil.selfCapacitance,
    topLoadCapacitance: topLoad,
    environmentCapacitance: environment,
    totalCapacitance: total,
    firstResonance,
    dcResistance,
    acResistanceAtResonance: acResistance,
    qEstimate: (2 * Math.PI * firstResonance * coil.inductance) / acResistance,
    assumptions,
  };
}

/**
 * The lumped first series resonance alone, f = 1/(2π√(L·C)) (Thomson's formula with predictBuild's L and C), without
 * the wire's resistance and Q: for callers that predict many sweeps (the fleet's prediction quality).
 */
export function predictFirstResonance(build: SecondaryBuild): number {
  const coil = modelCoil(build);
  const total = coil.selfCapacitance + computeTopLoadCapacitance(build.topLoad, "topLoad") + requireFinite("environmentCapacitance", build.environmentCapacitance ?? 0);
  if (total <= 0) throw new CalcInputError("environmentCapacitance", "a value that leaves a positive total capacitance", build.environmentCapacitance);
  return resonantFrequency(coil.inductance, total);
}

/** One measured sweep used for calibration. */
export interface ResonanceMeasurement {
  /** Measured first series resonance, Hz. */
  readonly firstSeriesResonance: number;
  /** Top load fitted during the sweep; null for a bare coil. */
  readonly topLoad: TopLoadSpec | null;
}

/** Environment capacitance implied by one measurement. */
export interface EnvironmentCapacitanceEstimate {
  readonly firstSeriesResonance: number;
  /** Capacitance that resonates with the model inductance at the measured frequency, F. */
  readonly totalCapacitance: number;
  readonly selfCapacitance: number;
  readonly topLoadCapacitance: number;
  /** C_total − C_self − C_top, F (may be negative). */
  readonly environmentCapacitance: number;
}

/** Result of calibrating a coil's environment capacitance. */
export interface EnvironmentCalibration {
  /** Median of the per-measurement values, F (may be negative). */
  readonly environmentCapacitance: number;
  /** True when the calibrated value is below zero: the models overstate this coil's capacitance. */
  readonly isNegative: boolean;
  readonly perMeasurement: EnvironmentCapacitanceEstimate[];
  /** Largest minus smallest per-measurement value, F (0 for a single measurement). */
  readonly spread: number;
  /** Plain-words notes for the UI. */
  readonly notes: string[];
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/**
 * Calibrate a coil's environment capacitance from measured first series resonances:
 * per sweep C_env = 1/((2πf)² L) − C_self − C_top (Thomson's formula solved for C), combined by the median so
 * one bad sweep cannot drag the result. Throws CalcInputError when no measurement is given.
 */
export function calibrateEnvironmentCapacitance(build: SecondaryBuild, measurements: readonly ResonanceMeasurement[]): EnvironmentCalibration {
  if (measurements.length === 0) {
    throw new CalcInputError("measurements", "at least one measured first series resonance", "none");
  }
  const coil = modelCoil(build);
  const perMeasurement = measurements.map((measurement, i): EnvironmentCapacitanceEstimate => {
    const frequency = requirePositive(`measurements[${i}].firstSeriesResonance`, measurement.firstSeriesResonance);
    const topLoad = computeTopLoadCapacitance(measurement.topLoad, `measurements[${i}].topLoad`);
    const total = capacitanceForResonance(coil.inductance, frequency);
    return {
      firstSeriesResonance: frequency,
      totalCapacitance: total,
      selfCapacitance: coil.selfCapacitance,
      topLoadCapacitance: topLoad,
      environmentCapacitance: total - coil.selfCapacitance - topLoad,
    };
  });
  const values = perMeasurement.map((estimate) => estimate.environmentCapacitance);
  const environmentCapacitance = median(values);
  const spread = Math.max(...values) - Math.min(...values);
  const notes = [
    `Calibrated from ${measurements.length} sweep${measurements.length === 1 ? "" : "s"} (median of the per-sweep values).`,
  ];
  if (environmentCapacitance < 0) {
    notes.push(
      `The environment capacitance comes out negative (${(environmentCapacitance / PICO).toFixed(2)} pF): the self-capacitance and top-load models overstate this coil's capacitance. It is still the right correction for predictions on this coil, not a physical capacitance.`,
    );
  }
  if (measurements.length > 1) {
    notes.push(`The sweeps disagree by ${(spread / PICO).toFixed(2)} pF from lowest to highest.`);
  }
  return { environmentCapacitance, isNegative: environmentCapacitance < 0, perMeasurement, spread, notes };
}

/** Predicted effect of changing the top load. */
export interface TopLoadChangePrediction {
  /** First resonance with the build's current top load and the calibrated environment, Hz. */
  readonly currentFirstResonance: number;
  /** First resonance with the new top load, Hz. */
  readonly predictedFirstResonance: number;
  /** predicted − current, Hz (negative when the new load lowers the resonance). */
  readonly shift: number;
  /** shift / current (dimensionless). */
  readonly relativeShift: number;
}

/**
 * Predict the first resonance after swapping the top load, holding the calibrated environment capacitance
 * (lumped model of predictBuild; Thomson's formula).
 */
export function predictTopLoadChange(
  build: SecondaryBuild,
  calibratedEnvironmentCapacitance: number,
  newTopLoad: TopLoadSpec | null,
): TopLoadChangePrediction {
  requireFinite("calibratedEnvironmentCapacitance", calibratedEnvironmentCapacitance);
  // Validate the new load under its own name before predictBuild would report it as "topLoad".
  computeTopLoadCapacitance(newTopLoad, "newTopLoad");
  const rename = { environmentCapacitance: "calibratedEnvironmentCapacitance" };
  const current = withFieldPrefix("", () => predictBuild({ ...build, environmentCapacitance: calibratedEnvironmentCapacitance }), rename);
  const predicted = withFieldPrefix(
    "",
    () => predictBuild({ ...build, topLoad: newTopLoad, environmentCapacitance: calibratedEnvironmentCapacitance }),
    rename,
  );
  const shift = predicted.firstResonance - current.firstResonance;
  return {
    currentFirstResonance: current.firstResonance,
    predictedFirstResonance: predicted.firstResonance,
    shift,
    relativeShift: shift / current.firstResonance,
  };
}
