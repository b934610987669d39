/**
 * A steward's clearance decision as submitted: the verdict, the checklist answers, and the conditions.
 * Rule results are never taken from the form; the server evaluates them again.
 */
import { z } from "zod";
import { optionalQuantityField } from "./quantity";

export const clearanceDecisionSchema = z.object({
  coilId: z.string({ error: "Coil: missing." }).min(1, { error: "Coil: missing." }),
  verdict: z.enum(["cleared", "refused"], { error: "Decision: choose “clear for lending” or “refuse”." }),
  checklist: z.record(z.string(), z.boolean()),
  maxSupplyVoltageV: optionalQuantityField({ label: "Maximum supply voltage", kind: "voltage", min: 1, max: 1000, defaultUnit: "V" }),
  maxRunS: optionalQuantityField({ label: "Maximum run length", kind: "time", min: 10, max: 24 * 3600, defaultUnit: "min" }),
  conditions: z.string().trim().max(2000, { error: "Conditions: at most 2000 characters." }).default(""),
});

export type ClearanceDecisionInput = z.output<typeof clearanceDecisionSchema>;

/** The checklist answers of a submitted form: a checked box named `check:<id>` is a "yes". */
export function readChecklistAnswers(form: FormData, itemIds: readonly string[]): Record<string, boolean> {
  return Object.fromEntries(itemIds.map((id) => [id, form.get(`check:${id}`) === "yes"]));
}
