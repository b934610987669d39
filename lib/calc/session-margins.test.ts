import { describe, expect, it } from "vitest";
import { sessionMargins } from "./session-margins";

describe("sessionMargins", () => {
  // A stored session row and component rows as the database returns them: null for "not recorded".
  const session = {
    topology: "single_switch" as const,
    supplyVoltageV: 24,
    supplyCurrentA: 2.5,
    ambientTempC: 22,
    heatSinkEndC: 52,
    peakSwitchVoltageV: 130,
    dutyCycle: null,
  };
  const switchRow = {
    voltageRatingV: 140,
    continuousCurrentA: 12,
    peakCurrentA: 20,
    powerRating25CW: 100,
    maxJunctionTempC: 150,
    thermalResistanceJcKPerW: null,
    caseToSinkKPerW: 0.4,
  };

  it("returns all three margins from stored rows", () => {
    const m = sessionMargins(session, switchRow, { sinkThermalResistanceKPerW: 2 });
    expect(m.voltage.kind).toBe("voltage");
    // common practice: 130 V from 24 V against 140 V is far too little headroom.
    expect(m.voltage.status).toBe("thin");
    // derived (current-margin.ts): a single switch's ramp at 50 % duty peaks at 2·2.5/0.5 = 10 A, inside 20 A / 12 A.
    expect(m.current.status).toBe("ok");
    expect(m.thermal.kind).toBe("thermal");
    // The switch row's case-to-sink value is used when the path gives none.
    expect(m.thermal.inputs.find((i) => i.name === "Rθcs")).toMatchObject({ value: 0.4, estimated: false });
    // P = (52 − 22)/2 = 15 W; T_case = 52 + 15·0.4 = 58 °C; P_derated = 100·92/125 = 73.6 W (linear derating, Toshiba FAQ).
    expect(m.thermal.inputs.find((i) => i.name === "P_derated")?.value).toBeCloseTo(73.6, 9);
  });

  it("derates the continuous current rating at the case temperature the thermal chain works out", () => {
    const m = sessionMargins(session, switchRow, { sinkThermalResistanceKPerW: 2 });
    // T_case = 58 °C (above); linear derating as for power (docs/references.md): 12·(150 − 58)/(150 − 25) = 8.832 A
    expect(m.current.inputs.find((i) => i.name === "T_case")?.value).toBeCloseTo(58, 9);
    expect(m.current.inputs.find((i) => i.name === "I_continuous,derated")?.value).toBeCloseTo(8.832, 9);
  });

  it("takes a clamped single switch's unmeasured peak from the clamp's recorded voltage", () => {
    const clamped = { ...session, peakSwitchVoltageV: null, voltageClamp: true, voltageClampV: 150 };
    const m = sessionMargins(clamped, { ...switchRow, voltageRatingV: 200 }, { sinkThermalResistanceKPerW: 2 });
    // project requirement (issue 15's worked example): 24 V supply, 150 V clamp, 200 V part → 25 % headroom
    expect(m.voltage.headroom).toBeCloseTo(0.25, 12);
  });

  it("applies the caller's thresholds", () => {
    const m = sessionMargins(session, switchRow, { sinkThermalResistanceKPerW: 2 }, { thresholds: { voltage: 0.05 } });
    expect(m.voltage.status).toBe("ok");
  });

  it("reports unknown margins with notes when the switch has no ratings", () => {
    const m = sessionMargins(session, {}, {});
    expect([m.voltage.status, m.current.status, m.thermal.status]).toEqual(["unknown", "unknown", "unknown"]);
    for (const margin of Object.values(m)) expect(margin.notes.length).toBeGreaterThan(0);
    expect(JSON.stringify(m)).not.toMatch(/NaN|Infinity/);
  });
});
