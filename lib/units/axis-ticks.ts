/**
 * Chart axis ticks that read as round values in one unit ("0 min, 2 min, 4 min", not "100 s, 3.3 min"):
 * the unit is chosen once for the whole axis from its largest magnitude, then the step is the smallest
 * 1-2-5 multiple of a power of ten (the usual graph-paper progression, common practice) that keeps the
 * number of ticks within the limit. Pure, so the chart component and its tests share it.
 */

export type TickQuantity = "duration" | "frequency" | "ohms" | "celsius" | "percent" | "plain";

export interface TickUnit {
  symbol: string;
  /** SI value of one unit (60 for minutes, 1e3 for kHz, 0.01 for percent of a fraction). */
  factor: number;
}

export interface AxisTick {
  /** The tick's position in the axis's own (SI) values. */
  value: number;
  label: string;
}

const PREFIXED = (symbol: string): TickUnit[] => [
  { symbol, factor: 1 },
  { symbol: `k${symbol}`, factor: 1e3 },
  { symbol: `M${symbol}`, factor: 1e6 },
];

/** The one unit an axis spanning up to `largestMagnitude` (SI) is labelled in. */
export function chooseTickUnit(largestMagnitude: number, quantity: TickQuantity): TickUnit {
  const magnitude = Math.abs(largestMagnitude);
  switch (quantity) {
    case "duration":
      // Up to two minutes reads best in seconds, up to two hours in minutes.
      return magnitude >= 2 * 3600 ? { symbol: "h", factor: 3600 } : magnitude >= 120 ? { symbol: "min", factor: 60 } : { symbol: "s", factor: 1 };
    case "frequency":
    case "ohms": {
      const units = PREFIXED(quantity === "frequency" ? "Hz" : "Ω");
      return magnitude >= 1e6 ? units[2]! : magnitude >= 1e3 ? units[1]! : units[0]!;
    }
    case "celsius":
      return { symbol: "°C", factor: 1 };
    case "percent":
      return { symbol: "%", factor: 0.01 };
    default:
      return { symbol: "", factor: 1 };
  }
}

/** The smallest 1, 2 or 5 × 10^k that is at least `rawStep` (> 0). */
export function niceStep(rawStep: number): number {
  if (!(rawStep > 0) || !Number.isFinite(rawStep)) throw new RangeError(`niceStep: the step must be a positive finite number, got ${rawStep}`);
  const power = 10 ** Math.floor(Math.log10(rawStep));
  for (const multiple of [1, 2, 5, 10]) {
    // A relative tolerance so 0.3 / 0.1 rounding noise does not push 3 up to the next multiple.
    if (multiple * power >= rawStep * (1 - 1e-9)) return multiple * power;
  }
  return 10 * power;
}

/** Decimal places that show a step of `step` (in the unit) exactly: 2 → 0, 0.5 → 1, 0.02 → 2. */
function decimalsFor(step: number): number {
  return Math.min(20, Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)));
}

/**
 * A tick value written in `unit`, without float noise ("4 min", "0.5 MHz"); with `step` (in the unit)
 * it keeps as many decimals as the step needs, so neighbouring ticks never print alike.
 */
export function formatTick(value: number, unit: TickUnit, step?: number): string {
  const inUnit = value / unit.factor;
  const shown = step === undefined ? Number(inUnit.toPrecision(6)) : Number(inUnit.toFixed(decimalsFor(step)));
  return unit.symbol === "" ? `${shown}` : `${shown} ${unit.symbol}`;
}

/**
 * Round ticks between `min` and `max` (SI), at most `maxTicks` of them, all labelled in one unit.
 * A one-value range, or one too narrow to hold a round value, gets a single tick at its start.
 */
export function chooseAxisTicks(min: number, max: number, quantity: TickQuantity, maxTicks = 8): { unit: TickUnit; ticks: AxisTick[] } {
  if (!Number.isFinite(min) || !Number.isFinite(max) || max < min) throw new RangeError(`chooseAxisTicks: need finite min ≤ max, got ${min} and ${max}`);
  if (!Number.isInteger(maxTicks) || maxTicks < 2) throw new RangeError(`chooseAxisTicks: maxTicks must be a whole number of at least 2, got ${maxTicks}`);
  const unit = chooseTickUnit(Math.max(Math.abs(min), Math.abs(max)), quantity);
  const low = min / unit.factor;
  const high = max / unit.factor;
  if (high === low) return { unit, ticks: [{ value: min, label: formatTick(min, unit) }] };
  let step = niceStep((high - low) / (maxTicks - 1));
  let first = Math.ceil(low / step - 1e-9) * step;
  // Ceil on both ends can leave one tick too many; the next step up always fits.
  while (Math.floor((high - first) / step + 1e-9) + 1 > maxTicks) {
    step = niceStep(step * 1.0001);
    first = Math.ceil(low / step - 1e-9) * step;
  }
  const ticks: AxisTick[] = [];
  for (let i = 0; first + i * step <= high + step * 1e-9; i++) {
    const inUnit = Number((first + i * step).toFixed(decimalsFor(step)));
    ticks.push({ value: inUnit * unit.factor, label: formatTick(inUnit * unit.factor, unit, step) });
  }
  // A span far narrower than its magnitude may hold no round value at all: label where it starts.
  if (ticks.length === 0) ticks.push({ value: min, label: formatTick(min, unit) });
  return { unit, ticks };
}
