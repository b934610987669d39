"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { PolicyRefusedError, saveDefaultPolicyVersion, saveSitePolicyVersion } from "@/lib/db/policy";
import { policyFormSchema } from "@/lib/validation/policy";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";
import type { PolicyField } from "@/lib/calc/policy-tightening";

function readPolicyForm(form: FormData) {
  return policyFormSchema.safeParse({
    minVoltageHeadroomPct: form.get("minVoltageHeadroomPct"),
    minCurrentHeadroomPct: form.get("minCurrentHeadroomPct"),
    minThermalHeadroomPct: form.get("minThermalHeadroomPct"),
    minJunctionMarginK: form.get("minJunctionMarginK"),
    acceptEstimatedMargins: form.get("acceptEstimatedMargins") ?? "",
    ituRegion: form.get("ituRegion"),
    maxSweepAgeDays: form.get("maxSweepAgeDays"),
    minFailureFreeSessions: form.get("minFailureFreeSessions"),
    validityDays: form.get("validityDays"),
    checklist: form.get("checklist"),
    note: form.get("note") ?? "",
  });
}

/** The form field a policy rule is entered in. */
const FORM_FIELD: Partial<Record<PolicyField, string>> = {
  minVoltageHeadroom: "minVoltageHeadroomPct",
  minCurrentHeadroom: "minCurrentHeadroomPct",
  minThermalHeadroom: "minThermalHeadroomPct",
  requiredChecklist: "checklist",
};

function refusal(error: unknown, form: FormData) {
  if (!(error instanceof PolicyRefusedError)) throw error;
  const fieldErrors: Record<string, string[]> = {};
  for (const finding of error.findings) (fieldErrors[FORM_FIELD[finding.field] ?? finding.field] ??= []).push(finding.message);
  return refused(error.message, fieldErrors, echoForm(form));
}

/**
 * Saves the organisation's default as a new version (organisation admins: checked again in lib/db). Earlier versions,
 * the clearances that used them and every site's own tightening stay as they were.
 */
export async function saveDefaultPolicyAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (user) => {
    if (!user.organisationAdmin) return refused("Only an organisation admin can change the organisation's lending policy.");
    const parsed = readPolicyForm(form);
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention; nothing was saved.", echoForm(form));
    try {
      const saved = await saveDefaultPolicyVersion(user.scope, parsed.data.rules, parsed.data.note);
      revalidatePath("/admin/policy");
      return { ok: true, data: null, message: `Saved as version ${saved.version} of the organisation's policy.` };
    } catch (error) {
      return refusal(error, form);
    }
  });
}

/** Saves the current site's own rules as a new version; refused, field by field, where they are looser than the default. */
export async function saveSitePolicyAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (user) => {
    const parsed = readPolicyForm(form);
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention; nothing was saved.", echoForm(form));
    try {
      const saved = await saveSitePolicyVersion(user.scope, parsed.data.rules, parsed.data.note);
      revalidatePath("/admin/policy");
      return { ok: true, data: null, message: `Saved as version ${saved.version} of ${user.site.name}'s policy.` };
    } catch (error) {
      return refusal(error, form);
    }
  });
}
