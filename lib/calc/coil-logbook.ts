/**
 * What a coil's health assessment reads from the logbook — its run sessions, its sweeps, and optional explicit
 * baselines — and the checks that turn bad rows into a CalcInputError naming the row and field.
 */
import { CalcInputError, isNonNegative, isPositive, requireFinite, requireInRange, requireNonNegative, requirePositive } from "./errors";
import type { HealthThresholds } from "./health-thresholds";

/** One run session as the logbook holds it; null or absent means "not recorded". */
export interface CoilSession {
  startedAt: Date;
  supplyVoltageV: number;
  /** Average supply current, A. */
  supplyCurrentA: number;
  runningFrequencyHz?: number | null;
  /** Headrooms are fractions 1 − stressed/limit (negative when over the limit), computed per session elsewhere. */
  voltageHeadroom?: number | null;
  currentHeadroom?: number | null;
  thermalHeadroom?: number | null;
  /** Heat-sink temperature at the end of the run minus ambient, K. */
  heatSinkRiseK?: number | null;
  durationS: number;
}

export interface CoilSweep {
  takenAt: Date;
  firstSeriesResonanceHz?: number | null;
}

/** Explicit baselines (e.g. from commissioning); otherwise the first sessions/sweeps are the baseline. */
export interface HealthBaseline {
  /** Sessions whose median forms a session baseline, and the recent level (default 3). */
  sessionCount?: number;
  /** Sweeps likewise (default 1: the first sweep against the latest). */
  sweepCount?: number;
  runningFrequencyHz?: number;
  firstSeriesResonanceHz?: number;
  /** A supply current and the supply voltage it was drawn at. */
  supplyCurrent?: { supplyVoltageV: number; supplyCurrentA: number };
  heatSinkRisePerWattKPerW?: number;
}

export interface ValidBaseline extends Omit<HealthBaseline, "sessionCount" | "sweepCount"> {
  sessionCount: number;
  sweepCount: number;
}

/** Sessions and sweeps checked and in time order, the baseline with its defaults filled in. */
export function validateLogbook(input: {
  sessions: readonly CoilSession[];
  sweeps: readonly CoilSweep[];
  baseline?: HealthBaseline;
}): { sessions: CoilSession[]; sweeps: CoilSweep[]; baseline: ValidBaseline } {
  return {
    sessions: input.sessions.map(validateSession).sort((a, b) => a.startedAt.getTime() - b.startedAt.getTime()),
    sweeps: input.sweeps.map(validateSweep).sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime()),
    baseline: validateBaseline(input.baseline ?? {}),
  };
}

const isValidDate = (value: unknown): value is Date => value instanceof Date && !Number.isNaN(value.getTime());

export function requireDate(field: string, value: unknown): Date {
  if (!isValidDate(value)) throw new CalcInputError(field, "a valid date", value);
  return value;
}

function optional(field: string, value: number | null | undefined, check: (f: string, v: number) => number) {
  return value == null ? null : check(field, value);
}

/** A finite headroom fraction ≤ 1 (what requireHeadroom accepts). */
const isHeadroom = (value: number): boolean => Number.isFinite(value) && value <= 1;

function requireHeadroom(field: string, value: number): number {
  requireFinite(field, value);
  if (value > 1) throw new CalcInputError(field, "a headroom fraction ≤ 1 (1 − stressed/limit)", value);
  return value;
}

