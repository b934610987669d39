"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { CoilEditConflictError, CoilNotFoundError, createCoil, DuplicateTagError, updateCoil } from "@/lib/db/coils";
import { importLogbook, ImportConflictError, type ImportSummary } from "@/lib/db/import";
import { asksToCountTurns, coilSchema, coilUpdateSchema } from "@/lib/validation/coil";
import { describeLogbookIssues, importOptionsSchema, logbookDocumentSchema } from "@/lib/validation/export";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";
import { formatCount } from "@/lib/units/format";

function formObject(form: FormData): Record<string, FormDataEntryValue> {
  return Object.fromEntries([...form.entries()].filter(([key]) => !key.startsWith("$ACTION")));
}

export async function createCoilAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("steward", async (user) => {
    const parsed = coilSchema.safeParse(formObject(form));
    if (!parsed.success) return invalid(parsed.error, "The coil was not added: some fields need attention.", echoForm(form));
    try {
      await createCoil(user.scope, parsed.data);
    } catch (error) {
      if (error instanceof DuplicateTagError) return refused(error.message, { tag: [`Tag: ${error.message}.`] }, echoForm(form));
      throw error;
    }
    revalidatePath("/coils");
    return { ok: true, data: null, message: parsed.data.tag };
  });
  // Redirect outside the guard so the navigation is not caught as an error.
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}?added=${asksToCountTurns(form.get("turns")) ? "counted" : "typed"}`);
  return result;
}

export async function updateCoilAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("steward", async (user) => {
    const parsed = coilUpdateSchema.safeParse(formObject(form));
    if (!parsed.success) return invalid(parsed.error, "Nothing was saved: some fields need attention.", echoForm(form));
    try {
      const coil = await updateCoil(user.scope, parsed.data);
      revalidatePath(`/coils/${coil.tag}`);
      revalidatePath("/coils");
      return { ok: true, data: null, message: coil.tag };
    } catch (error) {
      if (error instanceof CoilNotFoundError) return refused("That coil no longer exists.");
      if (error instanceof CoilEditConflictError) return refused(error.message, {}, echoForm(form));
      throw error;
    }
  });
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}?saved=${asksToCountTurns(form.get("turns")) ? "counted" : "typed"}`);
  return result;
}

export async function importLogbookAction(_previous: ActionResult<ImportSummary> | null, form: FormData): Promise<ActionResult<ImportSummary>> {
  return guardAction("steward", async (user) => {
    const values = { asTag: String(form.get("asTag") ?? "") };
    const options = importOptionsSchema.safeParse(values);
    if (!options.success) return invalid(options.error, "Nothing was imported: the new tag is not valid.", values);
    const file = form.get("file");
    const text = file instanceof File && file.size > 0 ? await file.text() : String(form.get("json") ?? "");
    if (text.trim() === "") return refused("Nothing was imported: choose a logbook file or paste its JSON.", { file: ["Choose a .json file exported from Coilyard."] }, values);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch (error) {
      return refused(`Nothing was imported: the file is not valid JSON (${(error as Error).message}).`, { file: ["Not valid JSON."] }, values);
    }
    const parsed = logbookDocumentSchema.safeParse(body);
    if (!parsed.success) {
      const lines = describeLogbookIssues(parsed.error);
      return refused(`Nothing was imported. Fix these fields in the file: ${lines.join("; ")}`, { file: lines }, values);
    }
    try {
      const summary = await importLogbook(user.scope, parsed.data, { asTag: options.data.asTag });
      revalidatePath("/coils");
      const people = summary.unknownPeople.length ? ` ${formatCount(summary.unknownPeople.length, "person", "people")} in the file ${summary.unknownPeople.length === 1 ? "is" : "are"} not on this install; their names were left blank.` : "";
      return { ok: true, data: summary, message: `Imported ${summary.coils.map((c) => `${c.tag} (${formatCount(c.records, "record")})`).join(", ")}.${people}` };
    } catch (error) {
      if (error instanceof ImportConflictError) return refused(`Nothing was imported: ${error.message}`, { asTag: [error.message] }, values);
      throw error;
    }
  });
}
