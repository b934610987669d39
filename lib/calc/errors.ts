/**
 * The one error type lib/calc throws for input it cannot honestly compute with.
 * Callers (forms, imports, the seed) catch it and show `field` next to the value that caused it,
 * instead of letting NaN or Infinity flow into a stored figure.
 */
export class CalcInputError extends RangeError {
  override readonly name = "CalcInputError";
  constructor(
    /** The offending input, named as the caller passed it (e.g. "diameter", "points[3].frequency"). */
    readonly field: string,
    /** What was expected, in words a user can act on. */
    readonly expected: string,
    /** The value received, kept for messages and logs. */
    readonly received?: unknown,
  ) {
    super(`${field}: expected ${expected}${received === undefined ? "" : `, got ${String(received)}`}`);
  }
}

/** A finite number greater than zero (what requirePositive accepts). */
export const isPositive = (value: number): boolean => Number.isFinite(value) && value > 0;

/** A finite number ≥ 0 (what requireNonNegative accepts). */
export const isNonNegative = (value: number): boolean => Number.isFinite(value) && value >= 0;

/** Throws unless `value` is a finite number greater than zero. Returns it for chaining. */
export function requirePositive(field: string, value: number): number {
  if (!isPositive(value)) throw new CalcInputError(field, "a finite number greater than 0", value);
  return value;
}

/** Throws unless `value` is a finite number ≥ 0. */
export function requireNonNegative(field: string, value: number): number {
  if (!isNonNegative(value)) throw new CalcInputError(field, "a finite number ≥ 0", value);
  return value;
}

/** Throws unless `value` is finite. */
export function requireFinite(field: string, value: number): number {
  if (!Number.isFinite(value)) throw new CalcInputError(field, "a finite number", value);
  return value;
}

/** A finite number with min ≤ value ≤ max (what requireInRange accepts). */
export const isInRange = (value: number, min: number, max: number): boolean => Number.isFinite(value) && value >= min && value <= max;

/** Throws unless min ≤ value ≤ max. */
export function requireInRange(field: string, value: number, min: number, max: number): number {
  if (!isInRange(value, min, max)) {
    throw new CalcInputError(field, `a number from ${min} to ${max}`, value);
  }
  return value;
}
