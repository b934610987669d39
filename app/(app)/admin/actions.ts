"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import { hashPassword } from "@/lib/auth/password";
import { createUser, DuplicateEmailError, LastAdminError, SiteAccessError, updateUserAccess, UserNotFoundError } from "@/lib/db/users";
import { AccountNotFoundError, AlreadyMemberError, addMemberByEmail, removeMember } from "@/lib/db/sites";
import { existingMemberSchema, newUserSchema, removeMemberSchema, updateAccessSchema } from "@/lib/validation/user";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/** A refusal the data layer gave for a member write, as the form's message; anything else is a real error. */
function refusedMemberWrite(error: unknown): ActionResult<null> {
  if (error instanceof LastAdminError || error instanceof SiteAccessError) return refused(error.message);
  if (error instanceof UserNotFoundError) return refused("That person is not a member of this site.");
  throw error;
}

/** Creates a new account as a member of the current site. */
export async function addUser(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = newUserSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error, undefined, echoForm(form));
    try {
      const user = await createUser(admin.scope, { ...parsed.data, passwordHash: await hashPassword(parsed.data.password) });
      revalidatePath("/admin");
      // The header names the site; the message stays short.
      return { ok: true, data: null, message: `Added ${user.name} as ${user.role}.` };
    } catch (error) {
      if (error instanceof DuplicateEmailError) {
        const message = `${error.message}: add it to this site with "Add an existing account" instead.`;
        return refused(message, { email: [message] }, echoForm(form));
      }
      if (error instanceof SiteAccessError) return refused(error.message, {}, echoForm(form));
      throw error;
    }
  });
}

/** Adds an account that already exists (at another site) to the current site. */
export async function addExistingMember(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = existingMemberSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error, undefined, echoForm(form));
    try {
      const member = await addMemberByEmail(admin.scope, parsed.data);
      revalidatePath("/admin");
      return { ok: true, data: null, message: `${member.name} is now a ${member.role} at ${admin.site.name}.` };
    } catch (error) {
      if (error instanceof AccountNotFoundError || error instanceof AlreadyMemberError) return refused(error.message, { email: [error.message] }, echoForm(form));
      if (error instanceof SiteAccessError) return refused(error.message, {}, echoForm(form));
      throw error;
    }
  });
}

/** Changes a member's role at the current site and/or the account's active state. */
export async function changeAccess(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = updateAccessSchema.safeParse({
      userId: form.get("userId"),
      role: form.get("role") || undefined,
      active: form.get("active") || undefined,
    });
    if (!parsed.success) return invalid(parsed.error);
    try {
      const user = await updateUserAccess(admin.scope, parsed.data.userId, { role: parsed.data.role, active: parsed.data.active });
      revalidatePath("/admin");
      return { ok: true, data: null, message: `${user.name}: ${user.role} at ${admin.site.name}, ${user.active ? "active" : "deactivated"}.` };
    } catch (error) {
      return refusedMemberWrite(error);
    }
  });
}

/** Removes a member from the current site; the account keeps its other sites. */
export async function removeSiteMember(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return guardAction("admin", async (admin) => {
    const parsed = removeMemberSchema.safeParse({ userId: form.get("userId") });
    if (!parsed.success) return invalid(parsed.error);
    try {
      const removed = await removeMember(admin.scope, parsed.data.userId);
      revalidatePath("/admin");
      return { ok: true, data: null, message: `${removed.name} no longer belongs to ${admin.site.name}.` };
    } catch (error) {
      return refusedMemberWrite(error);
    }
  });
}
