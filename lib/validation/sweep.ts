/**
 * Sweep schemas: the settings every sweep has, then the readings either as typed in the grid
 * (engineering notation per cell, errors keyed "points.<row>.<frequency|amplitude>") or as an import's
 * already-mapped numbers (two parallel arrays, checked in one loop: a 100 000-point import must not
 * build 200 000 zod issues' worth of machinery).
 */
import { z } from "zod";
import { quantityField } from "./quantity";

export const AMPLITUDE_CONVENTIONS = ["peak_to_peak", "peak", "rms"] as const;
export type AmplitudeConventionCode = (typeof AMPLITUDE_CONVENTIONS)[number];

/** Most readings one hand-entered sweep may have; imports go up to MAX_IMPORTED_POINTS. */
export const MAX_TYPED_POINTS = 2_000;
export const MAX_IMPORTED_POINTS = 200_000;

const FREQUENCY_RANGE = { min: 1, max: 100e6 };

const sweepSettingsShape = {
  coilId: z.string({ error: "Coil: choose a coil." }).trim().min(1, "Coil: choose a coil."),
  topLoadId: z.preprocess((v) => (v === "" || v === undefined ? null : v), z.string().min(1).nullable()),
  takenAt: z
    .string({ error: "Taken at: enter a date and time." })
    .trim()
    .min(1, "Taken at: enter a date and time.")
    .transform((text, ctx) => {
      const date = new Date(text);
      if (Number.isNaN(date.getTime())) {
        ctx.addIssue({ code: "custom", message: `Taken at: could not read “${text}” as a date and time.` });
        return z.NEVER;
      }
      // A day's slack for clocks and time zones; later than that is a typo.
      if (date.getTime() > Date.now() + 86_400_000) {
        ctx.addIssue({ code: "custom", message: "Taken at: that is in the future." });
        return z.NEVER;
      }
      return date;
    }),
  seriesResistanceOhm: quantityField({ label: "Series resistor", kind: "resistance", min: 1, max: 100e6 }),
  sourceAmplitudeV: quantityField({ label: "Source amplitude", kind: "voltage", min: 1e-3, max: 1_000 }),
  amplitudeConvention: z.enum(AMPLITUDE_CONVENTIONS, { error: "Amplitude convention: choose peak-to-peak, peak or RMS." }),
  environmentNotes: z.string().trim().max(2_000, "Environment notes: at most 2 000 characters.").default(""),
  notes: z.string().trim().max(5_000, "Notes: at most 5 000 characters.").default(""),
};

export const typedSweepPointSchema = z.object({
  frequency: quantityField({ label: "Frequency", kind: "frequency", ...FREQUENCY_RANGE }),
  amplitude: quantityField({ label: "Amplitude", kind: "voltage", min: 1e-9, max: 1_000 }),
});

export const sweepEntrySchema = z.object({
  ...sweepSettingsShape,
  points: z
    .array(typedSweepPointSchema)
    .min(3, "Readings: enter at least 3 rows.")
    .max(MAX_TYPED_POINTS, `Readings: at most ${MAX_TYPED_POINTS} rows by hand; import a CSV for more.`),
});

export const sweepImportSchema = z
  .object({
    ...sweepSettingsShape,
    frequenciesHz: z.array(z.number(), { error: "Readings: the frequencies are missing." }),
    amplitudesV: z.array(z.number(), { error: "Readings: the amplitudes are missing." }),
  })
  .superRefine((input, ctx) => {
    const { frequenciesHz: f, amplitudesV: a } = input;
    if (f.length !== a.length) ctx.addIssue({ code: "custom", path: ["amplitudesV"], message: `Readings: ${f.length} frequencies but ${a.length} amplitudes.` });
    if (f.length < 3) ctx.addIssue({ code: "custom", path: ["frequenciesHz"], message: "Readings: at least 3 are needed." });
    if (f.length > MAX_IMPORTED_POINTS) ctx.addIssue({ code: "custom", path: ["frequenciesHz"], message: `Readings: at most ${MAX_IMPORTED_POINTS} in one sweep.` });
    for (let i = 0; i < f.length; i++) {
      const frequency = f[i]!;
      if (!(frequency >= FREQUENCY_RANGE.min && frequency <= FREQUENCY_RANGE.max)) {
        ctx.addIssue({ code: "custom", path: ["frequenciesHz", i], message: `Reading ${i + 1}: frequency must be between 1 Hz and 100 MHz, got ${frequency} Hz.` });
        return;
      }
      const amplitude = a[i];
      if (amplitude === undefined || !(amplitude > 0 && amplitude <= 1_000)) {
        ctx.addIssue({ code: "custom", path: ["amplitudesV", i], message: `Reading ${i + 1}: amplitude must be above 0 V and at most 1 kV, got ${amplitude} V.` });
        return;
      }
    }
  });

export type SweepEntryInput = z.infer<typeof sweepEntrySchema>;
export type SweepImportInput = z.infer<typeof sweepImportSchema>;

/** What lib/db stores: the settings plus readings in SI, whichever way they came in. */
export interface SweepRecordInput {
  coilId: string;
  topLoadId: string | null;
  takenAt: Date;
  seriesResistanceOhm: number;
  sourceAmplitudeV: number;
  amplitudeConvention: AmplitudeConventionCode;
  environmentNotes: string;
  notes: string;
  points: { frequencyHz: number; amplitudeV: number }[];
}

export function recordInputFromEntry(input: SweepEntryInput): SweepRecordInput {
  const { points, ...settings } = input;
  return { ...settings, points: points.map((p) => ({ frequencyHz: p.frequency, amplitudeV: p.amplitude })) };
}

export function recordInputFromImport(input: SweepImportInput): SweepRecordInput {
  const { frequenciesHz, amplitudesV, ...settings } = input;
  return { ...settings, points: frequenciesHz.map((frequencyHz, i) => ({ frequencyHz, amplitudeV: amplitudesV[i]! })) };
}

/** What-if form on the sweep page (GET query): a shape and its dimensions, or a measured capacitance. */
export const WHAT_IF_SHAPES = ["sphere", "disc", "toroid", "cylinder", "measured"] as const;
export type WhatIfShape = (typeof WHAT_IF_SHAPES)[number];

const dimension = (label: string) => quantityField({ label, kind: "length", min: 1e-3, max: 3, defaultUnit: "mm" });

export const whatIfTopLoadSchema = z.discriminatedUnion(
  "shape",
  [
    z.object({ shape: z.literal("sphere"), diameter: dimension("Diameter") }),
    z.object({ shape: z.literal("disc"), diameter: dimension("Diameter") }),
    z.object({ shape: z.literal("toroid"), diameter: dimension("Outer diameter"), tubeDiameter: dimension("Tube diameter") }),
    z.object({ shape: z.literal("cylinder"), diameter: dimension("Diameter"), height: dimension("Height") }),
    z.object({ shape: z.literal("measured"), capacitance: quantityField({ label: "Capacitance", kind: "capacitance", min: 0, max: 1e-9 }) }),
  ],
  { error: "Shape: choose sphere, disc, toroid, closed can or measured capacitance." },
);
export type WhatIfTopLoad = z.infer<typeof whatIfTopLoadSchema>;
