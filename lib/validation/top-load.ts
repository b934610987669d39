/**
 * Top-load configurations: a shape with its dimensions, or only a measured capacitance.
 * Shared by the top-load form, its server action and imports.
 */
import { z } from "zod";
import { optionalQuantityField } from "./quantity";

export const topLoadShapeSchema = z.enum(["none", "sphere", "disc", "toroid", "cylinder", "measured"], {
  error: "Shape: choose none, sphere, disc, toroid, closed can or measured capacitance.",
});

const dimension = (label: string) => optionalQuantityField({ label, kind: "length", min: 0.005, max: 3, defaultUnit: "mm" });

/** What each shape needs before a capacitance can be worked out. */
const NEEDS: Record<string, { field: "diameterM" | "tubeDiameterM" | "heightM" | "measuredCapacitanceF"; message: string }[]> = {
  sphere: [{ field: "diameterM", message: "Diameter: a sphere needs its diameter." }],
  disc: [{ field: "diameterM", message: "Diameter: a disc needs its diameter." }],
  toroid: [
    { field: "diameterM", message: "Outer diameter: a toroid needs its outer diameter." },
    { field: "tubeDiameterM", message: "Tube diameter: a toroid needs its tube diameter." },
  ],
  cylinder: [
    { field: "diameterM", message: "Diameter: a closed can needs its diameter." },
    { field: "heightM", message: "Height: a closed can needs its height." },
  ],
  measured: [{ field: "measuredCapacitanceF", message: "Measured capacitance: enter the measured value, like 12 pF." }],
};

export const topLoadSchema = z
  .object({
    coilId: z.string().min(1, "Coil: missing."),
    name: z.string({ error: "Name: enter a name." }).trim().min(1, "Name: enter a name, like “Spun toroid 150 mm”.").max(80, "Name: at most 80 characters."),
    shape: topLoadShapeSchema,
    diameterM: dimension("Diameter"),
    tubeDiameterM: dimension("Tube diameter"),
    heightM: dimension("Height"),
    measuredCapacitanceF: optionalQuantityField({ label: "Measured capacitance", kind: "capacitance", min: 0.1e-12, max: 1e-9 }),
    notes: z.preprocess((v) => v ?? "", z.string().max(1_000, "Notes: at most 1 000 characters.")),
  })
  .superRefine((value, ctx) => {
    for (const need of NEEDS[value.shape] ?? []) {
      if (value[need.field] === undefined) ctx.addIssue({ code: "custom", path: [need.field], message: need.message });
    }
    if (value.shape === "toroid" && value.diameterM !== undefined && value.tubeDiameterM !== undefined && value.tubeDiameterM >= value.diameterM / 2) {
      ctx.addIssue({ code: "custom", path: ["tubeDiameterM"], message: "Tube diameter: must be less than half the outer diameter, or there is no hole." });
    }
  });
export type TopLoadInput = z.output<typeof topLoadSchema>;

export const retireTopLoadSchema = z.object({ topLoadId: z.string().min(1, "Top load: missing.") });
