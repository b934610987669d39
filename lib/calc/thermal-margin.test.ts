import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { assessThermalMargin, inferSinkDissipation, THERMAL_INPUT_NAMES } from "./thermal-margin";

const inputValue = (m: { inputs: { name: string; value: number }[] }, name: string) => m.inputs.find((i) => i.name === name)?.value;

describe("inferSinkDissipation", () => {
  it("reads the heat through a sink from its rise over ambient", () => {
    // Thermal chain (docs/references.md), sink stage: (55 − 25) K / 1.5 K/W = 20 W.
    expect(inferSinkDissipation({ sinkTempC: 55, ambientTempC: 25, sinkToAmbientKPerW: 1.5 })).toBeCloseTo(20, 12);
    expect(inferSinkDissipation({ sinkTempC: 24, ambientTempC: 25, sinkToAmbientKPerW: 1.5 })).toBe(0);
    expect(() => inferSinkDissipation({ sinkTempC: 40, ambientTempC: 25, sinkToAmbientKPerW: 0 })).toThrow(/^sinkToAmbientKPerW/);
  });
});

describe("assessThermalMargin", () => {
  // A 280 W / 150 °C / 0.45 K/W TO-247 MOSFET (IRFP460 figures, from memory) on a 1.5 K/W sink, greased at 0.5 K/W.
  const device = { ratedPowerW: 280, maxJunctionTempC: 150, junctionToCaseKPerW: 0.45, caseToSinkKPerW: 0.5, sinkToAmbientKPerW: 1.5 };

  it("infers dissipation from the sink, computes case and junction temperatures and reports the tighter criterion", () => {
    const m = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 55 });
    // By hand from the thermal chain (docs/references.md): P = 30/1.5 = 20 W; T_case = 55 + 20·0.5 = 65 °C;
    // T_j = 55 + 20·(0.45 + 0.5) = 74 °C; linear derating (Toshiba FAQ): P_derated = 280·(150 − 65)/125 = 190.4 W.
    expect(inputValue(m, "P")).toBeCloseTo(20, 12);
    expect(inputValue(m, THERMAL_INPUT_NAMES.caseTemp)).toBeCloseTo(65, 12);
    expect(inputValue(m, THERMAL_INPUT_NAMES.junctionTemp)).toBeCloseTo(74, 12);
    expect(inputValue(m, THERMAL_INPUT_NAMES.deratedPower)).toBeCloseTo(190.4, 9);
    // Power check 20/190.4 = 10.5 % used; junction rise 49/125 = 39.2 % used: the junction is tighter.
    expect(m.formula).toBe("(T_j − T_ambient) / (T_j,max − T_ambient)");
    expect(m.headroom).toBeCloseTo(1 - 49 / 125, 12);
    expect(m.status).toBe("ok");
    expect(m.estimated).toBe(true); // dissipation inferred
    expect(m.notes.join(" ")).toMatch(/steady state/);
  });

  it("makes the two criteria agree exactly when Rθjc comes from the rating (derived identity)", () => {
    // With Rθjc = (Tj,max − 25)/P25, 1 − P/P_derated(Tc) = (Tj,max − Tj)/(Tj,max − Tc) for Tc above 25 °C
    // (derived from the linear derating; below 25 °C the rating is flat and the identity does not apply).
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 400, noNaN: true }),
        fc.double({ min: 125, max: 200, noNaN: true }),
        fc.double({ min: 25, max: 40, noNaN: true }),
        fc.double({ min: 1, max: 40, noNaN: true }),
        (ratedPowerW, maxJunctionTempC, ambientTempC, riseK) => {
          const m = assessThermalMargin({ ratedPowerW, maxJunctionTempC, ambientTempC, heatSinkEndC: ambientTempC + riseK, sinkToAmbientKPerW: 2, caseToSinkKPerW: 0.3 });
          const tj = inputValue(m, THERMAL_INPUT_NAMES.junctionTemp)!;
          const tc = inputValue(m, THERMAL_INPUT_NAMES.caseTemp)!;
          const p = inputValue(m, "P")!;
          const pd = inputValue(m, THERMAL_INPUT_NAMES.deratedPower)!;
          expect(1 - p / pd).toBeCloseTo((maxJunctionTempC - tj) / (maxJunctionTempC - tc), 7);
          // Both share the numerator T_j,max − T_j over a positive denominator, so they agree on "exceeded", and the
          // reported headroom is the smaller of the two (derived).
          const junctionRise = (maxJunctionTempC - tj) / (maxJunctionTempC - ambientTempC);
          expect(junctionRise * (1 - p / pd)).toBeGreaterThanOrEqual(-1e-12);
          expect(m.headroom!).toBeCloseTo(Math.min(junctionRise, 1 - p / pd), 9);
          expect(m.inputs.find((i) => i.name === "Rθjc")?.estimated).toBe(true);
        },
      ),
    );
  });

  it("flags a small device on a hot sink as exceeded", () => {
    // 50 W / 150 °C TO-220 with 30 W into a sink at 110 °C: T_case = 110 + 30·0.5 = 125 °C,
    // P_derated = 50·25/125 = 10 W by the linear derating (Toshiba FAQ): 30 W is three times that.
    const m = assessThermalMargin({ ambientTempC: 25, heatSinkEndC: 110, dissipationW: 30, caseToSinkKPerW: 0.5, ratedPowerW: 50, maxJunctionTempC: 150 });
    expect(m.status).toBe("exceeded");
    expect(m.estimated).toBe(true); // Rθjc derived from the rating
  });

  it("uses a fitted steady-state sink temperature instead of the end temperature", () => {
    const m = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 45, sinkSteadyStateC: 70 });
    expect(inputValue(m, "P")).toBeCloseTo(30, 12); // (70 − 25)/1.5 by hand
    expect(m.notes.join(" ")).toMatch(/fitted steady-state sink temperature \(70 °C\) instead of the end temperature \(45 °C\)/);
  });

  it("computes the sink temperature from an entered dissipation when none was recorded", () => {
    const m = assessThermalMargin({ ...device, ambientTempC: 20, dissipationW: 10 });
    expect(inputValue(m, THERMAL_INPUT_NAMES.sinkTemp)).toBeCloseTo(35, 12); // 20 + 10·1.5
    expect(m.inputs.find((i) => i.name === THERMAL_INPUT_NAMES.sinkTemp)?.estimated).toBe(true);
  });

  it("shares a sink's heat among the switches on it", () => {
    const m = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 55, switchesOnSink: 2 });
    expect(inputValue(m, "P_switch")).toBeCloseTo(10, 12);
    expect(inputValue(m, THERMAL_INPUT_NAMES.junctionTemp)).toBeCloseTo(55 + 10 * 0.95, 12);
  });

  it("assumes a typical case-to-sink resistance when none is recorded, and says so", () => {
    const { caseToSinkKPerW: _unused, ...rest } = device;
    const m = assessThermalMargin({ ...rest, ambientTempC: 25, heatSinkEndC: 55 });
    expect(m.inputs.find((i) => i.name === "Rθcs")?.estimated).toBe(true);
    expect(m.notes.join(" ")).toMatch(/Case-to-sink resistance not recorded/);
  });

  it("takes a sink below ambient as no dissipation and says to check the readings", () => {
    const m = assessThermalMargin({ ...device, ambientTempC: 25, heatSinkEndC: 23 });
    expect(inputValue(m, "P")).toBe(0);
    expect(m.notes.join(" ")).toMatch(/below ambient/);
  });

  it("returns unknown with what is missing, never NaN", () => {
    const noSink = assessThermalMargin({ ...device, ambientTempC: 25, sinkToAmbientKPerW: null });
    expect(noSink.status).toBe("unknown");
    expect(noSink.notes.join(" ")).toMatch(/Dissipation unknown/);
    const noTj = assessThermalMargin({ ambientTempC: 25, heatSinkEndC: 50, sinkToAmbientKPerW: 1 });
    expect(noTj.status).toBe("unknown");
    expect(noTj.notes.join(" ")).toMatch(/maximum junction temperature/);
    const noRjc = assessThermalMargin({ ambientTempC: 25, heatSinkEndC: 50, sinkToAmbientKPerW: 1, maxJunctionTempC: 150 });
    expect(noRjc.status).toBe("unknown");
    expect(noRjc.notes.join(" ")).toMatch(/Junction-to-case resistance unknown/);
    for (const m of [noSink, noTj, noRjc]) expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
  });

  it("names bad fields", () => {
    expect(() => assessThermalMargin({ ambientTempC: 25, maxJunctionTempC: 20 })).toThrow(/^maxJunctionTempC/);
    expect(() => assessThermalMargin({ ambientTempC: 25, switchesOnSink: 1.5 })).toThrow(/^switchesOnSink/);
    expect(() => assessThermalMargin({ ambientTempC: 25, dissipationW: -3 })).toThrow(/^dissipationW/);
  });
});
