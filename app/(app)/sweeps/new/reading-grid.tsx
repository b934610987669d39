"use client";

/**
 * A keyboard-first grid of readings: Enter moves to the next cell (and on to a new row), arrow keys
 * move up/down (and left/right at the edge of the text), Tab works as usual, a new empty row appears
 * as soon as the last one is typed in, and pasting two tab-, comma- or semicolon-separated columns
 * fills rows from the cell pasted into. Each cell is read as typed ("321k", "1.5 mV") and shows its
 * own error.
 */
import { useRef } from "react";
import { keypadFor, parseQuantity } from "@/lib/units/parse";

export interface ReadingRow {
  frequency: string;
  amplitude: string;
}

export const COLUMNS = [
  { key: "frequency", label: "Frequency", kind: "frequency", hint: "e.g. 321k or 321 kHz" },
  { key: "amplitude", label: "Amplitude", kind: "voltage", hint: "e.g. 1.5 V or 150 mV" },
] as const;

export function isBlankReading(row: ReadingRow): boolean {
  return row.frequency.trim() === "" && row.amplitude.trim() === "";
}

/** The browser's own reading of a cell, so errors show before anything is sent. */
export function checkCell(value: string, column: (typeof COLUMNS)[number]): string | null {
  if (value.trim() === "") return `${column.label}: enter a value.`;
  const parsed = parseQuantity(value, column.kind);
  return parsed.ok ? null : `${column.label}: ${parsed.message}`;
}

/** Rows of a pasted block: lines split on tab, else semicolon, else comma. */
export function splitPastedBlock(text: string): string[][] {
  const lines = text.replace(/\r\n?/g, "\n").split("\n").filter((line) => line.trim() !== "");
  const separator = lines.some((l) => l.includes("\t")) ? "\t" : lines.some((l) => l.includes(";")) ? ";" : ",";
  return lines.map((line) => line.split(separator).map((cell) => cell.trim()));
}

function withTrailingBlank(rows: ReadingRow[]): ReadingRow[] {
  const last = rows.at(-1);
  return !last || !isBlankReading(last) ? [...rows, { frequency: "", amplitude: "" }] : rows;
}

export function ReadingGrid({
  rows,
  onChange,
  errors,
  touched,
  onTouch,
}: {
  rows: ReadingRow[];
  onChange: (rows: ReadingRow[]) => void;
  /** Messages keyed "points.<row>.<column>" (server) merged with the browser's own checks. */
  errors: Record<string, string | undefined>;
  touched: ReadonlySet<string>;
  onTouch: (key: string) => void;
}) {
  const table = useRef<HTMLTableElement>(null);

  const focusCell = (row: number, col: number) => {
    // The row may only exist after the next render.
    requestAnimationFrame(() => table.current?.querySelector<HTMLInputElement>(`input[data-row="${row}"][data-col="${col}"]`)?.focus());
  };

  const setCell = (row: number, col: number, value: string) => {
    const next = rows.map((r, i) => (i === row ? { ...r, [COLUMNS[col]!.key]: value } : r));
    onChange(withTrailingBlank(next));
  };

  const onKeyDown = (event: React.KeyboardEvent<HTMLInputElement>, row: number, col: number) => {
    const input = event.currentTarget;
    const atStart = input.selectionStart === 0 && input.selectionEnd === 0;
    const atEnd = input.selectionStart === input.value.length;
    if (event.key === "Enter") {
      event.preventDefault();
      if (col === 0) focusCell(row, 1);
      else {
        if (row + 1 >= rows.length) onChange([...rows, { frequency: "", amplitude: "" }]);
        focusCell(row + 1, 0);
      }
    } else if (event.key === "ArrowDown") {
      event.preventDefault();
      if (row + 1 >= rows.length) onChange([...rows, { frequency: "", amplitude: "" }]);
      focusCell(row + 1, col);
    } else if (event.key === "ArrowUp" && row > 0) {
      event.preventDefault();
      focusCell(row - 1, col);
    } else if (event.key === "ArrowRight" && col === 0 && atEnd) {
      event.preventDefault();
      focusCell(row, 1);
    } else if (event.key === "ArrowLeft" && col === 1 && atStart) {
      event.preventDefault();
      focusCell(row, 0);
    }
  };

  const onPaste = (event: React.ClipboardEvent<HTMLInputElement>, row: number, col: number) => {
    const text = event.clipboardData.getData("text/plain");
    if (!/[\n\t,;]/.test(text.trim())) return; // a single value: let the browser paste it
    event.preventDefault();
    const block = splitPastedBlock(text);
    const next = [...rows];
    block.forEach((cells, i) => {
      const target = row + i;
      const current = next[target] ?? { frequency: "", amplitude: "" };
      // Two or more columns fill frequency and amplitude; one column fills the column pasted into.
      next[target] = cells.length >= 2 ? { frequency: cells[0]!, amplitude: cells[1]! } : { ...current, [COLUMNS[col]!.key]: cells[0] ?? "" };
    });
    onChange(withTrailingBlank(next));
    focusCell(Math.min(row + block.length, next.length), 0);
  };

  return (
    <div className="table-wrap">
      {/* Fixed layout with narrow cells, so two columns fit a phone-width screen. */}
      <table ref={table} className="reading-grid keep-grid" style={{ tableLayout: "fixed", width: "100%" }}>
        <caption>
          Readings ({rows.filter((r) => !isBlankReading(r)).length}) — Enter or arrow keys move between cells; paste two columns to fill rows
        </caption>
        <colgroup>
          <col style={{ width: "3rem" }} />
          <col />
          <col />
        </colgroup>
        <thead>
          <tr>
            <th scope="col">#</th>
            {COLUMNS.map((c) => (
              <th scope="col" key={c.key}>
                {c.label} <span className="muted hint">({c.hint})</span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r, row) => (
            <tr key={row}>
              <th scope="row">{row + 1}</th>
              {COLUMNS.map((column, col) => {
                const key = `points.${row}.${column.key}`;
                const message = errors[key];
                const value = r[column.key];
                const shown = message ?? (touched.has(key) && value.trim() !== "" ? (checkCell(value, column) ?? undefined) : undefined);
                return (
                  <td key={column.key}>
                    <input
                      data-row={row}
                      data-col={col}
                      value={value}
                      inputMode={keypadFor(column.kind)}
                      autoComplete="off"
                      style={{ minWidth: 0 }}
                      aria-label={`${column.label}, row ${row + 1}`}
                      aria-invalid={Boolean(shown)}
                      aria-describedby={`${key}-error`}
                      onChange={(e) => setCell(row, col, e.target.value)}
                      onKeyDown={(e) => onKeyDown(e, row, col)}
                      onPaste={(e) => onPaste(e, row, col)}
                      onBlur={() => onTouch(key)}
                    />
                    <span id={`${key}-error`} className="error">
                      {shown ?? ""}
                    </span>
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