function validateSession(s: CoilSession, i: number): CoilSession {
  // Each field's name is spelled out only when its value fails (sessionField): a string per field per session was most
  // of this check's cost on a dashboard judging 500 coils' 63-session windows. Each test is the one its require* makes.
  return {
    startedAt: isValidDate(s.startedAt) ? s.startedAt : sessionField(i, "startedAt", requireDate, s.startedAt),
    supplyVoltageV: isPositive(s.supplyVoltageV) ? s.supplyVoltageV : sessionField(i, "supplyVoltageV", requirePositive, s.supplyVoltageV),
    supplyCurrentA: isNonNegative(s.supplyCurrentA) ? s.supplyCurrentA : sessionField(i, "supplyCurrentA", requireNonNegative, s.supplyCurrentA),
    durationS: isNonNegative(s.durationS) ? s.durationS : sessionField(i, "durationS", requireNonNegative, s.durationS),
    runningFrequencyHz: optionalSessionValue(i, "runningFrequencyHz", s.runningFrequencyHz, isPositive, requirePositive),
    voltageHeadroom: optionalSessionValue(i, "voltageHeadroom", s.voltageHeadroom, isHeadroom, requireHeadroom),
    currentHeadroom: optionalSessionValue(i, "currentHeadroom", s.currentHeadroom, isHeadroom, requireHeadroom),
    thermalHeadroom: optionalSessionValue(i, "thermalHeadroom", s.thermalHeadroom, isHeadroom, requireHeadroom),
    heatSinkRiseK: optionalSessionValue(i, "heatSinkRiseK", s.heatSinkRiseK, Number.isFinite, requireFinite),
  };
}

/** `check` on session i's field `name`, named as "sessions[i].name". */
function sessionField<T, R>(i: number, name: keyof CoilSession, check: (field: string, value: T) => R, value: T): R {
  return check(`sessions[${i}].${name}`, value);
}

/** An optional session value: null when absent, itself when `ok`, else what `check` makes of it (it throws). */
function optionalSessionValue(
  i: number,
  name: keyof CoilSession,
  value: number | null | undefined,
  ok: (value: number) => boolean,
  check: (field: string, value: number) => number,
): number | null {
  return value == null ? null : ok(value) ? value : sessionField(i, name, check, value);
}

function validateSweep(s: CoilSweep, i: number): CoilSweep {
  return {
    takenAt: requireDate(`sweeps[${i}].takenAt`, s.takenAt),
    firstSeriesResonanceHz: optional(`sweeps[${i}].firstSeriesResonanceHz`, s.firstSeriesResonanceHz, requirePositive),
  };
}

export function validateThresholds(t: HealthThresholds): HealthThresholds {
  const f = (name: keyof HealthThresholds) => `thresholds.${name}`;
  for (const key of ["voltageHeadroom", "currentHeadroom", "thermalHeadroom", "nearMargin"] as const) {
    requireInRange(f(key), t[key], 0, 0.99);
  }
  for (const key of ["currentShift", "frequencyShift", "heatRiseShift"] as const) requirePositive(f(key), t[key]);
  for (const key of ["voltageBand", "durationBand"] as const) requireInRange(f(key), t[key], 0.001, 0.9);
  requireNonNegative(f("holdWithinDays"), t.holdWithinDays);
  requireInRange(f("watchWithinDays"), t.watchWithinDays, t.holdWithinDays, 36_500);
  return t;
}

function validateBaseline(b: HealthBaseline): ValidBaseline {
  const count = (name: "sessionCount" | "sweepCount", fallback: number) => {
    const value = b[name] ?? fallback;
    if (!Number.isInteger(value) || value < 1) throw new CalcInputError(`baseline.${name}`, "a whole number ≥ 1", value);
    return value;
  };
  const supplyCurrent = b.supplyCurrent && {
    supplyVoltageV: requirePositive("baseline.supplyCurrent.supplyVoltageV", b.supplyCurrent.supplyVoltageV),
    supplyCurrentA: requirePositive("baseline.supplyCurrent.supplyCurrentA", b.supplyCurrent.supplyCurrentA),
  };
  return {
    sessionCount: count("sessionCount", 3),
    sweepCount: count("sweepCount", 1),
    runningFrequencyHz: optional("baseline.runningFrequencyHz", b.runningFrequencyHz, requirePositive) ?? undefined,
    firstSeriesResonanceHz:
      optional("baseline.firstSeriesResonanceHz", b.firstSeriesResonanceHz, requirePositive) ?? undefined,
    heatSinkRisePerWattKPerW:
      optional("baseline.heatSinkRisePerWattKPerW", b.heatSinkRisePerWattKPerW, requirePositive) ?? undefined,
    supplyCurrent,
  };
}
