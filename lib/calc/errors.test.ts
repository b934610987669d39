import { describe, expect, it } from "vitest";
import { CalcInputError, requireInRange, requirePositive } from "./errors";

describe("input guards", () => {
  it("name the offending field and what was expected", () => {
    expect(() => requirePositive("diameter", -1)).toThrowError(CalcInputError);
    try {
      requirePositive("diameter", Number.NaN);
    } catch (error) {
      expect(error).toBeInstanceOf(CalcInputError);
      expect((error as CalcInputError).field).toBe("diameter");
      expect((error as Error).message).toMatch(/^diameter: expected a finite number greater than 0/);
    }
  });
  it("pass valid values through", () => {
    expect(requirePositive("x", 2)).toBe(2);
    expect(requireInRange("d", 0.5, 0, 1)).toBe(0.5);
    expect(() => requireInRange("d", 1.5, 0, 1)).toThrow(/d: expected a number from 0 to 1/);
  });
});
