/**
 * What lib/calc predicts for a coil next to what was measured: inductance, first series resonance
 * (with the coil's calibrated environment capacitance and the top load it wears now) and running
 * frequency (against the latest sweep's first series resonance with the same top load).
 */
import { predictBuild, type BuildPrediction, type TopLoadSpec } from "../calc/build-prediction";
import { compareMeasured, type ComparedQuantity, type Comparison } from "../calc/comparison";
import { CalcInputError } from "../calc/errors";
import type { CoilRecord, SessionRecord, SweepRecord, TopLoadRecord } from "./records";

export interface ComparedRow {
  quantity: ComparedQuantity;
  predicted: number | null;
  measured: number | null;
  comparison: Comparison | null;
  /** Where the two figures come from, in plain words. */
  basis: string;
}

export interface CoilComparison {
  prediction: BuildPrediction | null;
  /** Why there is no prediction, when there is none. */
  predictionProblem: string | null;
  currentTopLoad: (TopLoadRecord & { name: string }) | null;
  rows: ComparedRow[];
}

/** A stored top load as lib/calc's spec: a measured capacitance wins over the free-space shape formula. */
export function toTopLoadSpec(topLoad: TopLoadRecord | null): TopLoadSpec | null {
  if (!topLoad || topLoad.shape === "none") return null;
  if (topLoad.measuredCapacitanceF !== null) return { capacitance: topLoad.measuredCapacitanceF };
  const d = topLoad.diameterM;
  if (topLoad.shape === "sphere" && d !== null) return { kind: "sphere", diameter: d };
  if (topLoad.shape === "disc" && d !== null) return { kind: "disc", diameter: d };
  if (topLoad.shape === "toroid" && d !== null && topLoad.tubeDiameterM !== null) return { kind: "toroid", outerDiameter: d, tubeDiameter: topLoad.tubeDiameterM };
  if (topLoad.shape === "cylinder" && d !== null && topLoad.heightM !== null) return { kind: "cylinder", diameter: d, height: topLoad.heightM };
  return null;
}

function compare(quantity: ComparedQuantity, predicted: number | null, measured: number | null, basis: string): ComparedRow {
  const comparison = predicted !== null && measured !== null && predicted > 0 && measured > 0 ? compareMeasured({ quantity, predicted, measured }) : null;
  return { quantity, predicted, measured, comparison, basis };
}

/** The one on the latest session or sweep if still in service, else the newest one not retired (only the latest of each matters). */
export function findCurrentTopLoad<T extends { id: string; retiredAt: Date | null }>(
  topLoads: readonly T[],
  sweeps: readonly Pick<SweepRecord, "takenAt" | "topLoadId">[],
  sessions: readonly Pick<SessionRecord, "startedAt" | "topLoadId">[],
): T | null {
  const inService = topLoads.filter((t) => t.retiredAt === null);
  const lastUsedId = [...sweeps.map((s) => ({ at: s.takenAt, id: s.topLoadId })), ...sessions.map((s) => ({ at: s.startedAt, id: s.topLoadId ?? null }))]
    .sort((a, b) => b.at.getTime() - a.at.getTime())[0]?.id;
  return inService.find((t) => t.id === lastUsedId) ?? inService.at(-1) ?? null;
}

/**
 * The current top load is findCurrentTopLoad's. Sweeps and sessions are given oldest first; of the sessions only
 * the latest and the latest with a running frequency under the current top load are read.
 */
export function compareCoil(
  coil: CoilRecord,
  topLoads: readonly (TopLoadRecord & { name: string; retiredAt: Date | null })[],
  sweeps: readonly SweepRecord[],
  sessions: readonly SessionRecord[],
): CoilComparison {
  const currentTopLoad = findCurrentTopLoad(topLoads, sweeps, sessions);

  let prediction: BuildPrediction | null = null;
  let predictionProblem: string | null = null;
  try {
    prediction = predictBuild({
      formDiameter: coil.formDiameterM,
      windingLength: coil.windingLengthM,
      turns: coil.turns,
      wireDiameter: coil.wireDiameterM,
      topLoad: toTopLoadSpec(currentTopLoad),
      environmentCapacitance: coil.environmentCapacitanceF ?? undefined,
    });
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    predictionProblem = `The model cannot run on this build as recorded: ${error.message}.`;
  }

  const topLoadId = currentTopLoad?.id ?? null;
  const sweep = [...sweeps].reverse().find((s) => s.topLoadId === topLoadId && s.firstSeriesResonanceHz !== null) ?? null;
  const session = [...sessions].reverse().find((s) => (s.topLoadId ?? null) === topLoadId && s.runningFrequencyHz !== null) ?? null;
  const topLoadWords = currentTopLoad ? `“${currentTopLoad.name}”` : "no top load";

  return {
    prediction,
    predictionProblem,
    currentTopLoad,
    rows: [
      compare("inductance", prediction?.inductance ?? null, coil.measuredInductanceH, "Current-sheet model from the recorded geometry vs the inductance measured on a meter."),
      compare(
        "firstResonance",
        prediction?.firstResonance ?? null,
        sweep?.firstSeriesResonanceHz ?? null,
        `Lumped model with ${topLoadWords}${coil.environmentCapacitanceF === null ? " and no calibrated environment capacitance" : " and the calibrated environment capacitance"} vs the latest sweep with that top load${sweep ? ` (${sweep.takenAt.toISOString().slice(0, 10)})` : ""}.`,
      ),
      compare(
        "runningFrequency",
        sweep?.firstSeriesResonanceHz ?? null,
        session?.runningFrequencyHz ?? null,
        `The latest sweep's first series resonance vs the running frequency logged in the latest session with ${topLoadWords}${session ? ` (${session.startedAt.toISOString().slice(0, 10)})` : ""}.`,
      ),
    ],
  };
}
