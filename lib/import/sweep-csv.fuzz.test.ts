/**
 * Fuzzing the sweep CSV reader: any text, or any bytes decoded as the browser would, is either read
 * into finite positive readings or refused with the row (and column, when one cell is at fault).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { detectSweepCsvLayout, readSweepCsv, type SweepCsvResult } from "./sweep-csv";

const cell = fc.oneof(fc.double().map(String), fc.integer().map(String), fc.constantFrom("", "freq", "Hz", "1,5", "1.2e5", "-3", "0", "\"", "\"a,b\"", "NaN", "∞", " "), fc.string({ maxLength: 6 }));
const csvLike = fc
  .tuple(fc.constantFrom(",", ";", "\t", "|"), fc.array(fc.array(cell, { maxLength: 5 }), { maxLength: 12 }), fc.constantFrom("\n", "\r\n", "\r"), fc.boolean())
  .map(([delimiter, rows, newline, bom]) => (bom ? "\uFEFF" : "") + rows.map((r) => r.join(delimiter)).join(newline));
const bytes = fc.uint8Array({ maxLength: 300 }).map((b) => new TextDecoder("utf-8").decode(b));

function checkResult(result: SweepCsvResult) {
  if (result.ok) {
    expect(result.points.length).toBeGreaterThanOrEqual(3);
    for (const p of result.points) {
      expect(Number.isFinite(p.frequencyHz) && p.frequencyHz > 0).toBe(true);
      expect(Number.isFinite(p.amplitudeV) && p.amplitudeV > 0).toBe(true);
      expect(Number.isInteger(p.row) && p.row >= 1).toBe(true);
    }
  } else {
    const { error } = result;
    expect(Number.isInteger(error.row) && error.row >= 0).toBe(true);
    expect(typeof error.column).toBe("string");
    expect(error.message).toMatch(/row \d+/i);
    if (error.column !== "") expect(error.message).toContain(error.column);
    expect(error.expected.length).toBeGreaterThan(0);
  }
}

describe("sweep CSV under fuzzing", () => {
  it("detects a layout and reads or refuses any text, never throwing", () => {
    fc.assert(
      fc.property(fc.oneof(csvLike, fc.string(), bytes), (text) => {
        const layout = detectSweepCsvLayout(text);
        checkResult(readSweepCsv(text, layout, layout.suggested));
      }),
      { numRuns: 500 },
    );
  });

  it("refuses or reads with any column mapping, including columns the file does not have", () => {
    fc.assert(
      fc.property(csvLike, fc.nat(6), fc.nat(6), fc.constantFrom("Hz", "kHz", "MHz"), fc.constantFrom("V", "mV"), (text, f, a, frequencyUnit, amplitudeUnit) => {
        const layout = detectSweepCsvLayout(text);
        checkResult(readSweepCsv(text, layout, { frequencyColumn: f, amplitudeColumn: a, frequencyUnit, amplitudeUnit }));
      }),
      { numRuns: 300 },
    );
  });
});
