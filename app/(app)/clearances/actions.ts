"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { ClearanceRefusedError, signClearance } from "@/lib/db/clearances";
import { getCurrentPolicy } from "@/lib/db/policy";
import { clearanceDecisionSchema, readChecklistAnswers } from "@/lib/validation/clearance";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/** Signs a clearance decision. The rules are evaluated again on the server; the form's view of them is never trusted. */
export async function signClearanceAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<string>("steward", async (user) => {
    const policy = await getCurrentPolicy(user.scope);
    const parsed = clearanceDecisionSchema.safeParse({
      coilId: form.get("coilId"),
      verdict: form.get("verdict") ?? undefined,
      checklist: readChecklistAnswers(form, policy.rules.requiredChecklist.map((i) => i.id)),
      maxSupplyVoltageV: form.get("maxSupplyVoltageV"),
      maxRunS: form.get("maxRunS"),
      conditions: form.get("conditions") ?? "",
    });
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention.", echoForm(form));
    try {
      const clearance = await signClearance(user.scope, parsed.data);
      return { ok: true, data: clearance.id };
    } catch (error) {
      if (error instanceof ClearanceRefusedError) {
        // Each unticked box is marked at the box; the failed checks (if any) once, at the decision.
        const fieldErrors: Record<string, string[]> = Object.fromEntries(error.uncheckedItemIds.map((id) => [`check:${id}`, ["Not ticked: confirm this item to clear the coil."]]));
        const checks = error.failedChecks;
        if (checks.length > 0) fieldErrors.verdict = [`Failing: ${checks.map((r) => r.label).join("; ")}.`];
        return refused(error.message, fieldErrors, echoForm(form));
      }
      throw error;
    }
  });
  if (!result.ok) return result;
  revalidatePath("/");
  revalidatePath("/clearances");
  redirect(`/clearances/${result.data}`);
}
