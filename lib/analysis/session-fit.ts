/**
 * A session's warm-up fit as it is stored with the session (RunSession's sinkFit… columns), so every view judges the
 * session from the same fitted steady state: written with the samples (lib/db/sessions.ts, import, demo load, the
 * setup backfill) and read back by the session page, the coil page, the dashboard's summary and the clearance check.
 */
import { CalcInputError } from "../calc/errors";
import { fitHeatingCurve, type Extrapolation, type HeatingCurve } from "../calc/heating";
import type { SampleRecord } from "./records";

/** The RunSession columns. sinkFitSampleCount null: never computed (the backfill's marker). */
export interface StoredSinkFit {
  sinkFitSampleCount: number | null;
  sinkSteadyStateC: number | null;
  sinkSteadyStateSeK: number | null;
  sinkTimeConstantS: number | null;
  sinkFitExtrapolation: string | null;
  /** The whole curve (infinite standard errors as null), or { error } when the samples could not be fitted. */
  sinkFitJson: string | null;
}

export type SessionFit = { fit: HeatingCurve; note: null } | { fit: null; note: string };

/** Fits a session's samples for storage. Deterministic: refitting the same samples gives the same doubles. */
export function fitSessionSamples(samples: readonly SampleRecord[]): StoredSinkFit {
  const ordered = [...samples].sort((a, b) => a.elapsedS - b.elapsedS);
  const empty = { sinkFitSampleCount: ordered.length, sinkSteadyStateC: null, sinkSteadyStateSeK: null, sinkTimeConstantS: null, sinkFitExtrapolation: null };
  if (ordered.length < 3) return { ...empty, sinkFitJson: null };
  try {
    const fit = fitHeatingCurve(ordered.map((s) => ({ time: s.elapsedS, temperature: s.temperatureC })));
    return {
      sinkFitSampleCount: ordered.length,
      sinkSteadyStateC: fit.steadyState,
      sinkSteadyStateSeK: finiteOrNull(fit.standardErrors.steadyState),
      sinkTimeConstantS: fit.timeConstant,
      sinkFitExtrapolation: fit.extrapolation,
      sinkFitJson: JSON.stringify(fit, (_key, value: unknown) => (typeof value === "number" && !Number.isFinite(value) ? null : value)),
    };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { ...empty, sinkFitJson: JSON.stringify({ error: error.message }) };
  }
}

/** The stored fit, or undefined when the row has none stored yet (sinkFitSampleCount null or absent). */
export function readStoredSinkFit(row: Partial<StoredSinkFit>): SessionFit | undefined {
  if (row.sinkFitSampleCount === null || row.sinkFitSampleCount === undefined) return undefined;
  if (row.sinkFitSampleCount < 3 || !row.sinkFitJson) return { fit: null, note: fewSamplesNote(row.sinkFitSampleCount) };
  const parsed = JSON.parse(row.sinkFitJson) as Partial<Record<keyof HeatingCurve, unknown>> & { error?: string };
  if (typeof parsed.error === "string") return { fit: null, note: `The heat-sink samples could not be fitted: ${parsed.error}.` };
  const errors = (parsed.standardErrors ?? {}) as Record<string, number | null>;
  const infinite = (v: number | null | undefined) => (typeof v === "number" ? v : Number.POSITIVE_INFINITY);
  const fit: HeatingCurve = {
    ambient: parsed.ambient as number,
    rise: parsed.rise as number,
    timeConstant: parsed.timeConstant as number,
    steadyState: parsed.steadyState as number,
    rSquared: parsed.rSquared as number,
    residualStd: parsed.residualStd as number,
    standardErrors: {
      ambient: infinite(errors.ambient),
      rise: infinite(errors.rise),
      timeConstant: infinite(errors.timeConstant),
      steadyState: infinite(errors.steadyState),
    },
    duration: parsed.duration as number,
    extrapolation: parsed.extrapolation as Extrapolation,
    explanation: parsed.explanation as string,
  };
  return { fit, note: null };
}

/** The same answer from samples in hand (a session not yet stored, or one whose fit predates the columns). */
export function fitFromSamples(samples: readonly SampleRecord[]): SessionFit {
  return readStoredSinkFit(fitSessionSamples(samples)) as SessionFit;
}

function fewSamplesNote(count: number): string {
  return `${count === 0 ? "No" : `Only ${count}`} heat-sink sample${count === 1 ? " was" : "s were"} logged: too few to fit a warm-up (three at least), so the thermal margin is judged at a worst case.`;
}

function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}
