/**
 * Accounts and their access. An account is the organisation's (one e-mail, one password, active or not); what it may
 * do is per site, through its SiteMembership rows (sites.ts manages those), plus the organisation admin flag.
 * Password hashing happens in lib/auth before anything reaches here.
 *
 * Who acts comes in the scope: a site admin reaches the accounts that belong to their site (scope.siteId), an
 * organisation admin every account. An account outside the actor's reach is "not found", never "forbidden".
 */
import { prisma, type Tx } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import type { SiteScope } from "./site-scope";
import type { Role } from "../auth/roles";

export const publicUserSelect = {
  id: true,
  email: true,
  name: true,
  organisationAdmin: true,
  active: true,
  lastSignInAt: true,
  createdAt: true,
} as const;

/** A member of one site: the account and the role held there. */
export interface SiteMember {
  id: string;
  email: string;
  name: string;
  organisationAdmin: boolean;
  active: boolean;
  lastSignInAt: Date | null;
  createdAt: Date;
  role: Role;
  /** How many other sites the account belongs to (a site admin may not deactivate an account other sites use). */
  otherSites: number;
}

export function findUserForSignIn(email: string) {
  return prisma.user.findUnique({
    where: { email: email.trim().toLowerCase() },
    select: { id: true, email: true, name: true, active: true, organisationAdmin: true, passwordHash: true, memberships: { select: { siteId: true }, take: 1 } },
  });
}

export function getUserById(id: string) {
  return prisma.user.findUnique({ where: { id }, select: publicUserSelect });
}

/** Every member of the scope's site with their role there, active first, then by name. */
export async function listSiteMembers(scope: SiteScope): Promise<SiteMember[]> {
  const rows = await prisma.siteMembership.findMany({
    where: { siteId: scope.siteId },
    select: { role: true, user: { select: { ...publicUserSelect, _count: { select: { memberships: true } } } } },
  });
  return rows
    .map(({ role, user: { _count, ...user } }) => ({ ...user, role, otherSites: _count.memberships - 1 }))
    .sort((a, b) => Number(b.active) - Number(a.active) || a.name.localeCompare(b.name));
}

/** Every account with the sites it belongs to: the organisation admin's view. Refused (empty) for anyone else. */
export async function listAllUsers(scope: SiteScope) {
  if (!(await isOrganisationAdmin(prisma, scope.actorId))) return [];
  return prisma.user.findMany({
    select: { ...publicUserSelect, memberships: { select: { role: true, site: { select: { id: true, slug: true, name: true } } }, orderBy: { site: { name: "asc" } } } },
    orderBy: [{ active: "desc" }, { name: "asc" }],
  });
}

export function countUsers() {
  return prisma.user.count();
}

export async function markSignedIn(userId: string): Promise<void> {
  await prisma.$transaction(async (tx) => {
    await tx.user.update({ where: { id: userId }, data: { lastSignInAt: new Date() } });
    await recordAudit(tx, { siteId: null, actorId: userId, action: "sign-in", entity: "User", entityId: userId, summary: "Signed in" });
  });
}

export class DuplicateEmailError extends Error {
  constructor(readonly email: string) {
    super(`An account with the e-mail ${email} already exists`);
  }
}

/** The account is not a member of the scope's site (or does not exist): the same answer either way. */
export class UserNotFoundError extends Error {
  constructor() {
    super("No such user at this site");
  }
}

/** The actor lacks the authority the write needs (pages and actions check first; this is the data layer's own check). */
export class SiteAccessError extends Error {}

export async function isOrganisationAdmin(db: Tx | typeof prisma, userId: string | null): Promise<boolean> {
  if (!userId) return false;
  const user = await db.user.findUnique({ where: { id: userId }, select: { organisationAdmin: true, active: true } });
  return Boolean(user?.active && user.organisationAdmin);
}

/**
 * The actor may manage the scope's site: an organisation admin, or an active admin of that site. A null actor is a
 * script run on the server (create-admin, the demo loader) and may.
 */
export async function assertMayManageSite(tx: Tx, scope: SiteScope): Promise<void> {
  if (scope.actorId === null) return;
  const actor = await tx.user.findUnique({
    where: { id: scope.actorId },
    select: { active: true, organisationAdmin: true, memberships: { where: { siteId: scope.siteId }, select: { role: true } } },
  });
  if (actor?.active && (actor.organisationAdmin || actor.memberships[0]?.role === "admin")) return;
  throw new SiteAccessError("Managing this site's members needs an admin of the site.");
}

export async function assertOrganisationAdmin(tx: Tx, actorId: string | null): Promise<void> {
  if (actorId === null || (await isOrganisationAdmin(tx, actorId))) return;
  throw new SiteAccessError("This needs an organisation admin.");
}

/** Creates an account and makes it a member of the scope's site with `role`, in one transaction with its audit event. */
export async function createUser(scope: SiteScope, input: { email: string; name: string; role: Role; passwordHash: string }) {
  const email = input.email.trim().toLowerCase();
  return prisma.$transaction(async (tx) => {
    await assertMayManageSite(tx, scope);
    if (await tx.user.findUnique({ where: { email }, select: { id: true } })) throw new DuplicateEmailError(email);
    const site = await tx.site.findUniqueOrThrow({ where: { id: scope.siteId }, select: { name: true } });
    const user = await tx.user.create({
      data: { email, name: input.name.trim(), passwordHash: input.passwordHash, memberships: { create: { siteId: scope.siteId, role: input.role } } },
      select: publicUserSelect,
    });
    await recordAudit(tx, {
      siteId: scope.siteId,
      actorId: scope.actorId,
      action: "create",
      entity: "User",
      entityId: user.id,
      summary: `Added ${user.name} <${user.email}> as ${input.role} at ${site.name}`,
    });
    return { ...user, role: input.role };
  });
}

