import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { assessVoltageMargin, estimatePeakSwitchVoltage } from "./voltage-margin";

describe("estimatePeakSwitchVoltage", () => {
  it("puts an unclamped single switch at about five times its supply", () => {
    const e = estimatePeakSwitchVoltage({ supplyVoltageV: 24, topology: "single_switch" });
    // common practice: an unclamped single-transistor driver's collector rings to about five times its supply
    // (about 130 V from 24 V).
    expect(e.peakVoltageV / 24).toBeCloseTo(5, 12);
    expect(e.peakVoltageV).toBeGreaterThan(110);
    expect(e.peakVoltageV).toBeLessThan(140);
  });

  it("keeps a clamped single switch under three times the supply (about 80 V from 30 V)", () => {
    const e = estimatePeakSwitchVoltage({ supplyVoltageV: 30, topology: "single_switch", clamped: true });
    // common practice: a diode clamp into a capacitor bled by a resistor to the supply brought 30 V to about 80 V.
    expect(e.peakVoltageV).toBeLessThan(3 * 30);
    expect(e.peakVoltageV).toBeGreaterThan(75);
    expect(e.peakVoltageV).toBeLessThan(85);
  });

  it("gives push-pull twice the supply plus ringing, and a bridge leg the supply plus a little", () => {
    const pp = estimatePeakSwitchVoltage({ supplyVoltageV: 40, topology: "push_pull" });
    // common practice: the off switch of a centre-tapped push-pull sees 2× the supply plus leakage ringing.
    expect(pp.peakVoltageV).toBeGreaterThan(2 * 40);
    expect(pp.peakVoltageV).toBeLessThan(3 * 40);
    for (const topology of ["half_bridge", "full_bridge"] as const) {
      const b = estimatePeakSwitchVoltage({ supplyVoltageV: 160, topology });
      // common practice: a bridge leg blocks the rail plus a small overshoot.
      expect(b.peakVoltageV).toBeGreaterThan(160);
      expect(b.peakVoltageV).toBeLessThanOrEqual(1.25 * 160);
    }
  });

  it("accepts a bench's own factor and refuses nonsense ones", () => {
    expect(estimatePeakSwitchVoltage({ supplyVoltageV: 20, topology: "single_switch", factors: { singleSwitchUnclamped: 4 } }).peakVoltageV).toBe(80);
    expect(() => estimatePeakSwitchVoltage({ supplyVoltageV: 20, topology: "push_pull", factors: { pushPull: 0.5 } })).toThrow(/factors\.pushPull/);
    expect(() => estimatePeakSwitchVoltage({ supplyVoltageV: 0, topology: "push_pull" })).toThrow(CalcInputError);
  });
});

