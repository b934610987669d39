/**
 * Reading a sweep exported by an oscilloscope or a logging script: find the delimiter and whether
 * there is a header row, suggest which column is the frequency and which the amplitude (and their
 * units), then read every row into SI points, refusing the file at the first bad row with the row,
 * the column and what was expected.
 *
 * Parsing is papaparse's, not a hand-written split: scope exports quote headers that contain the
 * delimiter ("Freq, kHz"), mix line endings, and a 100 000-row file has to be read in chunks in the
 * browser (papaparse streams a File/Blob chunk by chunk with correct handling of rows cut at a chunk
 * edge); its delimiter guess (consistent field counts over the first rows) is the well-tested part
 * we would otherwise reimplement. One correction is ours: see detectDelimiter.
 */
import Papa from "papaparse";

export type FrequencyUnit = "Hz" | "kHz" | "MHz";
export type AmplitudeUnit = "V" | "mV";

export const FREQUENCY_UNIT_FACTOR: Readonly<Record<FrequencyUnit, number>> = { Hz: 1, kHz: 1e3, MHz: 1e6 };
export const AMPLITUDE_UNIT_FACTOR: Readonly<Record<AmplitudeUnit, number>> = { V: 1, mV: 1e-3 };

/** Which column holds what, in which unit (columns counted from 0). */
export interface SweepColumnMapping {
  frequencyColumn: number;
  frequencyUnit: FrequencyUnit;
  amplitudeColumn: number;
  amplitudeUnit: AmplitudeUnit;
}

/** What the first part of a file looks like. */
export interface SweepCsvLayout {
  delimiter: string;
  /** Numbers written with a decimal comma ("1,5"); only possible when the delimiter is not a comma. */
  decimalComma: boolean;
  hasHeader: boolean;
  /** The header's row in the file (1-based, blank lines counted), or null without one. */
  headerRow: number | null;
  /** The first row that may hold a reading; comment and preamble lines above it are skipped. */
  firstDataRow: number;
  /** Comment ("#…") and preamble lines skipped above the header or the first reading, as found. */
  skippedRows: SweepCsvLine[];
  /** The lines a user may pick as the header instead: every non-blank line down to the first readings. */
  headerChoices: SweepCsvLine[];
  /** Column names: the header's cells, or "Column 1", "Column 2"… */
  columns: string[];
  /** Up to 10 data rows as read (after the header). */
  sampleRows: string[][];
  suggested: SweepColumnMapping;
}

/** One line of the file with its row number (1-based, blank lines counted, as the errors count them). */
export interface SweepCsvLine {
  row: number;
  text: string;
}

/** One reading in SI, with the file row it came from (1-based, header included). */
export interface MappedSweepPoint {
  row: number;
  frequencyHz: number;
  amplitudeV: number;
}

export interface SweepCsvError {
  row: number;
  /** The column's name as shown to the user, or "" when the whole row is at fault. */
  column: string;
  expected: string;
  got: string;
  message: string;
}

export type SweepCsvResult = { ok: true; points: MappedSweepPoint[] } | { ok: false; error: SweepCsvError };

export const DELIMITER_NAMES: Readonly<Record<string, string>> = { ",": "comma", ";": "semicolon", "\t": "tab", "|": "vertical bar" };

const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA_NUMBER = /^[+-]?\d+,\d+$/;

