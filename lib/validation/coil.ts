/**
 * The coil (build) schema in SI units, shared by the JSON API, the coil forms and imports.
 * Ranges are what a hobby-scale build can plausibly be; anything outside is almost always a unit
 * slip (millimetres typed as metres), so the message names the field and the expected range.
 */
import { z } from "zod";

function si(label: string, unit: string, min: number, max: number) {
  return z.coerce
    .number({ error: `${label}: enter a number in ${unit}.` })
    .refine(Number.isFinite, `${label}: enter a finite number in ${unit}.`)
    .refine((v) => v >= min && v <= max, `${label} must be between ${min} and ${max} ${unit}.`);
}

const optional = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v) => (v === "" || v === null ? undefined : v), schema.optional());

export const coilTagSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, "Tag: 2–16 letters, digits or dashes, like CY-07.");

export const coilStatusSchema = z.enum(["active", "repair", "retired"], { error: "Status: choose active, repair or retired." });
export const topologySchema = z.enum(["single_switch", "push_pull", "half_bridge", "full_bridge"], {
  error: "Driver: choose single switch, push-pull, half bridge or full bridge.",
});

export const coilSchema = z.object({
  tag: coilTagSchema,
  name: z.string().trim().min(1, "Name: enter a name.").max(80, "Name: at most 80 characters."),
  builderName: z.string().trim().min(1, "Builder: enter who built it.").max(80, "Builder: at most 80 characters."),
  status: coilStatusSchema.default("active"),
  topology: topologySchema.default("single_switch"),
  formDiameterM: si("Form diameter", "m", 0.005, 1),
  windingLengthM: si("Winding length", "m", 0.01, 3),
  turns: z.coerce.number({ error: "Turns: enter a whole number." }).int("Turns: enter a whole number.").min(10, "Turns: at least 10.").max(20_000, "Turns: at most 20 000."),
  wireDiameterM: si("Wire diameter", "m", 0.00005, 0.005),
  wireGaugeAwg: optional(z.coerce.number().int("AWG: a whole gauge number.").min(-3).max(56)),
  wireMaterial: z.enum(["copper", "aluminium"]).default("copper"),
  measuredDcResistanceOhm: optional(si("Measured DC resistance", "Ω", 0.001, 10_000)),
  measuredInductanceH: optional(si("Measured inductance", "H", 1e-6, 10)),
  primaryTurns: optional(si("Primary turns", "turns", 0.5, 100)),
  primaryDiameterM: optional(si("Primary diameter", "m", 0.005, 2)),
  notes: z.string().max(5_000, "Notes: at most 5 000 characters.").default(""),
});

export type CoilInput = z.infer<typeof coilSchema>;

export const coilStatusChangeSchema = z.object({ coilId: z.string().min(1), status: coilStatusSchema });
