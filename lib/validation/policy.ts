/**
 * The lending policy: the stored rules (matching lib/calc's ClearancePolicyRules, checked whenever a
 * version is read or saved) and the admin's form, which shows headrooms in percent and the checklist as
 * one item a line: "id | text | source".
 */
import { z } from "zod";
import { readDecimalText } from "./quantity";
import type { ClearancePolicyRules } from "../calc/clearance-policy";

export const checklistItemSchema = z.object({
  id: z
    .string()
    .trim()
    .regex(/^[a-z0-9][a-z0-9-]{0,59}$/, { error: "Checklist item id: use lower-case letters, digits and hyphens (up to 60)." }),
  text: z.string().trim().min(5, { error: "Checklist item text: at least 5 characters." }).max(500),
  source: z.string().trim().min(1).max(300),
});

const fraction = (label: string) =>
  z.number({ error: `${label}: enter a number.` }).min(0, { error: `${label} must be at least 0 %.` }).max(1, { error: `${label} must be at most 100 %.` });
const wholeDays = (label: string, max: number) =>
  z.number({ error: `${label}: enter a whole number.` }).int({ error: `${label}: enter a whole number.` }).min(1, { error: `${label} must be at least 1.` }).max(max, { error: `${label} must be at most ${max}.` });

export const clearancePolicyRulesSchema = z
  .object({
    minVoltageHeadroom: fraction("Least voltage headroom"),
    minCurrentHeadroom: fraction("Least current headroom"),
    minThermalHeadroom: fraction("Least thermal headroom"),
    minJunctionMarginK: z.number({ error: "Junction margin: enter a number." }).min(0, { error: "Junction margin must be at least 0 K." }).max(150, { error: "Junction margin must be at most 150 K." }),
    acceptEstimatedMargins: z.boolean(),
    ituRegion: z.union([z.literal(1), z.literal(2), z.literal(3)], { error: "ITU region: choose 1, 2 or 3." }),
    maxSweepAgeDays: wholeDays("Oldest acceptable sweep (days)", 3650),
    minFailureFreeSessions: z.number().int({ error: "Clean sessions needed: enter a whole number." }).min(0, { error: "Clean sessions needed must be at least 0." }).max(1000),
    requiredChecklist: z.array(checklistItemSchema).min(1, { error: "Checklist: at least one item." }).max(50),
    validityDays: wholeDays("Validity (days)", 3650),
  })
  .superRefine((rules, ctx) => {
    const seen = new Set<string>();
    rules.requiredChecklist.forEach((item, i) => {
      if (seen.has(item.id)) ctx.addIssue({ code: "custom", path: ["requiredChecklist", i, "id"], message: `Checklist item id “${item.id}” is used twice.` });
      seen.add(item.id);
    });
  }) satisfies z.ZodType<ClearancePolicyRules>;

/** Reads a stored version's rules; throws when the stored JSON does not match the schema. */
export function parseStoredPolicyRules(rulesJson: string): ClearancePolicyRules {
  return clearancePolicyRulesSchema.parse(JSON.parse(rulesJson));
}

const percentField = (label: string) =>
  z.preprocess(
    (v) => readDecimalText(v, /\s*%\s*$/),
    z.number({ error: `${label}: enter a percentage, e.g. 20.` }).min(0, { error: `${label} must be between 0 and 100 %.` }).max(100, { error: `${label} must be between 0 and 100 %.` }),
  );
const numberField = (label: string) =>
  z.preprocess((v) => readDecimalText(v), z.number({ error: `${label}: enter a number.` }));

/** Turns "id | text | source" lines into checklist items, naming the line of any that cannot be read. */
function parseChecklistLines(text: string, ctx: z.RefinementCtx) {
  const items: { id: string; text: string; source: string }[] = [];
  text
    .split(/\r?\n/)
    .map((line) => line.trim())
    .forEach((line, i) => {
      if (line === "") return;
      const [id = "", itemText = "", source = ""] = line.split("|").map((p) => p.trim());
      if (id === "" || itemText === "") {
        ctx.addIssue({ code: "custom", message: `Checklist line ${i + 1}: expected “id | text | source”, got “${line.slice(0, 60)}”.` });
        return;
      }
      items.push({ id, text: itemText, source: source || "common practice" });
    });
  return items;
}

export const policyFormSchema = z
  .object({
    minVoltageHeadroomPct: percentField("Least voltage headroom"),
    minCurrentHeadroomPct: percentField("Least current headroom"),
    minThermalHeadroomPct: percentField("Least thermal headroom"),
    minJunctionMarginK: numberField("Junction margin"),
    acceptEstimatedMargins: z.preprocess((v) => v === "on" || v === "true" || v === true, z.boolean()),
    ituRegion: z.preprocess((v) => Number(v), z.number()),
    maxSweepAgeDays: numberField("Oldest acceptable sweep"),
    minFailureFreeSessions: numberField("Clean sessions needed"),
    validityDays: numberField("Validity"),
    checklist: z.string({ error: "Checklist: enter at least one item." }).transform((text, ctx) => parseChecklistLines(text, ctx)),
    note: z.string().trim().max(500, { error: "Note: at most 500 characters." }).default(""),
  })
  .transform((form, ctx) => {
    const rules = clearancePolicyRulesSchema.safeParse({
      minVoltageHeadroom: form.minVoltageHeadroomPct / 100,
      minCurrentHeadroom: form.minCurrentHeadroomPct / 100,
      minThermalHeadroom: form.minThermalHeadroomPct / 100,
      minJunctionMarginK: form.minJunctionMarginK,
      acceptEstimatedMargins: form.acceptEstimatedMargins,
      ituRegion: form.ituRegion,
      maxSweepAgeDays: form.maxSweepAgeDays,
      minFailureFreeSessions: form.minFailureFreeSessions,
      validityDays: form.validityDays,
      requiredChecklist: form.checklist,
    });
    if (!rules.success) {
      // Map the rules' paths back onto the form's field names.
      const formField: Record<string, string> = {
        minVoltageHeadroom: "minVoltageHeadroomPct",
        minCurrentHeadroom: "minCurrentHeadroomPct",
        minThermalHeadroom: "minThermalHeadroomPct",
        requiredChecklist: "checklist",
      };
      for (const issue of rules.error.issues) {
        const key = String(issue.path[0] ?? "checklist");
        ctx.addIssue({ code: "custom", path: [formField[key] ?? key], message: issue.message });
      }
      return z.NEVER;
    }
    return { rules: rules.data, note: form.note };
  });

export type PolicyFormInput = z.output<typeof policyFormSchema>;

/** The checklist as the form shows it. */
export function formatChecklistLines(items: ClearancePolicyRules["requiredChecklist"]): string {
  return items.map((i) => `${i.id} | ${i.text} | ${i.source}`).join("\n");
}
