import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { FORCED_AIR_RESISTANCE_FACTOR, sinkResistanceForRun } from "./fan-cooling";

describe("sinkResistanceForRun", () => {
  it("keeps the sink's own rating when no fan is fitted", () => {
    expect(sinkResistanceForRun({ naturalKPerW: 1.2, fanFitted: false, withFanKPerW: 0.4 })).toMatchObject({ value: 1.2, estimated: false });
  });

  it("uses the fan part's recorded with-fan resistance", () => {
    expect(sinkResistanceForRun({ naturalKPerW: 1.2, fanFitted: true, withFanKPerW: 0.45 })).toMatchObject({ value: 0.45, estimated: false });
  });

  it("falls back to the common-practice factor, flagged as an estimate", () => {
    // common practice: forced air takes Rθsa to about a half to a third of its natural rating; the half is used.
    const r = sinkResistanceForRun({ naturalKPerW: 1.2, fanFitted: true, withFanKPerW: null });
    expect(FORCED_AIR_RESISTANCE_FACTOR).toBe(0.5);
    expect(r.value).toBeCloseTo(0.6, 12);
    expect(r.estimated).toBe(true);
    expect(r.source).toContain("common practice");
  });

  it("refuses a non-positive resistance, naming it", () => {
    expect(() => sinkResistanceForRun({ naturalKPerW: 1, fanFitted: true, withFanKPerW: 0 })).toThrow(/withFanKPerW/);
    expect(() => sinkResistanceForRun({ naturalKPerW: -1, fanFitted: false })).toThrow(CalcInputError);
  });
});
