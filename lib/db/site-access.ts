/**
 * What a signed-in user may reach: their account and the sites they belong to, with their role at each.
 * One read per request (lib/auth/session.ts caches it for the request).
 */
import { prisma } from "./client";
import type { Role } from "../auth/roles";

export interface SiteRef {
  id: string;
  slug: string;
  name: string;
}

export interface SiteRole extends SiteRef {
  role: Role;
}

export interface UserAccess {
  id: string;
  email: string;
  name: string;
  active: boolean;
  organisationAdmin: boolean;
  /** Sorted by name. An organisation admin is admin at every site. */
  sites: SiteRole[];
}

export async function getUserAccess(userId: string): Promise<UserAccess | null> {
  const user = await prisma.user.findUnique({
    where: { id: userId },
    select: {
      id: true,
      email: true,
      name: true,
      active: true,
      organisationAdmin: true,
      memberships: { select: { role: true, site: { select: { id: true, slug: true, name: true } } } },
    },
  });
  if (!user) return null;
  const sites: SiteRole[] = user.organisationAdmin
    ? (await prisma.site.findMany({ select: { id: true, slug: true, name: true } })).map((site) => ({ ...site, role: "admin" as const }))
    : user.memberships.map((m) => ({ ...m.site, role: m.role }));
  sites.sort((a, b) => a.name.localeCompare(b.name));
  return { id: user.id, email: user.email, name: user.name, active: user.active, organisationAdmin: user.organisationAdmin, sites };
}
