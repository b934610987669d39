/** Fuzzing the quantity parser: whatever is typed, it answers ok with a finite value, or a message. */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseQuantity, quantityUnit, type QuantityKind } from "./parse";

const KINDS: QuantityKind[] = ["frequency", "capacitance", "inductance", "resistance", "voltage", "current", "power", "length", "wireDiameter", "time", "temperature", "thermalResistance", "mass", "count"];

/** Text that looks like engineering input: numbers, exponents, prefixes, units, signs and junk around them. */
const engineeringText = fc
  .array(
    fc.oneof(
      fc.double({ noNaN: false }).map(String),
      fc.integer().map(String),
      fc.constantFrom("k", "M", "G", "m", "u", "µ", "n", "p", "e", "E", "e-", "e+308", "Hz", "F", "H", "Ω", "ohm", "V", "A", "W", "s", "min", "h", "°C", "°F", "K/W", "in", "mm", "AWG", "AWG ", " ", ",", ".", "-", "+", "/", "½", "∞", "Infinity", "NaN", "0x1F", "1e999", "\u0000", "\u202e"),
      fc.string({ maxLength: 4 }),
    ),
    { maxLength: 8 },
  )
  .map((parts) => parts.join(""));

describe("parseQuantity under fuzzing", () => {
  it.each(KINDS)("%s: never throws; ok means a finite value and a unit, refusal means a message", (kind) => {
    fc.assert(
      fc.property(fc.oneof(engineeringText, fc.string(), fc.string({ maxLength: 20, unit: "grapheme" })), // A default unit the code itself passes (an unknown one is a programming error and throws by design).
        fc.option(fc.constant(quantityUnit(kind) || undefined), { nil: undefined }), (text, unit) => {
        const result = parseQuantity(text, kind, unit);
        if (result.ok) {
          expect(Number.isFinite(result.value)).toBe(true);
          expect(typeof result.unit).toBe("string");
        } else {
          expect(result.message.trim().length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 400 },
    );
  });
});
