/**
 * Parts fitted to a coil: switching transistors with their ratings, heat sinks, snubber and clamp
 * parts. Every rating goes through quantityField, so "600 V", "40 A", "0.5 K/W" and "150 g" all read.
 * Shared by the part forms, the replace-a-part action and imports.
 */
import { z } from "zod";
import { optionalQuantityField } from "./quantity";

export const componentKindSchema = z.enum(["switch", "heat_sink", "snubber", "clamp", "fan", "gate_drive", "other"], {
  error: "Kind: choose switch, heat sink, snubber, clamp, fan, base/gate drive or other.",
});
export const switchTypeSchema = z.enum(["bjt", "mosfet", "igbt"], { error: "Switch type: choose BJT, MOSFET or IGBT." });

const text = (label: string, max: number) =>
  z.preprocess((v) => (v === null || v === undefined ? "" : v), z.string().trim().max(max, `${label}: at most ${max} characters.`));

/**
 * A date typed in a form ("2024-05-01") or an ISO time from JSON; empty means now, and so does
 * today's date, so a part swapped today sorts after one fitted earlier today.
 */
export const dateField = (label: string) =>
  z.preprocess(
    (v) => (v === "" || v === null || v === undefined || v === new Date().toISOString().slice(0, 10) ? new Date() : v),
    z.coerce.date({ error: `${label}: enter a date like 2024-05-01.` }).refine((d) => !Number.isNaN(d.getTime()), `${label}: enter a date like 2024-05-01.`),
  );

export const componentFields = {
  kind: componentKindSchema,
  partNumber: z.string({ error: "Part number: enter the part number." }).trim().min(1, "Part number: enter the part number.").max(60, "Part number: at most 60 characters."),
  manufacturer: text("Manufacturer", 60),
  description: text("Description", 200),
  serial: text("Serial", 60),
  switchType: z.preprocess((v) => (v === "" || v === null ? undefined : v), switchTypeSchema.optional()),
  voltageRatingV: optionalQuantityField({ label: "Voltage rating", kind: "voltage", min: 1, max: 10_000 }),
  continuousCurrentA: optionalQuantityField({ label: "Continuous current", kind: "current", min: 0.01, max: 2_000 }),
  peakCurrentA: optionalQuantityField({ label: "Peak current", kind: "current", min: 0.01, max: 10_000 }),
  powerRating25CW: optionalQuantityField({ label: "Power at 25 °C case", kind: "power", min: 0.1, max: 10_000 }),
  maxJunctionTempC: optionalQuantityField({ label: "Tj max", kind: "temperature", min: 50, max: 250 }),
  thermalResistanceJcKPerW: optionalQuantityField({ label: "Rθjc (junction to case)", kind: "thermalResistance", min: 0.001, max: 100 }),
  caseToSinkKPerW: optionalQuantityField({ label: "Case to sink", kind: "thermalResistance", min: 0, max: 50 }),
  sinkThermalResistanceKPerW: optionalQuantityField({ label: "Rθsa (sink to ambient)", kind: "thermalResistance", min: 0.001, max: 100 }),
  sinkMassKg: optionalQuantityField({ label: "Heat-sink mass", kind: "mass", min: 0.001, max: 50, defaultUnit: "g" }),
  resistanceOhm: optionalQuantityField({ label: "Resistance", kind: "resistance", min: 0.001, max: 1e9 }),
  capacitanceF: optionalQuantityField({ label: "Capacitance", kind: "capacitance", min: 1e-12, max: 1 }),
  clampVoltageV: optionalQuantityField({ label: "Clamp voltage", kind: "voltage", min: 1, max: 10_000 }),
  installedAt: dateField("Installed"),
};

type ComponentShape = z.infer<z.ZodObject<typeof componentFields>>;

/** Ratings that belong to another kind of part are dropped, so a heat sink never carries a voltage rating. */
const KIND_FIELDS: Record<string, readonly (keyof ComponentShape)[]> = {
  switch: ["switchType", "voltageRatingV", "continuousCurrentA", "peakCurrentA", "powerRating25CW", "maxJunctionTempC", "thermalResistanceJcKPerW", "caseToSinkKPerW"],
  heat_sink: ["sinkThermalResistanceKPerW", "sinkMassKg"],
  // A fan records the sink's Rθsa with that fan running (lib/calc/fan-cooling.ts reads it).
  fan: ["sinkThermalResistanceKPerW"],
  snubber: ["resistanceOhm", "capacitanceF", "clampVoltageV"],
  clamp: ["resistanceOhm", "capacitanceF", "clampVoltageV"],
};
const RATING_FIELDS = Object.values(KIND_FIELDS).flat();

export function keepKindFields<T extends ComponentShape>(value: T, ctx: z.RefinementCtx): T {
  const allowed = new Set(KIND_FIELDS[value.kind] ?? []);
  const out = { ...value };
  for (const field of RATING_FIELDS) if (!allowed.has(field)) delete out[field];
  if (value.kind === "switch" && !value.switchType) {
    ctx.addIssue({ code: "custom", path: ["switchType"], message: "Switch type: choose BJT, MOSFET or IGBT." });
  }
  if (value.kind === "switch" && value.continuousCurrentA !== undefined && value.peakCurrentA !== undefined && value.peakCurrentA < value.continuousCurrentA) {
    ctx.addIssue({ code: "custom", path: ["peakCurrentA"], message: "Peak current: the peak rating is normally above the continuous one; check the datasheet." });
  }
  return out;
}

export const componentSchema = z.object({ coilId: z.string().min(1, "Coil: missing."), ...componentFields }).transform(keepKindFields);
export type ComponentInput = z.output<typeof componentSchema>;

/** Replacing a part: why and when the old one came out, and the new one's details. */
export const replaceComponentSchema = z
  .object({
    oldComponentId: z.string().min(1, "Part: missing."),
    removalReason: z.string({ error: "Reason: say why it came out." }).trim().min(3, "Reason: say why it came out (e.g. failed short, upgrade).").max(300, "Reason: at most 300 characters."),
    coilId: z.string().min(1, "Coil: missing."),
    ...componentFields,
  })
  .transform(keepKindFields);
export type ReplaceComponentInput = z.output<typeof replaceComponentSchema>;