/**
 * Creates an organisation admin (scripts/create-admin.ts; or an organisation admin adding another). The account also
 * gets an admin membership of `siteId` when given, so it is listed among that site's members.
 */
export async function createOrganisationAdmin(actorId: string | null, input: { email: string; name: string; passwordHash: string; siteId?: string }) {
  const email = input.email.trim().toLowerCase();
  return prisma.$transaction(async (tx) => {
    await assertOrganisationAdmin(tx, actorId);
    if (await tx.user.findUnique({ where: { email }, select: { id: true } })) throw new DuplicateEmailError(email);
    const user = await tx.user.create({
      data: {
        email,
        name: input.name.trim(),
        passwordHash: input.passwordHash,
        organisationAdmin: true,
        ...(input.siteId ? { memberships: { create: { siteId: input.siteId, role: "admin" as const } } } : {}),
      },
      select: publicUserSelect,
    });
    await recordAudit(tx, { siteId: null, actorId, action: "create", entity: "User", entityId: user.id, summary: `Added ${user.name} <${user.email}> as an organisation admin` });
    return user;
  });
}

export class LastAdminError extends Error {
  constructor(message = "Coilyard must keep at least one active admin") {
    super(message);
  }
}

/**
 * The admin rule, checked inside the writing transaction after its write: every site in `siteIds` still has an active
 * admin member or the organisation has an active organisation admin (who is admin everywhere), and, when
 * `organisationToo`, the organisation still has an active organisation admin. Run it in a serializableTransaction:
 * two admins demoting each other at once would each still count the other (write skew); under SERIALIZABLE the
 * database refuses one of them and the retry re-reads.
 */
export async function assertAdminsRemain(tx: Tx, siteIds: readonly string[], organisationToo: boolean): Promise<void> {
  const organisationAdmins = await tx.user.count({ where: { organisationAdmin: true, active: true } });
  if (organisationToo && organisationAdmins === 0) throw new LastAdminError("The organisation must keep at least one active organisation admin");
  if (organisationAdmins > 0) return;
  for (const siteId of siteIds) {
    const admins = await tx.siteMembership.count({ where: { siteId, role: "admin", user: { active: true } } });
    if (admins === 0) {
      const site = await tx.site.findUnique({ where: { id: siteId }, select: { name: true } });
      throw new LastAdminError(`${site?.name ?? "This site"} must keep at least one active admin`);
    }
  }
}

/**
 * Changes a member's role at the scope's site and/or the account's active flag. The account must belong to the
 * scope's site (else UserNotFoundError). Deactivating locks the account out of every site, so a site admin may only
 * deactivate (or reactivate) an account that belongs to no other site; an organisation admin any.
 */
export async function updateUserAccess(scope: SiteScope, userId: string, change: { role?: Role; active?: boolean }) {
  return serializableTransaction(async (tx) => {
    await assertMayManageSite(tx, scope);
    const before = await tx.siteMembership.findUnique({
      where: { userId_siteId: { userId, siteId: scope.siteId } },
      select: { role: true, user: { select: { ...publicUserSelect, memberships: { select: { siteId: true } } } } },
    });
    if (!before) throw new UserNotFoundError();
    const { memberships, ...account } = before.user;
    const changesActive = change.active !== undefined && change.active !== account.active;
    if (changesActive && memberships.length > 1 && !(await isOrganisationAdmin(tx, scope.actorId)) && scope.actorId !== null) {
      throw new SiteAccessError(`${account.name} also belongs to other sites; remove them from this site instead, or ask an organisation admin.`);
    }
    const role = change.role ?? before.role;
    if (role !== before.role) await tx.siteMembership.update({ where: { userId_siteId: { userId, siteId: scope.siteId } }, data: { role } });
    const after = changesActive ? await tx.user.update({ where: { id: userId }, data: { active: change.active }, select: publicUserSelect }) : account;
    // A deactivated account stops counting at every site it belongs to.
    await assertAdminsRemain(tx, changesActive ? memberships.map((m) => m.siteId) : [scope.siteId], changesActive && account.organisationAdmin);
    const changes: string[] = [];
    if (before.role !== role) changes.push(`role ${before.role} → ${role}`);
    if (account.active !== after.active) changes.push(after.active ? "reactivated" : "deactivated");
    if (changes.length > 0) {
      await recordAudit(tx, {
        siteId: scope.siteId,
        actorId: scope.actorId,
        action: "update",
        entity: "User",
        entityId: userId,
        summary: `${after.name}: ${changes.join(", ")}`,
        detail: { before: { role: before.role, active: account.active }, after: { role, active: after.active } },
      });
    }
    return { ...after, role };
  });
}

/** Grants or withdraws organisation admin; only an organisation admin may, and one must remain. */
export async function setOrganisationAdmin(scope: SiteScope, userId: string, organisationAdmin: boolean) {
  return serializableTransaction(async (tx) => {
    await assertOrganisationAdmin(tx, scope.actorId);
    const before = await tx.user.findUnique({ where: { id: userId }, select: publicUserSelect });
    if (!before) throw new UserNotFoundError();
    if (before.organisationAdmin === organisationAdmin) return before;
    const after = await tx.user.update({ where: { id: userId }, data: { organisationAdmin }, select: publicUserSelect });
    const sites = await tx.siteMembership.findMany({ where: { userId }, select: { siteId: true } });
    await assertAdminsRemain(tx, sites.map((s) => s.siteId), true);
    await recordAudit(tx, {
      siteId: null,
      actorId: scope.actorId,
      action: "update",
      entity: "User",
      entityId: userId,
      summary: `${after.name}: ${organisationAdmin ? "made an organisation admin" : "no longer an organisation admin"}`,
    });
    return after;
  });
}
