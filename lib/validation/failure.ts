/**
 * Failures and post-mortems, shared by the forms and their server actions. A member records what
 * happened; a steward completes the post-mortem and may record the replacement part in the same step.
 */
import { z } from "zod";
import { optionalQuantityField } from "./quantity";
import { localDateTimeField } from "./session";

export const failureModeSchema = z.enum(["over_voltage", "over_current", "over_temperature", "reverse_base_breakdown", "mechanical", "unknown"], {
  error: "Failure mode: choose one of the listed modes (unknown is fine).",
});

const optionalId = z.preprocess((v) => (v === "" || v === null ? undefined : v), z.string().optional());

export const failureSchema = z.object({
  coilId: z.string().min(1, "Coil: choose a coil."),
  sessionId: optionalId,
  componentId: optionalId,
  mode: failureModeSchema,
  occurredAt: localDateTimeField("Occurred at"),
  symptoms: z.string().trim().min(3, "Symptoms: say what was seen, heard or smelt.").max(5_000, "Symptoms: at most 5 000 characters."),
});

export type FailureInput = z.output<typeof failureSchema>;

/** The part fitted in place of the failed one; its ratings default to the failed part's on the form. */
export const replacementPartSchema = z.object({
  partNumber: z.string().trim().min(1, "Replacement part number: enter the part number.").max(80, "Replacement part number: at most 80 characters."),
  manufacturer: z.string().trim().max(80, "Manufacturer: at most 80 characters.").default(""),
  serial: z.string().trim().max(80, "Serial: at most 80 characters.").default(""),
  installedAt: localDateTimeField("Replacement fitted at"),
  voltageRatingV: optionalQuantityField({ label: "Voltage rating", kind: "voltage", min: 1, max: 10_000 }),
  continuousCurrentA: optionalQuantityField({ label: "Continuous current rating", kind: "current", min: 0.01, max: 1_000 }),
  peakCurrentA: optionalQuantityField({ label: "Peak current rating", kind: "current", min: 0.01, max: 5_000 }),
  powerRating25CW: optionalQuantityField({ label: "Power rating at 25 °C", kind: "power", min: 0.1, max: 5_000 }),
  maxJunctionTempC: optionalQuantityField({ label: "Maximum junction temperature", kind: "temperature", min: 50, max: 250 }),
  thermalResistanceJcKPerW: optionalQuantityField({ label: "Junction-to-case resistance", kind: "thermalResistance", min: 0.001, max: 100 }),
  caseToSinkKPerW: optionalQuantityField({ label: "Case-to-sink resistance", kind: "thermalResistance", min: 0, max: 100 }),
  sinkThermalResistanceKPerW: optionalQuantityField({ label: "Sink-to-ambient resistance", kind: "thermalResistance", min: 0.01, max: 100 }),
});

export type ReplacementPartInput = z.output<typeof replacementPartSchema>;

export const postMortemSchema = z.object({
  failureId: z.string().min(1),
  /** The mode the post-mortem found; it replaces the one recorded with the failure (often "unknown"). Absent keeps it. */
  mode: failureModeSchema.optional(),
  rootCause: z.string().trim().min(10, "Root cause: explain it in a sentence or more (at least 10 characters).").max(5_000, "Root cause: at most 5 000 characters."),
  correctiveAction: z
    .string()
    .trim()
    .min(10, "Corrective action: say what was changed or will be done (at least 10 characters).")
    .max(5_000, "Corrective action: at most 5 000 characters."),
  replacement: replacementPartSchema.optional(),
});

export type PostMortemInput = z.output<typeof postMortemSchema>;

/** The rating fields a replacement copies from the failed part, in form order. */
export const REPLACEMENT_RATING_FIELDS = [
  "voltageRatingV",
  "continuousCurrentA",
  "peakCurrentA",
  "powerRating25CW",
  "maxJunctionTempC",
  "thermalResistanceJcKPerW",
  "caseToSinkKPerW",
  "sinkThermalResistanceKPerW",
] as const;
