"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { createSession } from "@/lib/db/sessions";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { sessionSchema } from "@/lib/validation/session";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/**
 * Logs a run session with its heat-sink samples, then opens its page. Members and up. The form's hidden
 * clientKey makes a double tap or a resend open the session already stored instead of storing a second one.
 */
export async function logSession(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<string>("member", async (user) => {
    const values = echoForm(form);
    const parsed = sessionSchema.safeParse(values);
    if (!parsed.success) return invalid(parsed.error, "The session was not saved: some fields need attention.", values);
    try {
      const session = await createSession(user.scope, parsed.data);
      revalidatePath("/sessions");
      revalidatePath(`/coils/${session.coilTag}`);
      return { ok: true, data: session.id };
    } catch (error) {
      if (error instanceof RecordRefusedError) return refused(error.message, { [error.field]: [error.message] }, values);
      throw error;
    }
  });
  if (!result.ok) return result;
  redirect(`/sessions/${result.data}`);
}