export function stripByteOrderMark(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** A cell as a number, or null when it is not one. Thousands separators are not accepted: they are ambiguous. */
export function readDecimal(cell: string, decimalComma: boolean): number | null {
  let text = cell.trim();
  if (decimalComma && DECIMAL_COMMA_NUMBER.test(text)) text = text.replace(",", ".");
  if (!PLAIN_NUMBER.test(text)) return null;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

function isBlankRow(row: readonly string[]): boolean {
  return row.every((cell) => cell.trim() === "");
}

/** A comment line: its first cell starts with "#" (scope and logger exports put settings there). */
function isCommentRow(row: readonly string[]): boolean {
  return (row[0] ?? "").trim().startsWith("#");
}

/** Only numbers and delimiters: a line of readings, whichever the delimiter. */
const READING_LINE = /^[\s\d.,;\t|eE+\-"]*\d[\s\d.,;\t|eE+\-"]*$/;

/** Two or more cells, every non-empty one a number. */
function isReadingRow(row: readonly string[], decimalComma: boolean): boolean {
  const cells = row.map((c) => c.trim()).filter((c) => c !== "");
  return cells.length >= 2 && cells.every((c) => readDecimal(c, decimalComma) !== null);
}

/**
 * The delimiter. A semicolon or tab present the same number of times on every sampled line is the
 * delimiter, whatever papaparse guesses: with decimal commas ("1,5;0,25") papaparse prefers the comma,
 * which splits every line into more (equally many) fields. Otherwise papaparse's guess stands.
 */
function detectDelimiter(lines: readonly string[]): string {
  for (const candidate of ["\t", ";"]) {
    const counts = lines.map((line) => line.split(candidate).length - 1);
    if (counts.length > 0 && counts[0]! > 0 && counts.every((c) => c === counts[0])) return candidate;
  }
  const guess = Papa.parse<string[]>(lines.join("\n"), { delimitersToGuess: [",", ";", "\t", "|"] });
  return guess.meta.delimiter || ",";
}

/**
 * Look at the start of a file (a few kB is enough) and say how it is laid out. Comment lines ("#…") and
 * preamble lines (instrument, date, settings) above the readings are skipped: the header is the line just
 * above the first line of readings when none of its cells is a number. `headerRow` overrides the guess:
 * a row number picks that line as the header, null says there is none.
 */
export function detectSweepCsvLayout(text: string, options: { headerRow?: number | null } = {}): SweepCsvLayout {
  const allLines = stripByteOrderMark(text).split(/\r\n|\n|\r/).slice(0, 200);
  // The last line of a sample may be cut short; leave it out of the guess when there are others.
  const sampled = allLines.length > 2 ? allLines.slice(0, -1) : allLines;
  const lines: SweepCsvLine[] = sampled.map((line, i) => ({ row: i + 1, text: line })).filter((l) => l.text.trim() !== "");
  const content = lines.filter((l) => !l.text.trim().startsWith("#"));
  // The delimiter is judged on the readings (and the line above them), not on a preamble written as free text.
  const firstReading = content.findIndex((l) => READING_LINE.test(l.text));
  const delimiterSample = firstReading === -1 ? content : content.slice(Math.max(0, firstReading - 1), firstReading + 30);
  const delimiter = detectDelimiter(delimiterSample.map((l) => l.text));
  const parsed = content.map((l) => ({ ...l, cells: Papa.parse<string[]>(l.text, { delimiter }).data[0] ?? [l.text] }));
  const decimalComma = delimiter !== "," && parsed.some((r) => r.cells.some((cell) => DECIMAL_COMMA_NUMBER.test(cell.trim())));

  const dataIndex = parsed.findIndex((r) => isReadingRow(r.cells, decimalComma));
  let headerIndex: number;
  let firstDataIndex: number;
  if (options.headerRow !== undefined) {
    headerIndex = options.headerRow === null ? -1 : parsed.findIndex((r) => r.row === options.headerRow);
    firstDataIndex = headerIndex !== -1 ? headerIndex + 1 : dataIndex === -1 ? 0 : dataIndex;
  } else if (dataIndex === -1) {
    // No line of readings at all (a header alone, or bad numbers throughout): the first line is the header
    // when any cell of it is not a number, and the rows after it are refused by row and column when read.
    headerIndex = parsed[0] && parsed[0].cells.some((cell) => readDecimal(cell, decimalComma) === null) ? 0 : -1;
    firstDataIndex = headerIndex + 1;
  } else {
    const above = parsed[dataIndex - 1];
    headerIndex = above && above.cells.every((cell) => readDecimal(cell, decimalComma) === null) ? dataIndex - 1 : -1;
    firstDataIndex = dataIndex;
  }
  const header = headerIndex === -1 ? null : parsed[headerIndex]!;
  const dataRows = parsed.slice(firstDataIndex);
  const width = Math.max(0, ...(header ? [header.cells.length] : []), ...dataRows.slice(0, 30).map((r) => r.cells.length));
  const columns = Array.from({ length: width }, (_, i) => (header ? header.cells[i]?.trim() || `Column ${i + 1}` : `Column ${i + 1}`));
  const firstDataRow = dataRows[0]?.row ?? (header ? header.row + 1 : (lines.at(-1)?.row ?? 0) + 1);
  const skippedRows = lines.filter((l) => l.row < (header?.row ?? firstDataRow)).map(({ row, text }) => ({ row, text }));
  const choicesEnd = Math.max(dataIndex, headerIndex, 0) + 1;
  const headerChoices = parsed.slice(0, Math.min(choicesEnd, 20)).map(({ row, text }) => ({ row, text }));
  return {
    delimiter,
    decimalComma,
    hasHeader: header !== null,
    headerRow: header?.row ?? null,
    firstDataRow,
    skippedRows,
    headerChoices,
    columns,
    sampleRows: dataRows.slice(0, 10).map((r) => r.cells),
    suggested: suggestMapping(columns, header !== null),
  };
}

/**
 * What stops a file before any row is read, in the user's words: nothing in it, only comments, or a header
 * with no readings under it. Null when there is something to read.
 */
export function describeLayoutProblem(layout: SweepCsvLayout): string | null {
  if (layout.sampleRows.length > 0) return null;
  if (layout.headerRow !== null) return `Row ${layout.headerRow}: no readings after the header`;
  if (layout.skippedRows.length > 0) return "The file is empty: it holds only comment or preamble lines";
  return "The file is empty";
}

/** Guess from the header's words; without a header, frequency first, amplitude second, in Hz and V. */
export function suggestMapping(columns: readonly string[], hasHeader: boolean): SweepColumnMapping {
  const find = (pattern: RegExp) => (hasHeader ? columns.findIndex((name) => pattern.test(name)) : -1);
  const frequencyColumn = Math.max(0, find(/freq|hz/i));
  let amplitudeColumn = find(/amp|volt|vout|v\s*\(|\(\s*m?v\s*\)|\bm?v\b|ch\s*\d|mag|level|reading/i);
  if (amplitudeColumn === -1 || amplitudeColumn === frequencyColumn) amplitudeColumn = frequencyColumn === 0 ? Math.min(1, columns.length - 1) : 0;
  const frequencyName = columns[frequencyColumn] ?? "";
  const amplitudeName = columns[amplitudeColumn] ?? "";
  // Millihertz never appears on a coil bench, so "mHz" in a header means MHz (as lib/units/parse reads it).
  const frequencyUnit: FrequencyUnit = /mhz/i.test(frequencyName) ? "MHz" : /khz/i.test(frequencyName) ? "kHz" : "Hz";
  const amplitudeUnit: AmplitudeUnit = /mv/i.test(amplitudeName) ? "mV" : "V";
  return { frequencyColumn, frequencyUnit, amplitudeColumn, amplitudeUnit };
}

function describeCsvError(row: number, column: string, expected: string, got: string): SweepCsvError {
  const where = column === "" ? `Row ${row}` : `Row ${row}, column '${column}'`;
  return { row, column, expected, got, message: `${where}: expected ${expected}, got '${got}'` };
}

/**
 * Reads rows as they come (whole file or chunk after chunk), keeping every point and stopping at the
 * first bad row. Rows are counted from 1 in the file, the header included, blank lines included.
 */
export class SweepRowReader {
  readonly points: MappedSweepPoint[] = [];
  error: SweepCsvError | null = null;
  private rowNumber = 0;

  constructor(
    private readonly layout: Pick<SweepCsvLayout, "hasHeader" | "decimalComma" | "columns"> & Partial<Pick<SweepCsvLayout, "headerRow" | "firstDataRow">>,
    private readonly mapping: SweepColumnMapping,
  ) {}

  /** Feed the next rows; returns false once the file has been refused. */
  accept(rows: readonly string[][]): boolean {
    if (this.error) return false;
    const { frequencyColumn, amplitudeColumn } = this.mapping;
    const frequencyFactor = FREQUENCY_UNIT_FACTOR[this.mapping.frequencyUnit];
    const amplitudeFactor = AMPLITUDE_UNIT_FACTOR[this.mapping.amplitudeUnit];
    const needed = Math.max(frequencyColumn, amplitudeColumn) + 1;
    for (const raw of rows) {
      this.rowNumber += 1;
      const row = this.rowNumber === 1 ? raw.map((cell, i) => (i === 0 ? stripByteOrderMark(cell) : cell)) : raw;
      if (this.layout.firstDataRow === undefined) {
        if (this.rowNumber === 1 && this.layout.hasHeader) continue;
      } else if (this.rowNumber < this.layout.firstDataRow || this.rowNumber === this.layout.headerRow) {
        continue; // the header, and the comment or preamble lines above the readings
      }
      if (isBlankRow(row) || isCommentRow(row)) continue;
      if (row.length < needed) {
        this.error = describeCsvError(this.rowNumber, "", `at least ${needed} columns`, row.join(" | "));
        return false;
      }
      const frequencyCell = row[frequencyColumn] ?? "";
      const amplitudeCell = row[amplitudeColumn] ?? "";
      const frequency = readDecimal(frequencyCell, this.layout.decimalComma);
      if (frequency === null || frequency <= 0) {
        this.error = describeCsvError(this.rowNumber, this.columnName(frequencyColumn), frequency === null ? "a number" : "a frequency above 0", frequencyCell.trim());
        return false;
      }
      const amplitude = readDecimal(amplitudeCell, this.layout.decimalComma);
      if (amplitude === null || amplitude <= 0) {
        this.error = describeCsvError(this.rowNumber, this.columnName(amplitudeColumn), amplitude === null ? "a number" : "a reading above 0", amplitudeCell.trim());
        return false;
      }
      this.points.push({ row: this.rowNumber, frequencyHz: frequency * frequencyFactor, amplitudeV: amplitude * amplitudeFactor });
    }
    return true;
  }

  /** The verdict once every row has been fed. */
  finish(): SweepCsvResult {
    if (this.error) return { ok: false, error: this.error };
    if (this.points.length === 0) {
      // Only blank, comment or preamble lines below the header (or no header and nothing at all).
      const headerRow = this.layout.headerRow ?? (this.layout.hasHeader ? 1 : null);
      const message = headerRow !== null ? `Row ${headerRow}: no readings after the header` : `Row ${Math.max(1, this.rowNumber)}: the file is empty`;
      return { ok: false, error: { row: headerRow ?? this.rowNumber, column: "", expected: "at least 3 readings in the file", got: "nothing", message } };
    }
    if (this.points.length < 3) {
      return { ok: false, error: describeCsvError(this.rowNumber, "", "at least 3 readings in the file", `${this.points.length}`) };
    }
    return { ok: true, points: this.points };
  }

  columnName(index: number): string {
    return this.layout.columns[index] ?? `Column ${index + 1}`;
  }
}

/** Read a whole file held in memory (tests, small pastes). The browser streams instead (see the import page). */
export function readSweepCsv(text: string, layout: SweepCsvLayout, mapping: SweepColumnMapping): SweepCsvResult {
  const reader = new SweepRowReader(layout, mapping);
  const parsed = Papa.parse<string[]>(stripByteOrderMark(text), { delimiter: layout.delimiter, skipEmptyLines: false });
  // A trailing newline yields one empty row at the end; blank rows are skipped by the reader anyway.
  reader.accept(parsed.data);
  return reader.finish();
}

/**
 * Checks that need the sweep's settings: every reading below the source amplitude (a passive divider
 * cannot show more; same convention on both) and no frequency twice. Reported against the file's rows.
 */
export function checkSweepReadings(points: readonly MappedSweepPoint[], sourceAmplitudeV: number, names: { frequency: string; amplitude: string }): SweepCsvError | null {
  const seen = new Map<number, number>();
  for (const point of points) {
    if (point.amplitudeV >= sourceAmplitudeV) {
      return describeCsvError(point.row, names.amplitude, `a reading below the source amplitude of ${sourceAmplitudeV} V`, `${point.amplitudeV} V`);
    }
    const earlier = seen.get(point.frequencyHz);
    if (earlier !== undefined) {
      return describeCsvError(point.row, names.frequency, `a frequency not already read (row ${earlier} has it)`, `${point.frequencyHz} Hz`);
    }
    seen.set(point.frequencyHz, point.row);
  }
  return null;
}
