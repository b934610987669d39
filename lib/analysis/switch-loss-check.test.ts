import { describe, expect, it } from "vitest";
import { checkSwitchLosses } from "./switch-loss-check";
import type { ComponentRecord, SessionRecord } from "./records";

const installedAt = new Date("2026-01-01T00:00:00Z");
const mosfet: ComponentRecord = { id: "sw", kind: "switch", partNumber: "Q1", installedAt, removedAt: null, switchType: "mosfet" };
const sink: ComponentRecord = { id: "hs", kind: "heat_sink", partNumber: "HS1", installedAt, removedAt: null, sinkThermalResistanceKPerW: 2 };
const session: SessionRecord = {
  id: "s1",
  startedAt: new Date("2026-02-01T00:00:00Z"),
  supplyVoltageV: 24,
  supplyCurrentA: 2.5,
  durationS: 600,
  ambientTempC: 22,
  heatSinkStartC: 22,
  heatSinkEndC: 30,
  runningFrequencyHz: 300e3,
  peakSwitchVoltageV: null,
  dutyCycle: 0.5,
  outcome: "normal",
};
const parts = (switches: ComponentRecord[], heatSink: ComponentRecord | null) => ({
  parts: { switches, sink: heatSink, clamp: null, fan: null, all: [...switches, ...(heatSink ? [heatSink] : [])] },
  warmUp: null,
});

describe("checkSwitchLosses", () => {
  it("sets the sink's heat beside a conduction + switching estimate for a single MOSFET", () => {
    const check = checkSwitchLosses({ topology: "single_switch" }, session, parts([mosfet], sink));
    expect(check.ok).toBe(true);
    if (!check.ok) return;
    // P = (30 − 22)/2 = 4 W from the sink (docs/references.md thermal chain, rearranged)
    expect(check.sinkInferredW).toBeCloseTo(4, 12);
    // typical MOSFET (0.2 Ω, 50 ns): ramp I_pk = 10 A, I_rms = 10·√(0.5/3); conduction 0.2·I_rms², switching ½·24·10·50 ns·300 kHz (derived)
    const expected = 0.2 * (100 * 0.5) / 3 + 0.5 * 24 * 10 * 50e-9 * 300e3;
    expect(check.estimate.totalW).toBeCloseTo(expected, 12);
    expect(check.crossCheck.agrees).toBe(true);
  });

  it("says why when there is nothing to check", () => {
    expect(checkSwitchLosses({ topology: "single_switch" }, { ...session, runningFrequencyHz: null }, parts([mosfet], sink))).toMatchObject({ ok: false, reason: expect.stringMatching(/running frequency/) });
    expect(checkSwitchLosses({ topology: "single_switch" }, session, parts([mosfet], null))).toMatchObject({ ok: false, reason: expect.stringMatching(/thermal resistance/) });
    expect(checkSwitchLosses({ topology: "single_switch" }, session, parts([{ ...mosfet, switchType: null }], sink))).toMatchObject({ ok: false, reason: expect.stringMatching(/type/) });
  });
});
