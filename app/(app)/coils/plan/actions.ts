"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import type { PlanPolicy } from "@/lib/analysis/build-plan";
import { guardAction } from "@/lib/auth/guard";
import type { SiteScope } from "@/lib/db/site-scope";
import { DuplicateTagError } from "@/lib/db/coils";
import { savePlannedCoil } from "@/lib/db/plans";
import { getCurrentPolicy } from "@/lib/db/policy";
import { invalid, refused, type ActionResult } from "@/lib/validation/action-result";
import { planSaveSchema, planVariantsJsonSchema } from "@/lib/validation/plan";
import { buildStoredPlan, describeComparison, workOutVariants, type PlanComparison } from "./compare-variants";

/** The lending policy of the site the plan is made at. */
async function currentPlanPolicy(scope: SiteScope): Promise<PlanPolicy & { version: number }> {
  const policy = await getCurrentPolicy(scope);
  const { ituRegion, minVoltageHeadroom, minThermalHeadroom, minJunctionMarginK } = policy.rules;
  return { version: policy.version, ituRegion, minVoltageHeadroom, minThermalHeadroom, minJunctionMarginK };
}

/** Works out every variant side by side. Any member may plan; nothing is stored. */
export async function comparePlanAction(_previous: ActionResult<PlanComparison> | null, form: FormData): Promise<ActionResult<PlanComparison>> {
  return guardAction("member", async (user) => {
    const raw = planVariantsJsonSchema.safeParse(form.get("variantsJson"));
    if (!raw.success) return invalid(raw.error, "The plan could not be read; reload the page.");
    const worked = workOutVariants(raw.data, await currentPlanPolicy(user.scope));
    if (!worked.ok) return refused(worked.message, worked.fieldErrors);
    return { ok: true, data: describeComparison(worked.variants, worked.results), message: `Worked out ${worked.variants.length} variant${worked.variants.length === 1 ? "" : "s"}.` };
  });
}

/** Saves the chosen variant as a coil in "planned" status with its parts, top load and the plan. Stewards only, as for adding a coil. */
export async function savePlanAction(_previous: ActionResult<PlanComparison> | null, form: FormData): Promise<ActionResult<PlanComparison>> {
  const result = await guardAction<PlanComparison>("steward", async (user) => {
    const save = planSaveSchema.safeParse({ tag: form.get("tag"), name: form.get("name"), builderName: form.get("builderName"), chosenVariant: form.get("chosenVariant") });
    if (!save.success) return invalid(save.error, "The plan was not saved: some fields need attention.");
    const raw = planVariantsJsonSchema.safeParse(form.get("variantsJson"));
    if (!raw.success) return invalid(raw.error, "The plan could not be read; reload the page.");
    if (save.data.chosenVariant >= raw.data.length) return refused("The plan was not saved: choose one of the variants shown.", { chosenVariant: ["Choose one of the variants shown."] });
    const policy = await currentPlanPolicy(user.scope);
    const worked = workOutVariants(raw.data, policy);
    if (!worked.ok) return refused(`The plan was not saved. ${worked.message}`, worked.fieldErrors);
    const now = new Date();
    const plan = buildStoredPlan(worked.variants, worked.results, save.data.chosenVariant, policy, now);
    try {
      await savePlannedCoil(user.scope, save.data, worked.variants[save.data.chosenVariant]!, plan, now);
    } catch (error) {
      if (error instanceof DuplicateTagError) return refused(`The plan was not saved: ${error.message}.`, { tag: [`Tag: ${error.message}.`] });
      throw error;
    }
    revalidatePath("/coils");
    return { ok: true, data: describeComparison(worked.variants, worked.results), message: save.data.tag };
  });
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}?planned=1`);
  return result;
}
