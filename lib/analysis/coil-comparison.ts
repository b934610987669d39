/**
 * What lib/calc predicts for a coil next to what was measured, every comparison out of sample:
 * - inductance from the geometry against a meter reading;
 * - the first series resonance two ways: from geometry and parts alone (with its GUM band), and calibrated on
 *   the sweeps strictly earlier than the sweep it is compared with (Stone 1974, docs/references.md);
 * - the running frequency from the swept resonance before the session and the offset learnt from sessions
 *   before it (own, else fleet, else prior).
 * The top load is the current one (current-top-load.ts), mapped by top-load-spec.ts.
 */
import { predictBuild, type BuildPrediction } from "../calc/build-prediction";
import { compareMeasured, type ComparedQuantity, type Comparison } from "../calc/comparison";
import { CalcInputError } from "../calc/errors";
import { predictFromGeometry, type GeometryOnlyPrediction } from "../calc/prediction-band";
import { findCurrentTopLoad } from "./current-top-load";
import type { CoilRecord, SessionRecord, SweepRecord, TopLoadRecord } from "./records";
import { checkRunningFrequency, OFFSET_SOURCE_WORDS, pairRunningWithSweeps, type RunningOffsetObservation, type RunningSessionRow } from "./running-offset";
import { calibrateCoilFromSweeps, calibrateOnEarlierSweeps, type CalibrationSweep } from "./sweep-calibration";
import { topLoadSpecOf } from "./top-load-spec";

export type ComparedRowKey = "inductance" | "geometryOnly" | "calibrated" | "runningFrequency";

export interface ComparedRow {
  key: ComparedRowKey;
  quantity: ComparedQuantity;
  predicted: number | null;
  /** The prediction's band (low, high), when it has one. */
  band: { low: number; high: number } | null;
  measured: number | null;
  comparison: Comparison | null;
  /** Where the two figures come from, in plain words. */
  basis: string;
  /** Why there is nothing to compare, when there is not (e.g. "nothing to calibrate on yet"). */
  note: string | null;
}

export interface CalibratedBasis {
  /** Sweeps the environment capacitance was fitted on (all strictly earlier than the compared sweep). */
  fittedOn: { id: string; takenAt: Date }[];
  environmentCapacitanceF: number;
}

export interface CoilComparison {
  /** The build model with the environment calibrated on every sweep so far: the prediction for the NEXT sweep. */
  prediction: BuildPrediction | null;
  /** Why there is no prediction, when there is none. */
  predictionProblem: string | null;
  currentTopLoad: (TopLoadRecord & { name: string }) | null;
  geometryOnly: GeometryOnlyPrediction | null;
  /** The sweep the first-resonance predictions are compared with: the latest with the current top load. */
  comparedSweep: SweepRecord | null;
  calibrated: CalibratedBasis | null;
  rows: ComparedRow[];
}

type StoredTopLoad = TopLoadRecord & { name: string; retiredAt: Date | null };

function compare(key: ComparedRowKey, quantity: ComparedQuantity, predicted: number | null, measured: number | null, basis: string, extra: Partial<Pick<ComparedRow, "band" | "note">> = {}): ComparedRow {
  const comparison = predicted !== null && measured !== null && predicted > 0 && measured > 0 ? compareMeasured({ quantity, predicted, measured }) : null;
  return { key, quantity, predicted, band: extra.band ?? null, measured, comparison, basis, note: extra.note ?? null };
}

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/** The coil's sweeps with their top loads, as the calibration reads them. */
export function toCalibrationSweeps(sweeps: readonly SweepRecord[], topLoads: readonly TopLoadRecord[]): CalibrationSweep[] {
  const byId = new Map(topLoads.map((t) => [t.id, t]));
  return sweeps.map((s) => ({ id: s.id, takenAt: s.takenAt, firstSeriesResonanceHz: s.firstSeriesResonanceHz, topLoad: s.topLoadId === null ? null : (byId.get(s.topLoadId) ?? null) }));
}

function tryModel<T>(compute: () => T): { value: T | null; problem: string | null } {
  try {
    return { value: compute(), problem: null };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { value: null, problem: `The model cannot run on this build as recorded: ${error.message}.` };
  }
}

/**
 * Sweeps and sessions are given oldest first. `runningSessions` are the coil's sessions that logged a running
 * frequency (all of them: the offset is learnt from every earlier one); `fleetObservations` the other coils'
 * running-offset observations, read only when the coil has fewer than two of its own.
 */
