/**
 * Heat-sink samples as people log them at the bench: typed or pasted lines, or a CSV file, each
 * holding an elapsed time and a sink temperature ("0:30, 31.2", "30 s; 31.2 °C", "0.5 min 31.2").
 * Pure: no database, no framework, so the form can preview what the server will store.
 * Errors name the row (1-based, as a spreadsheet shows it) and the column, and say what was expected.
 */
import Papa from "papaparse";
import { parseClockDuration, parseQuantity } from "../units/parse";

export interface HeatSinkSampleInput {
  elapsedS: number;
  temperatureC: number;
}

export interface SampleError {
  row: number;
  column: "time" | "temperature" | "row";
  message: string;
}

export type SampleParseResult = { ok: true; samples: HeatSinkSampleInput[] } | { ok: false; errors: SampleError[] };

/** The most samples one session may hold: one a second for over an hour; more is a logger dump, not a bench log. */
export const MAX_SAMPLES = 5_000;

/**
 * Elapsed time in seconds from "0:30" (m:ss), "1:02:03" (h:mm:ss), "30 s", "0.5 min", "2 h" or a
 * bare number (seconds). Returns a message when it cannot be read or is negative.
 */
export function parseSampleTime(text: string): { ok: true; seconds: number } | { ok: false; message: string } {
  const trimmed = text.trim();
  const clockSeconds = parseClockDuration(trimmed);
  if (clockSeconds !== null) return { ok: true, seconds: clockSeconds };
  const parsed = parseQuantity(trimmed, "time");
  if (!parsed.ok) return { ok: false, message: `could not read “${trimmed}” as a time: try 0:30, 30 s or 0.5 min` };
  if (parsed.value < 0) return { ok: false, message: `the time “${trimmed}” is before switch-on; times count from 0` };
  return { ok: true, seconds: parsed.value };
}

/** Sink temperature in °C from "31.2", "31.2 °C" or "88 °F". */
export function parseSampleTemperature(text: string): { ok: true; celsius: number } | { ok: false; message: string } {
  const trimmed = text.trim();
  const parsed = parseQuantity(trimmed, "temperature");
  if (!parsed.ok) return { ok: false, message: `could not read “${trimmed}” as a temperature: try 31.2 or 31.2 °C` };
  if (parsed.value < -40 || parsed.value > 250) {
    return { ok: false, message: `“${trimmed}” is outside −40 °C to 250 °C, which no running heat sink reads` };
  }
  return { ok: true, celsius: parsed.value };
}

/**
 * Splits one line that has no comma, semicolon or tab: the first whitespace split where the left
 * reads as a time and the right as a temperature ("0.5 min 31.2 °C").
 */
function splitOnSpace(line: string): [string, string] | null {
  const parts = line.trim().split(/\s+/);
  for (let i = 1; i < parts.length; i++) {
    const left = parts.slice(0, i).join(" ");
    const right = parts.slice(i).join(" ");
    if (parseSampleTime(left).ok && parseSampleTemperature(right).ok) return [left, right];
  }
  return parts.length >= 2 ? [parts[0]!, parts.slice(1).join(" ")] : null;
}

function looksLikeHeader(cells: readonly string[]): boolean {
  return cells.some((c) => /time|elapsed|temp|sink|°c/i.test(c)) && !parseSampleTemperature(cells[1] ?? "").ok;
}

/**
 * Reads samples from pasted text or CSV. Blank lines are skipped; a first row of column names
 * ("time, temperature") is skipped. Times must increase. Every bad row is reported, not just the first.
 */
export function parseHeatSinkSamples(text: string): SampleParseResult {
  const lines = text.replace(/\r\n?/g, "\n").split("\n");
  const samples: HeatSinkSampleInput[] = [];
  const errors: SampleError[] = [];
  let previous: number | null = null;

  lines.forEach((line, index) => {
    const row = index + 1;
    if (line.trim() === "") return;
    let cells: string[] | null;
    if (/[,;\t]/.test(line)) {
      const parsed = Papa.parse<string[]>(line, { delimitersToGuess: [",", "\t", ";"], skipEmptyLines: true });
      cells = (parsed.data[0] ?? []).map((c) => c.trim());
      // A trailing delimiter ("0:30, 31.2,") leaves empty cells that mean nothing.
      while (cells.length > 2 && cells[cells.length - 1] === "") cells.pop();
    } else {
      cells = splitOnSpace(line);
    }
    if (!cells || cells.length < 2 || cells[1] === "") {
      if (samples.length === 0 && errors.length === 0 && cells && looksLikeHeader(cells)) return;
      errors.push({ row, column: "row", message: "expected two columns: time, then temperature" });
      return;
    }
    if (samples.length === 0 && errors.length === 0 && looksLikeHeader(cells) && !parseSampleTime(cells[0]!).ok) return;
    if (cells.length > 2) {
      errors.push({ row, column: "row", message: `expected two columns (time, temperature) but found ${cells.length}` });
      return;
    }
    const time = parseSampleTime(cells[0]!);
    const temperature = parseSampleTemperature(cells[1]!);
    if (!time.ok) errors.push({ row, column: "time", message: time.message });
    if (!temperature.ok) errors.push({ row, column: "temperature", message: temperature.message });
    if (!time.ok || !temperature.ok) return;
    if (previous !== null && time.seconds <= previous) {
      errors.push({ row, column: "time", message: `times must increase; ${time.seconds} s does not come after ${previous} s` });
      return;
    }
    previous = time.seconds;
    samples.push({ elapsedS: time.seconds, temperatureC: temperature.celsius });
  });

  if (errors.length === 0 && samples.length > MAX_SAMPLES) {
    errors.push({ row: MAX_SAMPLES + 1, column: "row", message: `at most ${MAX_SAMPLES} samples per session` });
  }
  return errors.length > 0 ? { ok: false, errors } : { ok: true, samples };
}

/** One sentence per error, as shown under the samples field. */
export function describeSampleError(error: SampleError): string {
  const where = error.column === "row" ? `Row ${error.row}` : `Row ${error.row}, ${error.column} column`;
  return `${where}: ${error.message}.`;
}
