import { describe, expect, it } from "vitest";
import { fieldErrorsOf } from "./action-result";
import { sweepEntrySchema, sweepImportSchema, whatIfTopLoadSchema } from "./sweep";

const settings = {
  coilId: "coil-1",
  topLoadId: "",
  takenAt: "2025-03-01T14:30:00.000Z",
  seriesResistanceOhm: "22k",
  sourceAmplitudeV: "20 V",
  amplitudeConvention: "peak_to_peak",
  environmentNotes: "",
  notes: "",
};

describe("sweepEntrySchema", () => {
  it("reads engineering notation in every cell", () => {
    const parsed = sweepEntrySchema.parse({
      ...settings,
      points: [
        { frequency: "321k", amplitude: "1.5 mV" },
        { frequency: "330 kHz", amplitude: "2m" },
        { frequency: "0.34 MHz", amplitude: "0.003" },
      ],
    });
    expect(parsed.seriesResistanceOhm).toBe(22_000);
    expect(parsed.topLoadId).toBeNull();
    expect(parsed.points.map((p) => [p.frequency, p.amplitude])).toEqual([
      [321e3, 1.5e-3],
      [330e3, 2e-3],
      [340e3, 3e-3],
    ]);
  });

  it("names the row and column of a bad cell", () => {
    const result = sweepEntrySchema.safeParse({ ...settings, points: [{ frequency: "1k", amplitude: "1" }, { frequency: "banana", amplitude: "1" }, { frequency: "3k", amplitude: "" }] });
    expect(result.success).toBe(false);
    const errors = fieldErrorsOf(result.error!);
    expect(errors["points.1.frequency"]?.[0]).toMatch(/^Frequency: Could not read “banana”/);
    expect(errors["points.2.amplitude"]?.[0]).toMatch(/^Amplitude:/);
  });
});

describe("sweepImportSchema", () => {
  it("refuses mismatched arrays and an out-of-range reading by its number", () => {
    const mismatched = sweepImportSchema.safeParse({ ...settings, frequenciesHz: [1, 2, 3], amplitudesV: [1, 2] });
    expect(fieldErrorsOf(mismatched.error!)["amplitudesV"]?.[0]).toBe("Readings: 3 frequencies but 2 amplitudes.");
    const bad = sweepImportSchema.safeParse({ ...settings, frequenciesHz: [1000, 2000, -1], amplitudesV: [1, 1, 1] });
    expect(fieldErrorsOf(bad.error!)["frequenciesHz.2"]?.[0]).toMatch(/^Reading 3: frequency/);
  });
});

describe("whatIfTopLoadSchema", () => {
  it("reads a toroid's dimensions, bare numbers in mm", () => {
    expect(whatIfTopLoadSchema.parse({ shape: "toroid", diameter: "200", tubeDiameter: "5 cm" })).toEqual({ shape: "toroid", diameter: 0.2, tubeDiameter: 0.05 });
    expect(whatIfTopLoadSchema.parse({ shape: "measured", capacitance: "12p" })).toEqual({ shape: "measured", capacitance: 12e-12 });
  });
});
