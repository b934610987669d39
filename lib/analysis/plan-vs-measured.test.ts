import { describe, expect, it } from "vitest";
import { comparePlanWithMeasured } from "./plan-vs-measured";
import type { StoredPlan } from "../validation/plan";

const plan: StoredPlan = {
  format: "coilyard-plan",
  version: 1,
  plannedAt: "2026-11-01T10:00:00.000Z",
  policy: { version: 1, ituRegion: 2, minVoltageHeadroom: 0.2, minThermalHeadroom: 0.2, minJunctionMarginK: 25 },
  chosenVariant: 0,
  variants: [
    {
      label: "Variant A",
      inputs: {
        formDiameterM: 0.075,
        wireDiameterM: 0.00025,
        wireMaterial: "copper",
        turns: 900,
        windingLengthM: null,
        topLoad: null,
        topology: "single_switch",
        supplyVoltageV: 24,
        supplyCurrentA: 2,
        switchLossFraction: null,
        ambientTempC: 20,
        transistor: { voltageRatingV: 200, continuousCurrentA: null, peakCurrentA: null, powerRating25CW: 150, maxJunctionTempC: 150, thermalResistanceJcKPerW: null, caseToSinkKPerW: null },
        heatSink: { sinkThermalResistanceKPerW: 2, sinkMassKg: null },
        clampVoltageV: null,
      },
      predicted: {
        turns: 900,
        windingLengthM: 0.243,
        inductanceH: 10e-3,
        wheelerInductanceH: 9.9e-3,
        selfCapacitanceF: 4e-12,
        topLoadCapacitanceF: 0,
        firstResonanceHz: 500e3,
        firstResonanceLowHz: 425e3,
        firstResonanceHighHz: 575e3,
        peakUnclampedV: 120,
        peakClampedV: 64.8,
        clampPlanned: false,
        dissipationW: 4.8,
        steadyJunctionC: 40,
        steadySinkC: 29.6,
        junctionLimitC: 125,
        longestRunS: null,
        longestRunUnlimited: true,
      },
    },
  ],
};

const session = (over: Partial<Parameters<typeof comparePlanWithMeasured>[3][number]> = {}) => ({
  startedAt: new Date("2026-11-10T10:00:00Z"),
  supplyVoltageV: 24,
  supplyCurrentA: 2,
  ambientTempC: 20,
  heatSinkEndC: null,
  runningFrequencyHz: null,
  peakSwitchVoltageV: null,
  ...over,
});

describe("comparePlanWithMeasured", () => {
  it("shows nothing measured for a coil not yet measured", () => {
    const rows = comparePlanWithMeasured(plan, { measuredInductanceH: null }, [], []);
    expect(rows.map((r) => r.key)).toEqual(["inductance", "firstResonance", "runningFrequency", "peakVoltage", "sinkTemperature"]);
    expect(rows.every((r) => r.measured === null && r.deviation === null)).toBe(true);
  });

  it("compares the latest sweep's resonance with the planned band", () => {
    const sweeps = [
      { takenAt: new Date("2026-11-05T10:00:00Z"), firstSeriesResonanceHz: 600e3 },
      { takenAt: new Date("2026-11-09T10:00:00Z"), firstSeriesResonanceHz: 450e3 },
    ];
    const row = comparePlanWithMeasured(plan, { measuredInductanceH: 10.5e-3 }, sweeps, []).find((r) => r.key === "firstResonance")!;
    // (450 − 500)/500 = −10 %, inside 425–575 kHz.
    expect(row.measured).toBe(450e3);
    expect(row.deviation).toBeCloseTo(-0.1, 12);
    expect(row.withinBand).toBe(true);
  });

  it("scales the planned peak and sink rise to the session's supply", () => {
    // Unclamped rule of thumb 120 V / 24 V = 5 × supply; at 30 V: 150 V planned; measured 135 V → −10 %.
    // Planned sink rise 9.6 K at 48 W input; at 30 V × 2 A = 60 W: 12 K over a 22 °C ambient = 34 °C; measured 37 °C → rise 15 K, +25 %.
    const rows = comparePlanWithMeasured(plan, { measuredInductanceH: null }, [], [session({ supplyVoltageV: 30, ambientTempC: 22, peakSwitchVoltageV: 135, heatSinkEndC: 37 })]);
    const peak = rows.find((r) => r.key === "peakVoltage")!;
    expect(peak.planned).toBeCloseTo(150, 9);
    expect(peak.deviation).toBeCloseTo(-0.1, 9);
    const sink = rows.find((r) => r.key === "sinkTemperature")!;
    expect(sink.planned).toBeCloseTo(34, 9);
    expect(sink.deviation).toBeCloseTo(0.25, 9);
  });
});
