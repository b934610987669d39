/**
 * Who is asking, and for which site, checked where the work happens. Server components, server actions and
 * route handlers call these; the proxy only redirects anonymous visitors and protects nothing by itself.
 *
 * The current site is the one named by the site cookie (set by the site switcher) when the user may reach it,
 * else their first site by name. Roles are per site: `role` is the role at the current site, and `scope` is
 * what every lib/db call takes, so a page can only ever read and write the current site's records.
 */
import { cache } from "react";
import { cookies } from "next/headers";
import { appEnv } from "../config/env";
import { countAuthStep } from "./auth-counters";
import { decodeSessionUserId, sessionTokenFrom } from "./session-token";
import { getUserAccess, type SiteRef, type SiteRole } from "../db/site-access";
import type { SiteScope } from "../db/site-scope";
import { hasRole, type Role } from "./roles";

export const SITE_COOKIE = "coilyard-site";

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  /** The role at the current site. */
  role: Role;
  organisationAdmin: boolean;
  site: SiteRef;
  /** Every site the user may switch to, with their role there. */
  sites: SiteRole[];
  scope: SiteScope;
}

export class AuthError extends Error {
  constructor(
    readonly status: 401 | 403,
    message: string,
  ) {
    super(message);
  }
}

/** Picks the current site: the requested one when reachable, else the first. Pure, for tests. */
export function chooseSite(sites: readonly SiteRole[], requestedSlug: string | undefined): SiteRole | undefined {
  return sites.find((site) => site.slug === requestedSlug) ?? sites[0];
}

/**
 * The signed-in, active user at their current site, or null when anonymous. Reads the database so role and
 * membership changes apply at once; cached for the request, so a page, its layout and its sections share one
 * check. Throws AuthError 403 for an account that belongs to no site.
 *
 * The token is decoded directly (session-token.ts says why that is all next-auth's getServerSession checks): an
 * expired, forged or missing token is anonymous; the database then decides whether the account may still sign in.
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  countAuthStep("signInChecks");
  const cookieStore = await cookies();
  const id = await decodeSessionUserId(sessionTokenFrom(cookieStore.getAll()), appEnv().NEXTAUTH_SECRET);
  if (!id) return null;
  const access = await getUserAccess(id);
  if (!access || !access.active) return null;
  const site = chooseSite(access.sites, cookieStore.get(SITE_COOKIE)?.value);
  if (!site) throw new AuthError(403, "Your account does not belong to any site yet. Ask an admin to add you to one.");
  return {
    id: access.id,
    email: access.email,
    name: access.name,
    role: site.role,
    organisationAdmin: access.organisationAdmin,
    site: { id: site.id, slug: site.slug, name: site.name },
    sites: access.sites,
    scope: { siteId: site.id, actorId: access.id },
  };
});

/** The current user with at least `role` at the current site; throws AuthError (401 anonymous, 403 not allowed). */
export async function requireRole(role: Role): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw new AuthError(401, "Sign in to continue.");
  if (!hasRole(user.role, role)) throw new AuthError(403, `This needs the ${role} role at ${user.site.name}; you are a ${user.role} there.`);
  return user;
}

export function requireUser(): Promise<CurrentUser> {
  return requireRole("member");
}

/** An organisation admin (manages sites and the organisation's default policy; sees the district view). */
export async function requireOrganisationAdmin(): Promise<CurrentUser> {
  const user = await requireRole("member");
  if (!user.organisationAdmin) throw new AuthError(403, "This needs an organisation admin.");
  return user;
}
