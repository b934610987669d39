/**
 * What a "margin" is in Coilyard: how close one run session took the switching transistor to
 * one of its limits, with every input that went into the figure and whether it was measured or
 * estimated, so a steward can see why a number is what it is.
 */
import { CalcInputError, requireFinite, requireInRange, requireNonNegative, requirePositive } from "./errors";

export type MarginKind = "voltage" | "current" | "thermal";

/**
 * ok: headroom at or above the "thin" threshold; thin: below it but not over the limit;
 * exceeded: over the limit (headroom < 0); unknown: not enough recorded to compute it.
 */
export type MarginStatus = "ok" | "thin" | "exceeded" | "unknown";

/** One quantity that fed a margin. `source` says where it came from in plain words. */
export interface MarginInput {
  name: string;
  value: number;
  unit: string;
  estimated: boolean;
  source: string;
}

export interface Margin {
  kind: MarginKind;
  /** The stressed quantity (unit given by the matching input). Null when the margin is unknown. */
  value: number | null;
  /** The limit it is compared against. Null when unknown. */
  limit: number | null;
  /** 1 − value/limit as a fraction; negative when over the limit; null when unknown. */
  headroom: number | null;
  status: MarginStatus;
  /** Readable ratio the headroom is taken from, e.g. "V_peak / V_rating". */
  formula: string;
  inputs: MarginInput[];
  /** True when any input is an estimate rather than a measurement or datasheet value. */
  estimated: boolean;
  notes: string[];
}

/** Headroom (fraction of the limit) below which a margin is reported as "thin". */
export interface MarginThresholds {
  voltage: number;
  current: number;
  thermal: number;
}

/**
 * The one table of margin thresholds: the default lending policy starts from it (clearance-policy.ts) and the coil
 * health defaults are it (health-thresholds.ts); at run time every status is judged by the current policy's.
 */
export const DEFAULT_MARGIN_THRESHOLDS: Readonly<MarginThresholds> = {
  /** Stay within 80 % of the rated drain–source voltage (Renesas knowledge base; vendor guidance, not a standard). */
  voltage: 0.2,
  /** Keep switch current within 80 % of its peak and continuous ratings (common practice). */
  current: 0.2,
  /** Keep dissipation within 80 % of the derated power and the junction rise within 80 % of what T_j,max allows (common practice). */
  thermal: 0.2,
};

/** Rounding allowance when comparing a headroom with its threshold (fractions, so 1e-12 is far below any reading's precision). */
const HEADROOM_TOLERANCE = 1e-12;

/** Classifies a headroom fraction against a "thin" threshold (fraction of the limit, 0 to 1). */
export function classifyHeadroom(headroom: number, thinBelow: number): Exclude<MarginStatus, "unknown"> {
  requireFinite("headroom", headroom);
  requireInRange("thinBelow", thinBelow, 0, 1);
  if (headroom < 0) return "exceeded";
  // A peak at exactly 80 % of its rating is "within 80 %", though 1 − 0.8 rounds to 0.19999999999999996.
  return headroom < thinBelow - HEADROOM_TOLERANCE ? "thin" : "ok";
}

/** Builds a computed margin: headroom = 1 − value/limit, status from the threshold. */
export function assessMargin(args: {
  kind: MarginKind;
  value: number;
  limit: number;
  formula: string;
  inputs: MarginInput[];
  notes?: string[];
  thinBelow: number;
}): Margin {
  const value = requireFinite(`${args.kind}.value`, args.value);
  const limit = args.limit;
  if (!Number.isFinite(limit) || limit <= 0) throw new CalcInputError(`${args.kind}.limit`, "a finite limit greater than 0", limit);
  const headroom = 1 - value / limit;
  return {
    kind: args.kind,
    value,
    limit,
    headroom,
    status: classifyHeadroom(headroom, args.thinBelow),
    formula: args.formula,
    inputs: args.inputs,
    estimated: args.inputs.some((input) => input.estimated),
    notes: args.notes ?? [],
  };
}

/** Builds a margin that could not be computed; `notes` must say what is missing. */
export function reportUnknownMargin(args: { kind: MarginKind; formula: string; inputs: MarginInput[]; notes: string[] }): Margin {
  if (args.notes.length === 0) throw new CalcInputError("notes", "at least one note saying what is missing", "[]");
  return {
    kind: args.kind,
    value: null,
    limit: null,
    headroom: null,
    status: "unknown",
    formula: args.formula,
    inputs: args.inputs,
    estimated: args.inputs.some((input) => input.estimated),
    notes: args.notes,
  };
}

/**
 * Reads an optional recorded number: null or undefined mean "not recorded" (stored rows use null);
 * anything else must be finite, or the field is named in a CalcInputError.
 */
export function requireFiniteOrAbsent(field: string, value: number | null | undefined): number | undefined {
  if (value === null || value === undefined) return undefined;
  return requireFinite(field, value);
}

/** An optional recorded number that must be ≥ 0 when present (the margins and their headroom-only path share it). */
export function optionalNonNegative(field: string, value: number | null | undefined): number | undefined {
  const v = requireFiniteOrAbsent(field, value);
  return v === undefined ? undefined : requireNonNegative(field, v);
}

/** An optional recorded number that must be > 0 when present. */
export function optionalPositive(field: string, value: number | null | undefined): number | undefined {
  const v = requireFiniteOrAbsent(field, value);
  return v === undefined ? undefined : requirePositive(field, v);
}
