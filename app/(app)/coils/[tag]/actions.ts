"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { CoilNotFoundError, setCoilStatus } from "@/lib/db/coils";
import { addComponent, ComponentStateError, replaceComponent } from "@/lib/db/components";
import { addTopLoad, retireTopLoad, TopLoadStateError } from "@/lib/db/top-loads";
import { coilStatusChangeSchema } from "@/lib/validation/coil";
import { componentSchema, replaceComponentSchema } from "@/lib/validation/component";
import { retireTopLoadSchema, topLoadSchema } from "@/lib/validation/top-load";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

const fields = (form: FormData) => Object.fromEntries([...form.entries()].filter(([key]) => !key.startsWith("$ACTION")));

export async function changeCoilStatus(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("steward", async (user) => {
    const parsed = coilStatusChangeSchema.safeParse({ coilId: form.get("coilId"), status: form.get("status") });
    if (!parsed.success) return invalid(parsed.error);
    try {
      const coil = await setCoilStatus(user.scope, parsed.data.coilId, parsed.data.status);
      revalidatePath(`/coils/${coil.tag}`);
      return { ok: true, data: null, message: `Status set to ${coil.status}.` };
    } catch (error) {
      if (error instanceof CoilNotFoundError) return refused("That coil no longer exists.");
      throw error;
    }
  });
}

export async function addTopLoadAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("steward", async (user) => {
    const parsed = topLoadSchema.safeParse(fields(form));
    if (!parsed.success) return invalid(parsed.error, "The top load was not added: some fields need attention.", echoForm(form));
    try {
      const { coilTag } = await addTopLoad(user.scope, parsed.data);
      revalidatePath(`/coils/${coilTag}`);
      return { ok: true, data: null, message: coilTag };
    } catch (error) {
      if (error instanceof TopLoadStateError) return refused(error.message, {}, echoForm(form));
      throw error;
    }
  });
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}#top-loads`);
  return result;
}

export async function retireTopLoadAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("steward", async (user) => {
    const parsed = retireTopLoadSchema.safeParse(fields(form));
    if (!parsed.success) return invalid(parsed.error);
    try {
      const { topLoad, coilTag } = await retireTopLoad(user.scope, parsed.data.topLoadId);
      revalidatePath(`/coils/${coilTag}`);
      return { ok: true, data: null, message: `Retired “${topLoad.name}”.` };
    } catch (error) {
      if (error instanceof TopLoadStateError) return refused(error.message);
      throw error;
    }
  });
}

export async function addComponentAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("steward", async (user) => {
    const parsed = componentSchema.safeParse(fields(form));
    if (!parsed.success) return invalid(parsed.error, "The part was not added: some fields need attention.", echoForm(form));
    try {
      const { coilTag } = await addComponent(user.scope, parsed.data);
      revalidatePath(`/coils/${coilTag}`);
      return { ok: true, data: null, message: coilTag };
    } catch (error) {
      if (error instanceof ComponentStateError) return refused(error.message, {}, echoForm(form));
      throw error;
    }
  });
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}#parts`);
  return result;
}

export async function replaceComponentAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("steward", async (user) => {
    const parsed = replaceComponentSchema.safeParse(fields(form));
    if (!parsed.success) return invalid(parsed.error, "Nothing was changed: some fields need attention.", echoForm(form));
    try {
      const { coilTag } = await replaceComponent(user.scope, parsed.data);
      revalidatePath(`/coils/${coilTag}`);
      return { ok: true, data: null, message: coilTag };
    } catch (error) {
      if (error instanceof ComponentStateError) return refused(`Nothing was changed: ${error.message}`, {}, echoForm(form));
      throw error;
    }
  });
  if (result.ok) redirect(`/coils/${encodeURIComponent(result.message!)}#parts`);
  return result;
}