export function compareCoil(
  coil: CoilRecord,
  topLoads: readonly StoredTopLoad[],
  sweeps: readonly SweepRecord[],
  sessions: readonly SessionRecord[],
  runningSessions: readonly RunningSessionRow[] = sessions,
  fleetObservations: readonly RunningOffsetObservation[] = [],
): CoilComparison {
  const currentTopLoad = findCurrentTopLoad(topLoads, sweeps, sessions);
  const topLoadSpec = topLoadSpecOf(currentTopLoad);
  const secondary = { formDiameter: coil.formDiameterM, windingLength: coil.windingLengthM, turns: coil.turns, wireDiameter: coil.wireDiameterM };
  const calibrationSweeps = toCalibrationSweeps(sweeps, topLoads);

  const next = tryModel(() => {
    const all = calibrateCoilFromSweeps(coil, calibrationSweeps);
    return predictBuild({ ...secondary, wireMaterial: coil.wireMaterial, topLoad: topLoadSpec, environmentCapacitance: all?.calibration.environmentCapacitance ?? coil.environmentCapacitanceF ?? undefined });
  });
  const geometry = tryModel(() => predictFromGeometry({ ...secondary, topLoad: topLoadSpec }));

  const topLoadId = currentTopLoad?.id ?? null;
  const comparedSweep = sweeps.findLast((s) => s.topLoadId === topLoadId && s.firstSeriesResonanceHz !== null) ?? null;
  const topLoadWords = currentTopLoad ? `“${currentTopLoad.name}”` : "no top load";
  const sweepWords = comparedSweep ? `the latest sweep with ${topLoadWords} (${isoDay(comparedSweep.takenAt)})` : `a sweep with ${topLoadWords} (none yet)`;

  // Calibrated, out of sample: fitted only on sweeps before the compared one.
  let calibrated: CalibratedBasis | null = null;
  let calibratedRow: ComparedRow;
  if (!comparedSweep) {
    calibratedRow = compare("calibrated", "firstResonance", null, null, "Environment capacitance fitted on this coil's sweeps, compared with a later sweep.", { note: "no sweep with this top load to compare with yet" });
  } else {
    const earlier = tryModel(() => {
      const fit = calibrateOnEarlierSweeps(coil, calibrationSweeps, comparedSweep.takenAt);
      return fit && { fit, predicted: predictBuild({ ...secondary, topLoad: topLoadSpec, environmentCapacitance: fit.calibration.environmentCapacitance }).firstResonance };
    });
    if (earlier.value) {
      const { fit, predicted } = earlier.value;
      calibrated = { fittedOn: fit.sweeps.map((s) => ({ id: s.id, takenAt: s.takenAt })), environmentCapacitanceF: fit.calibration.environmentCapacitance };
      const names = fit.sweeps.map((s) => isoDay(s.takenAt)).join(", ");
      calibratedRow = compare(
        "calibrated",
        "firstResonance",
        predicted,
        comparedSweep.firstSeriesResonanceHz,
        `Lumped model with ${topLoadWords} and the environment capacitance fitted on the ${fit.sweeps.length} earlier sweep${fit.sweeps.length === 1 ? "" : "s"} (${names}), never on the sweep compared, vs ${sweepWords}.`,
      );
    } else {
      calibratedRow = compare("calibrated", "firstResonance", null, comparedSweep.firstSeriesResonanceHz, `Environment capacitance fitted on sweeps before ${sweepWords}.`, {
        note: earlier.problem ?? "nothing to calibrate on yet: no sweep before the one compared",
      });
    }
  }

  const geometryRow = compare(
    "geometryOnly",
    "firstResonance",
    geometry.value?.firstResonance ?? null,
    comparedSweep?.firstSeriesResonanceHz ?? null,
    `${geometry.value?.basis.join(" ") ?? "From geometry and parts alone."} Top load: ${topLoadWords}. Compared with ${sweepWords}.`,
    { band: geometry.value ? { low: geometry.value.low, high: geometry.value.high } : null },
  );

  return {
    prediction: next.value,
    predictionProblem: next.problem ?? geometry.problem,
    currentTopLoad,
    geometryOnly: geometry.value,
    comparedSweep,
    calibrated,
    rows: [
      compare("inductance", "inductance", next.value?.inductance ?? null, coil.measuredInductanceH, "Current-sheet model from the recorded geometry vs the inductance measured on a meter."),
      geometryRow,
      calibratedRow,
      runningRow(runningSessions, sweeps, topLoadId, topLoadWords, fleetObservations),
    ],
  };
}

/** The latest session with the current top load that logged a running frequency, against its prediction from before it. */
function runningRow(sessions: readonly RunningSessionRow[], sweeps: readonly SweepRecord[], topLoadId: string | null, topLoadWords: string, fleet: readonly RunningOffsetObservation[]): ComparedRow {
  const own = pairRunningWithSweeps(sessions, sweeps);
  const session = sessions.findLast((s) => (s.topLoadId ?? null) === topLoadId && s.runningFrequencyHz !== null) ?? null;
  if (!session) {
    return compare("runningFrequency", "runningFrequency", null, null, `Running frequency logged with ${topLoadWords}.`, { note: "no session with this top load logged a running frequency yet" });
  }
  const observation = own.find((o) => o.sessionId === session.id);
  if (!observation) {
    return compare("runningFrequency", "runningFrequency", null, session.runningFrequencyHz, `Running frequency logged ${isoDay(session.startedAt)} with ${topLoadWords}.`, {
      note: "no sweep with this top load before that session to predict from",
    });
  }
  const check = checkRunningFrequency(observation, own, fleet);
  const { offset } = check.prediction;
  const percent = (x: number) => `${((x - 1) * 100 >= 0 ? "+" : "")}${((x - 1) * 100).toFixed(1)} %`;
  const k = 2;
  return compare(
    "runningFrequency",
    "runningFrequency",
    check.prediction.frequency,
    session.runningFrequencyHz,
    `The sweep of ${isoDay(observation.sweptAt)} times an offset of ${percent(offset.ratio)} ± ${(offset.standardUncertainty * 100).toFixed(1)} % learnt from ${OFFSET_SOURCE_WORDS[offset.source]}${offset.count > 0 ? ` (${offset.count})` : ""}, vs the running frequency logged ${isoDay(session.startedAt)} with ${topLoadWords}.`,
    { band: { low: check.prediction.frequency - k * check.prediction.standardUncertainty, high: check.prediction.frequency + k * check.prediction.standardUncertainty } },
  );
}
