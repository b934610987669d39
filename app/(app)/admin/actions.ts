"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { hashPassword } from "@/lib/auth/password";
import { createUser, DuplicateEmailError, LastAdminError, updateUserAccess } from "@/lib/db/users";
import { newUserSchema, updateAccessSchema } from "@/lib/validation/user";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

export async function addUser(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = newUserSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error, undefined, echoForm(form));
    try {
      const user = await createUser(admin.id, { ...parsed.data, passwordHash: await hashPassword(parsed.data.password) });
      revalidatePath("/admin");
      return { ok: true, data: null, message: `Added ${user.name} as ${user.role}.` };
    } catch (error) {
      if (error instanceof DuplicateEmailError) return refused(error.message, { email: [error.message] }, echoForm(form));
      throw error;
    }
  });
}

export async function changeAccess(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = updateAccessSchema.safeParse({
      userId: form.get("userId"),
      role: form.get("role") || undefined,
      active: form.get("active") || undefined,
    });
    if (!parsed.success) return invalid(parsed.error);
    try {
      const user = await updateUserAccess(admin.id, parsed.data.userId, { role: parsed.data.role, active: parsed.data.active });
      revalidatePath("/admin");
      return { ok: true, data: null, message: `${user.name}: ${user.role}, ${user.active ? "active" : "deactivated"}.` };
    } catch (error) {
      if (error instanceof LastAdminError) return refused(error.message);
      throw error;
    }
  });
}
