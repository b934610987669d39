import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { fleetSummaryCsv, partsCsv, sessionsCsv, sweepPointsCsv } from "./logbook-csv";
import type { CoilDocument } from "../validation/export";

const coil: CoilDocument = {
  id: "c1", tag: "T-01", name: "Test, \"quoted\"", builderName: "Ada", status: "active", topology: "single_switch",
  formDiameterM: 0.075, windingLengthM: 0.2, turns: 600, wireDiameterM: 0.000321, wireGaugeAwg: 28, wireMaterial: "copper",
  measuredDcResistanceOhm: null, measuredInductanceH: 0.004, primaryTurns: 3, primaryDiameterM: 0.1, environmentCapacitanceF: null, environmentCalibratedAt: null,
  notes: "", createdAt: "2025-01-01T00:00:00.000Z", createdBy: null,
  topLoads: [{ id: "t1", name: "Toroid", shape: "toroid", diameterM: 0.15, tubeDiameterM: 0.04, heightM: null, measuredCapacitanceF: null, notes: "", createdAt: "2025-01-01T00:00:00.000Z", retiredAt: null }],
  components: [
    { id: "p1", kind: "switch", partNumber: "IRFP260N", manufacturer: "", description: "", serial: "", switchType: "mosfet", voltageRatingV: 200, continuousCurrentA: 50, peakCurrentA: 200, powerRating25CW: 300, maxJunctionTempC: 175, thermalResistanceJcKPerW: 0.5, caseToSinkKPerW: 0.24, sinkThermalResistanceKPerW: null, sinkMassKg: null, resistanceOhm: null, capacitanceF: null, clampVoltageV: null, installedAt: "2025-01-01T00:00:00.000Z", removedAt: "2025-02-01T00:00:00.000Z", removalReason: "failed short", replacedById: "p2" },
    { id: "p2", kind: "switch", partNumber: "IRFP460", manufacturer: "", description: "", serial: "", switchType: "mosfet", voltageRatingV: 500, continuousCurrentA: 20, peakCurrentA: 80, powerRating25CW: 280, maxJunctionTempC: 150, thermalResistanceJcKPerW: 0.45, caseToSinkKPerW: 0.24, sinkThermalResistanceKPerW: null, sinkMassKg: null, resistanceOhm: null, capacitanceF: null, clampVoltageV: null, installedAt: "2025-02-01T00:00:00.000Z", removedAt: null, removalReason: null, replacedById: null },
  ],
  sweeps: [{ id: "w1", topLoadId: "t1", takenAt: "2025-01-02T00:00:00.000Z", takenBy: null, seriesResistanceOhm: 10000, sourceAmplitudeV: 10, amplitudeConvention: "peak_to_peak", environmentNotes: "", notes: "", pointCount: 2, firstSeriesResonanceHz: 250000, createdAt: "2025-01-02T00:00:00.000Z", points: [{ frequencyHz: 240000, amplitudeV: 1.2 }, { frequencyHz: 250000, amplitudeV: 0.3 }], resonances: [] }],
  sessions: [{ id: "s1", topLoadId: "t1", startedAt: "2025-01-03T00:00:00.000Z", loggedBy: "a@b.test", supplyVoltageV: 24, supplyCurrentA: 2.5, durationS: 120, ambientTempC: 21, heatSinkStartC: 21, heatSinkEndC: 35, runningFrequencyHz: 248000, peakSwitchVoltageV: null, dutyCycle: null, outcome: "normal", notes: "line one\nline two", loanId: null, createdAt: "2025-01-03T00:00:00.000Z", samples: [] }],
  failures: [], clearances: [], loans: [],
};

describe("logbook CSV tables", () => {
  it("writes sessions with unit-named columns that read back, quoting newlines", () => {
    const parsed = Papa.parse<Record<string, string>>(sessionsCsv(coil), { header: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data[0]).toMatchObject({ coil_tag: "T-01", top_load: "Toroid", supply_voltage_v: "24", heat_sink_start_c: "21", peak_switch_voltage_v: "", notes: "line one\nline two" });
  });

  it("writes one row per sweep point and keeps the replacement link of parts", () => {
    expect(Papa.parse(sweepPointsCsv(coil), { header: true }).data).toHaveLength(2);
    const parts = Papa.parse<Record<string, string>>(partsCsv(coil), { header: true }).data;
    expect(parts[0]).toMatchObject({ part_number: "IRFP260N", removal_reason: "failed short", replaced_by_part_id: "p2" });
  });

  it("summarises the fleet one coil a row, quoting a name with a comma and quotes", () => {
    const csv = fleetSummaryCsv({ format: "coilyard-logbook", version: 1, exportedAt: "2025-03-01T00:00:00.000Z", coils: [coil] });
    expect(csv).toContain('"Test, ""quoted"""');
    const row = Papa.parse<Record<string, string>>(csv, { header: true }).data[0];
    expect(row).toMatchObject({ tag: "T-01", parts_fitted: "1", sessions: "1", last_first_series_resonance_hz: "250000" });
  });
});
