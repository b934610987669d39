/**
 * Sites and who belongs to them. An organisation admin lists, creates and renames sites and manages every membership;
 * a site admin manages the memberships of their own site only (the scope's site): another site's member is simply
 * not found. Every write runs in one transaction with its audit event; membership writes that could remove a site's
 * last admin run at Serializable isolation (users.ts `assertAdminsRemain` says why).
 */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import type { SiteScope } from "./site-scope";
import { assertAdminsRemain, assertMayManageSite, assertOrganisationAdmin, isOrganisationAdmin, UserNotFoundError } from "./users";
import type { Role } from "../auth/roles";
import type { SiteRef } from "./site-access";

export interface SiteOverview extends SiteRef {
  members: number;
  coils: number;
  createdAt: Date;
}

/** The sites the actor may see: every site for an organisation admin, else the ones they belong to. By name. */
export async function listSites(scope: SiteScope): Promise<SiteOverview[]> {
  const everything = await isOrganisationAdmin(prisma, scope.actorId);
  const sites = await prisma.site.findMany({
    where: everything ? {} : { memberships: { some: { userId: scope.actorId ?? "" } } },
    select: { id: true, slug: true, name: true, createdAt: true, _count: { select: { memberships: true, coils: true } } },
    orderBy: { name: "asc" },
  });
  return sites.map(({ _count, ...site }) => ({ ...site, members: _count.memberships, coils: _count.coils }));
}

/** A site by slug, when the actor may reach it (a member, or an organisation admin); null otherwise. */
export async function findReachableSite(actorId: string, slug: string): Promise<SiteRef | null> {
  const everything = await isOrganisationAdmin(prisma, actorId);
  return prisma.site.findFirst({
    where: { slug, ...(everything ? {} : { memberships: { some: { userId: actorId } } }) },
    select: { id: true, slug: true, name: true },
  });
}

/** A site by its short name, for scripts run on the server (no actor to scope by). */
export function findSiteBySlug(slug: string): Promise<SiteRef | null> {
  return prisma.site.findUnique({ where: { slug }, select: { id: true, slug: true, name: true } });
}

export class DuplicateSiteSlugError extends Error {
  constructor(readonly slug: string) {
    super(`A site with the short name "${slug}" already exists`);
  }
}

export class SiteNotFoundError extends Error {
  constructor() {
    super("No such site");
  }
}

/** Creates a site (organisation admins only). */
export async function createSite(scope: SiteScope, input: { slug: string; name: string }): Promise<SiteRef> {
  return prisma.$transaction(async (tx) => {
    await assertOrganisationAdmin(tx, scope.actorId);
    if (await tx.site.findUnique({ where: { slug: input.slug }, select: { id: true } })) throw new DuplicateSiteSlugError(input.slug);
    const site = await tx.site.create({ data: { slug: input.slug, name: input.name.trim() }, select: { id: true, slug: true, name: true } });
    await recordAudit(tx, { siteId: null, actorId: scope.actorId, action: "create", entity: "Site", entityId: site.id, summary: `Created site ${site.name} (${site.slug})` });
    return site;
  });
}

/** Renames a site and/or changes its short name (organisation admins only). */
export async function renameSite(scope: SiteScope, siteId: string, input: { slug: string; name: string }): Promise<SiteRef> {
  return prisma.$transaction(async (tx) => {
    await assertOrganisationAdmin(tx, scope.actorId);
    const before = await tx.site.findUnique({ where: { id: siteId }, select: { slug: true, name: true } });
    if (!before) throw new SiteNotFoundError();
    if (input.slug !== before.slug && (await tx.site.findUnique({ where: { slug: input.slug }, select: { id: true } }))) throw new DuplicateSiteSlugError(input.slug);
    const site = await tx.site.update({ where: { id: siteId }, data: { slug: input.slug, name: input.name.trim() }, select: { id: true, slug: true, name: true } });
    if (site.slug !== before.slug || site.name !== before.name) {
      await recordAudit(tx, {
        siteId: null,
        actorId: scope.actorId,
        action: "update",
        entity: "Site",
        entityId: siteId,
        summary: `Site ${before.name} (${before.slug}) → ${site.name} (${site.slug})`,
        detail: { before, after: { slug: site.slug, name: site.name } },
      });
    }
    return site;
  });
}

export class AccountNotFoundError extends Error {
  constructor(readonly email: string) {
    super(`No account uses ${email}; create a new one instead`);
  }
}

export class AlreadyMemberError extends Error {
  constructor(name: string, siteName: string) {
    super(`${name} already belongs to ${siteName}`);
  }
}

/** Adds an existing account, found by e-mail, to the scope's site with `role`. */
export async function addMemberByEmail(scope: SiteScope, input: { email: string; role: Role }) {
  const email = input.email.trim().toLowerCase();
  return prisma.$transaction(async (tx) => {
    await assertMayManageSite(tx, scope);
    const user = await tx.user.findUnique({ where: { email }, select: { id: true, name: true, memberships: { where: { siteId: scope.siteId }, select: { role: true } } } });
    if (!user) throw new AccountNotFoundError(email);
    const site = await tx.site.findUniqueOrThrow({ where: { id: scope.siteId }, select: { name: true } });
    if (user.memberships.length > 0) throw new AlreadyMemberError(user.name, site.name);
    await tx.siteMembership.create({ data: { userId: user.id, siteId: scope.siteId, role: input.role } });
    await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "create", entity: "User", entityId: user.id, summary: `${user.name} joined ${site.name} as ${input.role}` });
    return { id: user.id, name: user.name, role: input.role };
  });
}

/** Removes a member from the scope's site (the account stays, with its other sites). The site keeps an admin. */
export async function removeMember(scope: SiteScope, userId: string) {
  return serializableTransaction(async (tx) => {
    await assertMayManageSite(tx, scope);
    const membership = await tx.siteMembership.findUnique({
      where: { userId_siteId: { userId, siteId: scope.siteId } },
      select: { role: true, user: { select: { name: true } }, site: { select: { name: true } } },
    });
    if (!membership) throw new UserNotFoundError();
    await tx.siteMembership.delete({ where: { userId_siteId: { userId, siteId: scope.siteId } } });
    await assertAdminsRemain(tx, [scope.siteId], false);
    await recordAudit(tx, {
      siteId: scope.siteId,
      actorId: scope.actorId,
      action: "delete",
      entity: "User",
      entityId: userId,
      summary: `${membership.user.name} left ${membership.site.name} (was ${membership.role})`,
    });
    return { name: membership.user.name };
  });
}
