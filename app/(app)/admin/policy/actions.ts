"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { savePolicyVersion } from "@/lib/db/policy";
import { policyFormSchema } from "@/lib/validation/policy";
import { echoForm, invalid, type ActionResult } from "@/lib/validation/action-result";

/** Saves the lending policy as a new version; earlier versions and the clearances that used them stay as they were. */
export async function savePolicyAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (user) => {
    const parsed = policyFormSchema.safeParse({
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
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention; nothing was saved.", echoForm(form));
    const saved = await savePolicyVersion(user.id, parsed.data.rules, parsed.data.note);
    revalidatePath("/admin/policy");
    return { ok: true, data: null, message: `Saved as version ${saved.version}.` };
  });
}
