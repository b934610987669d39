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
    // common practice: 2.5 A average at 50 % duty → 5 A peak, well inside 20 A / 12 A.
    expect(m.current.status).toBe("ok");
    expect(m.thermal.kind).toBe("thermal");
    // The switch row's case-to-sink value is used when the path gives none.
    expect(m.thermal.inputs.find((i) => i.name === "Rθcs")).toMatchObject({ value: 0.4, estimated: false });
    // P = (52 − 22)/2 = 15 W; T_case = 52 + 15·0.4 = 58 °C; P_derated = 100·92/125 = 73.6 W (linear derating, Toshiba FAQ).
    expect(m.thermal.inputs.find((i) => i.name === "P_derated")?.value).toBeCloseTo(73.6, 9);
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
