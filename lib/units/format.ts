/**
 * Formatting engineering quantities and times for display. SI prefixes with three significant
 * figures by default ("321 kHz", "2.20 nF", "47.0 kΩ"). Hand-written because it is a dozen lines and
 * the prefix table is fixed by the SI brochure; a units library would add weight without adding anything.
 */
const PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [1e12, "T"], [1e9, "G"], [1e6, "M"], [1e3, "k"], [1, ""], [1e-3, "m"], [1e-6, "µ"], [1e-9, "n"], [1e-12, "p"], [1e-15, "f"],
];

export function formatQuantity(value: number | null | undefined, unit: string, significant = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return `0 ${unit}`;
  const magnitude = Math.abs(value);
  const [scale, prefix] = PREFIXES.find(([s]) => magnitude >= s * 0.9995) ?? PREFIXES[PREFIXES.length - 1]!;
  return `${Number((value / scale).toPrecision(significant))} ${prefix}${unit}`;
}

/**
 * Rewrites bare SI figures inside free text ("first series resonance 330962 Hz") with their prefixes
 * ("331 kHz"), for text written before it was formatted, such as stored audit summaries. Only a number
 * followed by a space and one of these units as a whole word is touched.
 */
export function formatQuantitiesInText(text: string): string {
  return text.replace(/(?<![\w.])(-?\d+(?:\.\d+)?(?:e[-+]?\d+)?) (Hz|H|F|Ω|V|A|W)(?![\wΩ])/g, (_, figure: string, unit: string) => formatQuantity(Number(figure), unit));
}

/** "1 version", "3 versions", "0 entries": a count with its noun agreeing (plural given when not noun + "s"). */
export function formatCount(count: number, singular: string, plural = `${singular}s`): string {
  return `${count} ${count === 1 ? singular : plural}`;
}

/** A plain number with fixed decimals, or a dash. */
export function formatNumber(value: number | null | undefined, decimals = 1, unit = ""): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return `${value.toFixed(decimals)}${unit ? ` ${unit}` : ""}`;
}

export function formatPercent(fraction: number | null | undefined, decimals = 0): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return "—";
  const percent = fraction * 100;
  // A value that rounds to zero is shown as 0, never "-0".
  return `${(Math.abs(percent) < 0.5 * 10 ** -decimals ? 0 : percent).toFixed(decimals)} %`;
}

export function formatTemperature(celsius: number | null | undefined): string {
  return formatNumber(celsius, 1, "°C");
}

/** Duration in s as "1 h 05 min", "12 min 30 s" or "45 s". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return "—";
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const rest = s % 60;
  if (h > 0) return `${h} h ${String(m).padStart(2, "0")} min`;
  if (m > 0) return rest ? `${m} min ${String(rest).padStart(2, "0")} s` : `${m} min`;
  return `${rest} s`;
}

const dateFormat = new Intl.DateTimeFormat("en-CA", { year: "numeric", month: "2-digit", day: "2-digit" });
const timeFormat = new Intl.DateTimeFormat("en-GB", { hour: "2-digit", minute: "2-digit", hour12: false });

/** "2026-12-02" in the server's time zone (the lab's, in a normal deployment). */
export function formatDate(date: Date | null | undefined): string {
  return date ? dateFormat.format(date) : "—";
}

/** "2026-12-02 14:05". */
export function formatDateTime(date: Date | null | undefined): string {
  return date ? `${dateFormat.format(date)} ${timeFormat.format(date)}` : "—";
}
