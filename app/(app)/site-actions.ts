"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { SITE_COOKIE } from "@/lib/auth/session";
import { findReachableSite } from "@/lib/db/sites";
import { switchSiteSchema } from "@/lib/validation/site";
import { invalid, refused, type ActionResult } from "@/lib/validation/action-result";

/** A year: the site someone works at rarely changes, and the cookie names nothing secret (access is re-checked on every request). */
const SITE_COOKIE_MAX_AGE_S = 365 * 24 * 3600;

/**
 * Makes another site the current one (the site switcher, and the district view's drill-down), then opens its
 * dashboard: a page of the previous site's record would not be found at the new one. The cookie is only a
 * preference; lib/auth/session.ts checks on every request that the user may still reach the site it names.
 */
export async function switchSite(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<null>("member", async (user) => {
    const parsed = switchSiteSchema.safeParse({ slug: form.get("slug") });
    if (!parsed.success) return invalid(parsed.error, "Choose a site.");
    const site = await findReachableSite(user.id, parsed.data.slug);
    // Not found and not reachable answer alike, so the switcher does not tell which sites exist.
    if (!site) return refused("You do not belong to that site.", { slug: ["You do not belong to that site."] });
    (await cookies()).set(SITE_COOKIE, site.slug, { httpOnly: true, sameSite: "lax", path: "/", maxAge: SITE_COOKIE_MAX_AGE_S, secure: process.env.NEXTAUTH_URL?.startsWith("https:") ?? false });
    return { ok: true, data: null, message: `Now at ${site.name}.` };
  });
  if (result.ok) redirect("/");
  return result;
}
