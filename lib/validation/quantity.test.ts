import { describe, expect, it } from "vitest";
import { z } from "zod";
import { optionalQuantityField, quantityField } from "./quantity";

const schema = z.object({
  formDiameterM: quantityField({ label: "Form diameter", kind: "length", min: 0.005, max: 1, defaultUnit: "mm" }),
  runningFrequencyHz: optionalQuantityField({ label: "Running frequency", kind: "frequency", min: 1e3, max: 1e7 }),
});

describe("quantityField", () => {
  it("yields SI values from typed text and passes numbers through", () => {
    const ok = schema.parse({ formDiameterM: "3 in", runningFrequencyHz: "334k" });
    expect(ok.formDiameterM).toBeCloseTo(0.0762, 12);
    expect(ok.runningFrequencyHz).toBe(334_000);
    expect(schema.parse({ formDiameterM: 0.05, runningFrequencyHz: "" }).runningFrequencyHz).toBeUndefined();
    expect(schema.parse({ formDiameterM: "75" }).formDiameterM).toBeCloseTo(0.075, 12);
  });

  it("names the field and says what the entry was read as when out of range", () => {
    const r = schema.safeParse({ formDiameterM: "75 m" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["formDiameterM"]);
    expect(r.error?.issues[0]?.message).toBe("Form diameter must be between 5 mm and 1 m; “75 m” was read as 75 m.");
  });

  it("passes the parser's message through under the field", () => {
    const r = schema.safeParse({ formDiameterM: "wide" });
    expect(r.error?.issues[0]?.message).toMatch(/^Form diameter: Could not read “wide” as a length/);
  });
});
