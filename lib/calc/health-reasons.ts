/**
 * The sentences a steward reads under a coil's health status. Every sentence carries its figures (the rate,
 * its confidence range, the limit, the date), so "watch" or "hold" can be checked rather than taken on trust.
 * Dates are ISO (YYYY-MM-DD) in UTC so the wording does not depend on the server's time zone; the app may
 * re-render them locally. "A month" is 30 days throughout.
 */

/** YYYY-MM-DD of the UTC calendar day of `date`. */
export function formatIsoDate(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** A figure with sensible precision: whole above 100, one decimal from 1, two significant digits below. */
export function formatFigure(value: number): string {
  const abs = Math.abs(value);
  let text: string;
  if (abs >= 100) text = Math.round(abs).toString();
  else if (abs >= 1) text = abs.toFixed(1).replace(/\.0$/, "");
  else if (abs === 0) text = "0";
  else text = Number(abs.toPrecision(2)).toString();
  return (value < 0 && text !== "0" ? "−" : "") + text;
}

/** A fraction as a percentage, e.g. 0.135 → "13.5 %". */
export function formatPercent(fraction: number): string {
  return `${formatFigure(fraction * 100)} %`;
}

/** A frequency in Hz, kHz or MHz. */
export function formatFrequency(hz: number): string {
  if (hz >= 1e6) return `${(hz / 1e6).toFixed(3)} MHz`;
  if (hz >= 1e3) return `${(hz / 1e3).toFixed(1)} kHz`;
  return `${hz.toFixed(0)} Hz`;
}

function formatPValue(p: number): string {
  return p < 0.001 ? "p < 0.001" : `p = ${Number(p.toPrecision(2))}`;
}

/** "95 % range 0.6 to 1.9", or a note that the data cannot bound it yet. */
function formatRange(low: number, high: number, confidence: number, format: (v: number) => string): string {
  const level = formatPercent(confidence);
  if (!Number.isFinite(low) || !Number.isFinite(high)) return `${level} range not yet bounded by the data`;
  return `${level} range ${format(low)} to ${format(high)}`;
}

export function describeMarginBelowLimit(label: string, latest: number, threshold: number, at: Date): string {
  return `Latest ${label} is ${formatPercent(latest)}, below the ${formatPercent(threshold)} limit (session of ${formatIsoDate(at)}).`;
}

export function describeMarginNearLimit(label: string, latest: number, threshold: number, band: number): string {
  return `Latest ${label} is ${formatPercent(latest)}, within ${formatFigure(band * 100)} points of the ${formatPercent(threshold)} limit.`;
}

export interface CrossingWords {
  at: Date;
  earliest: Date;
  latest: Date | null;
  daysAway: number;
  sessionsAway: number | null;
  alreadyReached: boolean;
}

/**
 * A falling margin: its rate in headroom points a month with the confidence range, and where the fitted line
 * meets the limit. Rates arrive as headroom fractions per month (negative = falling).
 */
export function describeFallingMargin(args: {
  label: string;
  perMonth: number;
  perMonthLow: number;
  perMonthHigh: number;
  confidence: number;
  pValue: number;
  threshold: number;
  crossing: CrossingWords | null;
}): string {
  const points = (v: number) => formatFigure(-v * 100);
  const rate =
    `${capitalise(args.label)} is falling about ${points(args.perMonth)} points a month ` +
    `(${formatRange(-args.perMonthHigh, -args.perMonthLow, args.confidence, (v) => formatFigure(v * 100))}; ${formatPValue(args.pValue)}).`;
  const c = args.crossing;
  if (c === null) return rate;
  const limit = formatPercent(args.threshold);
  if (c.alreadyReached) return `${rate} The fitted trend is already at the ${limit} limit.`;
  const away =
    c.sessionsAway !== null ? `in about ${c.sessionsAway} sessions` : `in about ${Math.round(c.daysAway)} days`;
  const spread = `${formatPercent(args.confidence)} range ${formatIsoDate(c.earliest)} to ${
    c.latest === null ? "never, at the slowest plausible rate" : formatIsoDate(c.latest)
  }`;
  return `${rate} At this rate it reaches the ${limit} limit around ${formatIsoDate(c.at)} (${away}; ${spread}).`;
}

export function describeNotEnoughData(what: string, have: number, need: number): string {
  return `Not enough data for ${what}: ${have} recorded, at least ${need} needed.`;
}

/** A level that moved from its baseline, with the rate if a trend could be fitted. */
export function describeShift(args: {
  subject: string;
  shiftFraction: number;
  baselineWords: string;
  trend: { perMonth: number; perMonthLow: number; perMonthHigh: number; confidence: number } | null;
}): string {
  const direction = args.shiftFraction >= 0 ? "up" : "down";
  const rate =
    args.trend === null
      ? ""
      : `, changing about ${signedPercent(args.trend.perMonth)} a month (${formatRange(
          args.trend.perMonthLow,
          args.trend.perMonthHigh,
          args.trend.confidence,
          signedPercent,
        )})`;
  return `${capitalise(args.subject)} is ${direction} ${formatPercent(Math.abs(args.shiftFraction))} since the baseline (${args.baselineWords})${rate}.`;
}

/** "the median of the last 3 sessions against the first 3", "the latest sweep against the first", … */
export function describeBaseline(
  source: "explicit" | "first observations",
  count: number,
  recentCount: number,
  unit: "sessions" | "sweeps",
): string {
  const recent = recentCount === 1 ? `the latest ${unit.slice(0, -1)}` : `the median of the last ${recentCount} ${unit}`;
  const baseline = source === "explicit" ? "the recorded baseline" : count === 1 ? "the first" : `the first ${count}`;
  return `${recent} against ${baseline}`;
}

function signedPercent(fraction: number): string {
  return `${fraction > 0 ? "+" : ""}${formatPercent(fraction)}`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
