/** Fuzzing the heat-sink sample reader: any paste is read into increasing finite samples, or every bad row is named. */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { describeSampleError, parseHeatSinkSamples } from "./heat-sink-samples";

const cell = fc.oneof(fc.double().map(String), fc.integer({ min: -100, max: 10_000 }).map(String), fc.constantFrom("0:30", "1:02:03", "99:99", "30 s", "0.5 min", "2 h", "21 °C", "70°F", "300 K", "time", "temp", "", "-", "∞", "1e400"), fc.string({ maxLength: 6 }));
const pasted = fc
  .tuple(fc.constantFrom(",", ";", "\t", " ", ", "), fc.array(fc.array(cell, { maxLength: 4 }), { maxLength: 15 }), fc.constantFrom("\n", "\r\n", "\r"))
  .map(([delimiter, rows, newline]) => rows.map((r) => r.join(delimiter)).join(newline));
const bytes = fc.uint8Array({ maxLength: 300 }).map((b) => new TextDecoder("utf-8").decode(b));

describe("heat-sink samples under fuzzing", () => {
  it("never throws; samples are finite with increasing times; errors name a row and column", () => {
    fc.assert(
      fc.property(fc.oneof(pasted, fc.string(), bytes), (text) => {
        const result = parseHeatSinkSamples(text);
        if (result.ok) {
          let previous = -Infinity;
          for (const s of result.samples) {
            expect(Number.isFinite(s.elapsedS) && Number.isFinite(s.temperatureC)).toBe(true);
            expect(s.elapsedS).toBeGreaterThan(previous);
            previous = s.elapsedS;
          }
        } else {
          expect(result.errors.length).toBeGreaterThan(0);
          for (const error of result.errors) {
            expect(Number.isInteger(error.row) && error.row >= 1).toBe(true);
            expect(["time", "temperature", "row"]).toContain(error.column);
            expect(error.message.length).toBeGreaterThan(0);
            expect(describeSampleError(error)).toMatch(/^Row \d+/);
          }
        }
      }),
      { numRuns: 500 },
    );
  });
});
