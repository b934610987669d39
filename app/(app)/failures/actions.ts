"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { completePostMortem, createFailure } from "@/lib/db/failures";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { failureSchema, postMortemSchema, REPLACEMENT_RATING_FIELDS } from "@/lib/validation/failure";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

function refusal(error: unknown, values: Record<string, string>) {
  if (error instanceof RecordRefusedError) return refused(error.message, error.field === "_form" ? {} : { [error.field]: [error.message] }, values);
  throw error;
}

/** Records a failure (members and up); from a session, that session's outcome becomes "failed". */
export async function recordFailure(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<string>("member", async (user) => {
    const values = echoForm(form);
    const parsed = failureSchema.safeParse(values);
    if (!parsed.success) return invalid(parsed.error, "The failure was not recorded: some fields need attention.", values);
    try {
      const failure = await createFailure(user.scope, parsed.data);
      revalidatePath("/failures");
      revalidatePath("/sessions");
      revalidatePath(`/coils/${failure.coilTag}`);
      return { ok: true, data: failure.id };
    } catch (error) {
      return refusal(error, values);
    }
  });
  if (!result.ok) return result;
  redirect(`/failures/${result.data}`);
}

/** Completes a post-mortem, with the replacement part when one is given. Stewards only. */
export async function completePostMortemAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("steward", async (user) => {
    const values = echoForm(form);
    const field = (name: string) => values[`replacement.${name}`] ?? "";
    const replacement =
      values.replace === "on"
        ? {
            partNumber: field("partNumber"),
            manufacturer: field("manufacturer"),
            serial: field("serial"),
            installedAt: field("installedAt"),
            ...Object.fromEntries(REPLACEMENT_RATING_FIELDS.map((name) => [name, field(name)])),
          }
        : undefined;
    const parsed = postMortemSchema.safeParse({ failureId: values.failureId, mode: values.mode || undefined, rootCause: values.rootCause, correctiveAction: values.correctiveAction, replacement });
    if (!parsed.success) return invalid(parsed.error, "The post-mortem was not completed: some fields need attention.", values);
    try {
      const done = await completePostMortem(user.scope, parsed.data);
      revalidatePath(`/failures/${done.failureId}`);
      revalidatePath("/failures");
      revalidatePath("/coils", "layout");
      return { ok: true, data: null, message: done.replacementId ? "Post-mortem completed and the replacement part recorded." : "Post-mortem completed." };
    } catch (error) {
      return refusal(error, values);
    }
  });
}
