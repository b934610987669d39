import { describe, expect, it } from "vitest";
import { assessCurrentMargin, deratedContinuousCurrent, estimateSwitchCurrents, supplyConductionFraction } from "./current-margin";

/** Average and RMS over one period T = 1 of a waveform on [0, 1), by the midpoint rule on a fine grid. */
function periodIntegrals(current: (t: number) => number, steps = 200_000): { average: number; rms: number } {
  let sum = 0;
  let sumSquares = 0;
  for (let k = 0; k < steps; k++) {
    const i = current((k + 0.5) / steps);
    sum += i;
    sumSquares += i * i;
  }
  return { average: sum / steps, rms: Math.sqrt(sumSquares / steps) };
}

describe("estimateSwitchCurrents", () => {
  it("gives a single switch a ramp: the peak and RMS match the exact integrals of a 0 → I_pk ramp over the on-time", () => {
    // exact integrals (file comment): ramp i(t) = I_pk·t/(D·T) for t < D·T, zero after
    for (const duty of [0.5, 0.3, 0.8]) {
      const c = estimateSwitchCurrents({ supplyCurrentA: 2.5, topology: "single_switch", dutyCycle: duty });
      expect(c.waveform).toBe("ramp");
      const ramp = periodIntegrals((t) => (t < duty ? (c.peakA * t) / duty : 0));
      expect(ramp.average).toBeCloseTo(2.5, 6); // the ramp carries the recorded average supply current
      expect(c.rmsA).toBeCloseTo(ramp.rms, 6);
      expect(c.averageA).toBeCloseTo(2.5, 12);
      // against a rectangle of the same average (height I_avg/D): peak 2×, RMS 2/√3 ≈ 1.155× (derived)
      const rectangle = periodIntegrals((t) => (t < duty ? 2.5 / duty : 0));
      expect(rectangle.average).toBeCloseTo(2.5, 6);
      expect(c.peakA / (2.5 / duty)).toBeCloseTo(2, 12);
      expect(c.rmsA / rectangle.rms).toBeCloseTo(2 / Math.sqrt(3), 5);
    }
  });

  it("assumes 50 % duty when none was recorded, and says so", () => {
    const c = estimateSwitchCurrents({ supplyCurrentA: 2.5, topology: "single_switch" });
    expect(c.dutyAssumed).toBe(true);
    expect(c.peakA).toBeCloseTo(10, 12); // 2·2.5/0.5
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
  it("checks a single switch's ramp against a 20 A peak / 12 A continuous switch and reports the tighter rating", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 2.5, topology: "single_switch", peakCurrentA: 20, continuousCurrentA: 12 });
    // ramp at D = 0.5 (derived): I_pk = 2·2.5/0.5 = 10 A (50 % of 20 A), I_rms = 10·√(0.5/3) = 4.08 A (34 % of 12 A)
    expect(m.status).toBe("ok");
    expect(m.formula).toBe("I_peak / I_peak,rating");
    expect(m.headroom).toBeCloseTo(0.5, 12);
    const names = m.inputs.map((i) => i.name);
    expect(names).toContain("I_peak,rating");
    expect(names).toContain("I_continuous,rating");
    expect(m.estimated).toBe(true);
    expect(m.notes.join(" ")).toMatch(/Duty not recorded/);
    expect(m.notes.join(" ")).toMatch(/not derated here/);
  });

  it("treats inferred currents as estimates even with a recorded duty", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 2, topology: "single_switch", dutyCycle: 0.25, peakCurrentA: 20, continuousCurrentA: 30 });
    // I_pk = 2·2/0.25 = 16 A: 80 % of 20 A (derived)
    expect(m.formula).toBe("I_peak / I_peak,rating");
    expect(m.headroom).toBeCloseTo(0.2, 12);
    expect(m.inputs.find((i) => i.name === "D")?.estimated).toBe(false);
    expect(m.inputs.find((i) => i.name === "I_peak")?.estimated).toBe(true);
    expect(m.estimated).toBe(true);
  });

  it("derates the continuous rating by the case temperature, linearly to zero at T_j,max", () => {
    // linear derating as for power (docs/references.md, "The switching transistor"): 12 A at 25 °C, T_j,max 150 °C,
    // case 100 °C → 12·(150 − 100)/(150 − 25) = 4.8 A
    expect(deratedContinuousCurrent({ continuousCurrentA: 12, caseTempC: 100, maxJunctionTempC: 150 })).toBeCloseTo(4.8, 12);
    expect(deratedContinuousCurrent({ continuousCurrentA: 12, caseTempC: 20, maxJunctionTempC: 150 })).toBe(12);
    expect(deratedContinuousCurrent({ continuousCurrentA: 12, caseTempC: 160, maxJunctionTempC: 150 })).toBe(0);
    expect(() => deratedContinuousCurrent({ continuousCurrentA: 12, caseTempC: 50, maxJunctionTempC: 20 })).toThrow(/maxJunctionTempC/);
    const m = assessCurrentMargin({
      supplyCurrentA: 2.5,
      topology: "single_switch",
      dutyCycle: 0.5,
      continuousCurrentA: 12,
      caseTempC: 100,
      maxJunctionTempC: 150,
    });
    // I_rms = 10·√(0.5/3) = 4.08 A against 4.8 A derated (derived)
    expect(m.formula).toBe("I_rms / I_continuous,derated");
    expect(m.headroom).toBeCloseTo(1 - (10 * Math.sqrt(0.5 / 3)) / 4.8, 12);
    expect(m.status).toBe("thin");
    expect(m.inputs.find((i) => i.name === "T_case")?.value).toBe(100);
    const hot = assessCurrentMargin({ supplyCurrentA: 1, topology: "single_switch", continuousCurrentA: 12, caseTempC: 150, maxJunctionTempC: 150 });
    expect(hot.status).toBe("exceeded");
    expect(JSON.stringify(hot)).not.toMatch(/NaN|Infinity|null/);
  });

  it("flags over-current as exceeded", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 6, topology: "single_switch", peakCurrentA: 20 });
    expect(m.status).toBe("exceeded"); // ramp: 2·6/0.5 = 24 A peak against 20 A
    expect(m.notes.join(" ")).toMatch(/Only the peak/);
  });

  it("is unknown with a note when no rating is recorded", () => {
    const m = assessCurrentMargin({ supplyCurrentA: 2, topology: "half_bridge", peakCurrentA: null, continuousCurrentA: null });
    expect(m.status).toBe("unknown");
    expect(m.notes.join(" ")).toMatch(/current rating is recorded/);
    expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
  });
});
