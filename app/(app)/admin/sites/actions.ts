"use server";

import { revalidatePath } from "next/cache";
import { guardAction } from "@/lib/auth/guard";
import type { CurrentUser } from "@/lib/auth/session";
import { createSite, DuplicateSiteSlugError, renameSite, SiteNotFoundError } from "@/lib/db/sites";
import { LastAdminError, setOrganisationAdmin, SiteAccessError, UserNotFoundError } from "@/lib/db/users";
import { renameSiteSchema, siteSchema } from "@/lib/validation/site";
import { organisationAdminSchema } from "@/lib/validation/user";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/** Organisation admins only: an admin of one site is an admin there, not of the organisation. */
function organisationOnly<T>(run: (user: CurrentUser) => Promise<ActionResult<T>>) {
  return guardAction<T>("admin", async (user) => (user.organisationAdmin ? run(user) : refused("This needs an organisation admin.")));
}

function refusedSiteWrite(error: unknown, form: FormData): ActionResult<null> {
  if (error instanceof DuplicateSiteSlugError) return refused(error.message, { slug: [error.message] }, echoForm(form));
  if (error instanceof SiteNotFoundError || error instanceof SiteAccessError) return refused(error.message, {}, echoForm(form));
  throw error;
}

export async function addSite(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return organisationOnly(async (user) => {
    const parsed = siteSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error, undefined, echoForm(form));
    try {
      const site = await createSite(user.scope, parsed.data);
      revalidatePath("/admin/sites");
      return { ok: true, data: null, message: `Created ${site.name}. Switch to it to add its first members.` };
    } catch (error) {
      return refusedSiteWrite(error, form);
    }
  });
}

export async function changeSiteName(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return organisationOnly(async (user) => {
    const parsed = renameSiteSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error, undefined, echoForm(form));
    try {
      const site = await renameSite(user.scope, parsed.data.siteId, parsed.data);
      revalidatePath("/", "layout");
      return { ok: true, data: null, message: `Saved: ${site.name} (${site.slug}).` };
    } catch (error) {
      return refusedSiteWrite(error, form);
    }
  });
}

export async function changeOrganisationAdmin(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  return organisationOnly(async (user) => {
    const parsed = organisationAdminSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return invalid(parsed.error);
    try {
      const changed = await setOrganisationAdmin(user.scope, parsed.data.userId, parsed.data.organisationAdmin);
      revalidatePath("/admin/sites");
      return { ok: true, data: null, message: `${changed.name} ${changed.organisationAdmin ? "is" : "is no longer"} an organisation admin.` };
    } catch (error) {
      if (error instanceof LastAdminError || error instanceof SiteAccessError) return refused(error.message);
      if (error instanceof UserNotFoundError) return refused("No such account.");
      throw error;
    }
  });
}
