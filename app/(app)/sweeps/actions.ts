"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { recordSweep, SweepRefusedError } from "@/lib/db/sweeps";
import { recordInputFromEntry, sweepEntrySchema } from "@/lib/validation/sweep";
import { invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/** A sweep typed into the grid. Members may record sweeps. */
export async function recordTypedSweep(input: unknown): Promise<ActionResult<{ id: string }>> {
  return guardAction("member", async (user) => {
    const parsed = sweepEntrySchema.safeParse(input);
    if (!parsed.success) return invalid(parsed.error, "Some fields or readings need attention; nothing was saved.");
    try {
      const sweep = await recordSweep(user.scope, recordInputFromEntry(parsed.data), "hand");
      revalidatePath("/sweeps");
      return { ok: true, data: { id: sweep.id }, message: "Sweep saved." };
    } catch (error) {
      if (error instanceof SweepRefusedError) return refused(`${error.message} Nothing was saved.`, { [error.field]: [error.message] });
      throw error;
    }
  });
}
