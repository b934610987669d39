import { describe, expect, it } from "vitest";
import { assessCurrentMargin, estimateSwitchCurrents, supplyConductionFraction } from "./current-margin";

describe("estimateSwitchCurrents", () => {
  it("doubles the average supply current at 50 % duty on a single switch", () => {
    const c = estimateSwitchCurrents({ supplyCurrentA: 2.5, topology: "single_switch" });
    // common practice: at 50 % duty the peak switch current is about twice the average supply current (2.5 A → 5 A).
    expect(c.peakA).toBeCloseTo(5, 12);
    expect(c.dutyAssumed).toBe(true);
    // RMS of a rectangular pulse train of height 5 A at 50 % duty: 5·√0.5 (derived).
    expect(c.rmsA).toBeCloseTo(5 * Math.SQRT1_2, 12);
  });

  it("follows energy balance for two-switch topologies", () => {
    // Derived: push-pull and full bridge draw I_pk from the supply for 2·D of the period; at D = 0.5 each, I_pk = I_avg.
    expect(estimateSwitchCurrents({ supplyCurrentA: 3, topology: "push_pull" }).peakA).toBeCloseTo(3, 12);
    expect(estimateSwitchCurrents({ supplyCurrentA: 3, topology: "full_bridge" }).peakA).toBeCloseTo(3, 12);
    // Derived: a half bridge puts ±V/2 on the primary, so V·I_avg = (V/2)·I_pk and I_pk = 2·I_avg.
    expect(estimateSwitchCurrents({ supplyCurrentA: 3, topology: "half_bridge" }).peakA).toBeCloseTo(6, 12);
    // With dead time, D = 0.45 per switch: push-pull peak 3/(0.9) (derived).
    expect(estimateSwitchCurrents({ supplyCurrentA: 3, topology: "push_pull", dutyCycle: 0.45 }).peakA).toBeCloseTo(3 / 0.9, 12);
  });

  it("refuses a per-switch duty a two-switch topology cannot have", () => {
    expect(() => supplyConductionFraction("push_pull", 0.6)).toThrow(/^dutyCycle/);
    expect(() => supplyConductionFraction("single_switch", 0)).toThrow(/^dutyCycle/);
    expect(() => estimateSwitchCurrents({ supplyCurrentA: -1, topology: "single_switch" })).toThrow(/^supplyCurrentA/);
  });
});

describe("assessCurrentMargin", () => {
  it("puts 2.5 A average well inside a 20 A peak / 12 A continuous switch and reports the tighter rating", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 2.5, topology: "single_switch", peakCurrentA: 20, continuousCurrentA: 12 });
    // common practice: 2.5 A average → 5 A peak, well inside 20 A peak / 12 A continuous.
    expect(m.status).toBe("ok");
    // Peak check 5/20 = 25 % used; RMS check 3.54/12 = 29 % used: the continuous one is tighter (by hand).
    expect(m.formula).toBe("I_rms / I_continuous,rating");
    expect(m.headroom).toBeCloseTo(1 - (5 * Math.SQRT1_2) / 12, 12);
    const names = m.inputs.map((i) => i.name);
    expect(names).toContain("I_peak,rating");
    expect(names).toContain("I_continuous,rating");
    expect(m.estimated).toBe(true); // duty was assumed
    expect(m.notes.join(" ")).toMatch(/Duty not recorded/);
  });

  it("uses the peak rating when that is the tighter one, and a recorded duty is not an estimate", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 4, topology: "single_switch", dutyCycle: 0.25, peakCurrentA: 20, continuousCurrentA: 30 });
    // I_pk = 4/0.25 = 16 A (80 % of 20 A), I_rms = 16·0.5 = 8 A (27 % of 30 A): the peak check is tighter (by hand).
    expect(m.formula).toBe("I_peak / I_peak,rating");
    expect(m.headroom).toBeCloseTo(0.2, 12);
    expect(m.status).toBe("ok");
    expect(m.estimated).toBe(false);
  });

  it("flags over-current as exceeded", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 12, topology: "single_switch", peakCurrentA: 20 });
    expect(m.status).toBe("exceeded"); // 24 A peak against 20 A
    expect(m.notes.join(" ")).toMatch(/Only the peak/);
  });

  it("is unknown with a note when no rating is recorded", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 2, topology: "half_bridge", peakCurrentA: null, continuousCurrentA: null });
    expect(m.status).toBe("unknown");
    expect(m.notes.join(" ")).toMatch(/current rating is recorded/);
    expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
  });
});
