"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { setCoilStatus } from "@/lib/db/coils";
import { coilStatusChangeSchema } from "@/lib/validation/coil";
import { invalid, type ActionResult } from "@/lib/validation/action-result";

export async function changeCoilStatus(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("steward", async (user) => {
    const parsed = coilStatusChangeSchema.safeParse({ coilId: form.get("coilId"), status: form.get("status") });
    if (!parsed.success) return invalid(parsed.error);
    const coil = await setCoilStatus(user.id, parsed.data.coilId, parsed.data.status);
    revalidatePath(`/coils/${coil.tag}`);
    return { ok: true, data: null, message: `Status set to ${coil.status}.` };
  });
}