describe("assessVoltageMargin", () => {
  it("calls 130 V measured on a 140 V switch far too little headroom", () => {
    const m = assessVoltageMargin({ voltageRatingV: 140, peakSwitchVoltageV: 130, supplyVoltageV: 24, topology: "single_switch" });
    // common practice: about 130 V from 24 V against a 140 V rating is far too little headroom.
    // Renesas 80 % guidance: 130/140 = 93 % of the rating, so headroom 10/140 ≈ 0.071 is below 0.2.
    expect(m.status).toBe("thin");
    expect(m.headroom).toBeCloseTo(10 / 140, 12);
    expect(m.estimated).toBe(false);
    expect(m.formula).toBe("V_peak / V_rating");
    expect(m.inputs.map((i) => i.name)).toEqual(["V_peak", "V_rating"]);
  });

  it("estimates an unmeasured peak, says so, and still flags the 140 V switch on 24 V", () => {
    const m = assessVoltageMargin({ voltageRatingV: 140, supplyVoltageV: 24, topology: "single_switch" });
    expect(m.estimated).toBe(true);
    expect(m.inputs.find((i) => i.name === "V_peak")?.estimated).toBe(true);
    expect(m.notes.join(" ")).toMatch(/not measured.*estimated/i);
    // common practice: ≈ 5 × 24 V = 120 V against 140 V, 86 % of the rating: above Renesas' 80 %.
    expect(m.status).toBe("thin");
  });

  it("gives the clamped driver at 30 V comfortable headroom on a 140 V switch", () => {
    const m = assessVoltageMargin({ voltageRatingV: 140, supplyVoltageV: 30, topology: "single_switch", clamped: true });
    // common practice: about 80 V from 30 V with the clamp, 57 % of 140 V, inside Renesas' 80 %.
    expect(m.status).toBe("ok");
    expect(m.value!).toBeLessThan(0.8 * 140);
  });

  it("reports over-voltage as exceeded with a negative headroom", () => {
    const m = assessVoltageMargin({ voltageRatingV: 100, peakSwitchVoltageV: 125, supplyVoltageV: 24, topology: "single_switch" });
    expect(m.status).toBe("exceeded");
    expect(m.headroom).toBeCloseTo(-0.25, 12); // 1 − 125/100 by hand
  });

  it("uses the caller's thin threshold", () => {
    const m = assessVoltageMargin({ voltageRatingV: 140, peakSwitchVoltageV: 130, supplyVoltageV: 24, topology: "single_switch", thinBelowHeadroom: 0.05 });
    expect(m.status).toBe("ok");
  });

  it("returns unknown, not NaN, when the rating is missing, and says what to add", () => {
    const m = assessVoltageMargin({ voltageRatingV: null, peakSwitchVoltageV: null, supplyVoltageV: 24, topology: "single_switch" });
    expect(m.status).toBe("unknown");
    expect(m.headroom).toBeNull();
    expect(m.notes.join(" ")).toMatch(/voltage rating/);
    expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
  });

  it("warns when a measured peak is below the supply (probe attenuation)", () => {
    const m = assessVoltageMargin({ voltageRatingV: 140, peakSwitchVoltageV: 13, supplyVoltageV: 24, topology: "single_switch" });
    expect(m.notes.join(" ")).toMatch(/probe/);
  });

  it("names the bad field", () => {
    expect(() => assessVoltageMargin({ voltageRatingV: -140, supplyVoltageV: 24, topology: "single_switch" })).toThrow(/^voltageRatingV/);
    expect(() => assessVoltageMargin({ voltageRatingV: 140, peakSwitchVoltageV: Number.NaN, supplyVoltageV: 24, topology: "single_switch" })).toThrow(
      /^peakSwitchVoltageV/,
    );
  });
});

describe("assessVoltageMargin with a recorded clamp voltage", () => {
  it("takes a clamped single switch's peak as the clamp voltage: 24 V supply, 150 V clamp, 200 V part → 25 % headroom", () => {
    // project requirement (issue 15's worked example, not an outside source): 1 − 150/200 = 0.25, where the
    // 2.7 × supply rule read 1 − 64.8/200 = 0.676
    const m = assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 24, topology: "single_switch", clamped: true, clampVoltageV: 150 });
    expect(m.headroom).toBeCloseTo(0.25, 12);
    expect(m.inputs.find((i) => i.name === "V_peak")?.value).toBe(150);
    expect(m.estimated).toBe(false);
    expect(m.notes.join(" ")).toMatch(/nothing added for the clamp's own overshoot/);
    const old = assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 24, topology: "single_switch", clamped: true });
    expect(old.headroom).toBeCloseTo(1 - (2.7 * 24) / 200, 12);
  });

  it("keeps the supply multiple, marked an estimate, when the clamp's voltage is not recorded, and says so", () => {
    const m = assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 24, topology: "single_switch", clamped: true, clampVoltageV: null });
    expect(m.estimated).toBe(true);
    expect(m.inputs[0]?.value).toBeCloseTo(2.7 * 24, 12);
    expect(m.notes.join(" ")).toMatch(/clamp is fitted but its voltage is not recorded/);
  });

  it("leaves an unclamped switch on the supply multiple, ignoring a stray clamp voltage", () => {
    const m = assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 24, topology: "single_switch", clamped: false, clampVoltageV: 150 });
    expect(m.inputs[0]?.value).toBeCloseTo(5 * 24, 12);
    expect(m.estimated).toBe(true);
  });

  it("prefers a measured peak and notes overshoot beyond the clamp", () => {
    const m = assessVoltageMargin({ voltageRatingV: 200, peakSwitchVoltageV: 170, supplyVoltageV: 24, topology: "single_switch", clamped: true, clampVoltageV: 150 });
    expect(m.headroom).toBeCloseTo(1 - 170 / 200, 12);
    expect(m.notes.join(" ")).toMatch(/overshoots the clamp/);
  });

  it("flags a clamp voltage at or below the supply and refuses a non-positive one", () => {
    const m = assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 48, topology: "single_switch", clamped: true, clampVoltageV: 40 });
    expect(m.notes.join(" ")).toMatch(/not above the supply/);
    expect(() => assessVoltageMargin({ voltageRatingV: 200, supplyVoltageV: 24, topology: "single_switch", clamped: true, clampVoltageV: -5 })).toThrow(/clampVoltageV/);
  });
});
