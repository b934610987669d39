/**
 * Direct database access for integration tests only: resetting between tests and checking what was
 * (or was not) stored. Application code goes through lib/db's queries and mutations.
 */
import { createPrismaClient, prisma } from "../../lib/db/client";
import { Prisma } from "../../lib/db/generated/client";
import { hashPassword } from "../../lib/auth/password";
import { emptyDatabase } from "../../lib/db/demo-loader";
import { DEFAULT_SITE_ID, type SiteScope } from "../../lib/db/site-scope";
import type { Role } from "../../lib/auth/roles";

export const testDb = prisma;

/**
 * Empties every table so each test starts from nothing but the default site "site-main" (DEFAULT_SITE_ID), as a
 * freshly migrated database holds (the same routine the demo reset uses).
 */
export const resetDatabase = emptyDatabase;

// One hash reused by every test user: bcrypt at cost 12 takes ~0.25 s a hash.
let cachedHash: Promise<string> | undefined;
export const TEST_PASSWORD = "bench-test-pass-1";

/**
 * A user holding `role` at one site (the default site unless `siteId` says otherwise). `role` is echoed on the result,
 * as it was when roles were global, so tests can still read `user.role`.
 */
export async function makeUser(email: string, role: Role, name = email.split("@")[0]!, siteId: string = DEFAULT_SITE_ID) {
  cachedHash ??= hashPassword(TEST_PASSWORD);
  const user = await prisma.user.create({ data: { email, name, passwordHash: await cachedHash, memberships: { create: { siteId, role } } } });
  return { ...user, role };
}

/** A user with `role` at a site: `makeUserAtSite(site.id, "steward", "s@north.test")`. */
export function makeUserAtSite(siteId: string, role: Role, email: string, name?: string) {
  return makeUser(email, role, name, siteId);
}

/** An organisation admin (admin at every site), member of no site unless `siteId` is given. */
export async function makeOrganisationAdmin(email: string, name = email.split("@")[0]!, siteId?: string) {
  cachedHash ??= hashPassword(TEST_PASSWORD);
  return prisma.user.create({
    data: { email, name, passwordHash: await cachedHash, organisationAdmin: true, ...(siteId ? { memberships: { create: { siteId, role: "admin" as const } } } : {}) },
  });
}

/** Adds an existing user to another site with a role there. */
export function addMembership(userId: string, siteId: string, role: Role) {
  return prisma.siteMembership.create({ data: { userId, siteId, role } });
}

/** A site: `createSite("north")` makes id "site-north", slug "north", name "North". */
export function createSite(slug: string, name = slug.charAt(0).toUpperCase() + slug.slice(1)) {
  return prisma.site.create({ data: { id: `site-${slug}`, slug, name } });
}

/** The scope a lib/db call takes: who acts, at which site. */
export function siteScope(siteId: string, actorId: string | null): SiteScope {
  return { siteId, actorId };
}

/** The default site's scope for `actorId`: what a single-club test passes. */
export function mainScope(actorId: string | null): SiteScope {
  return siteScope(DEFAULT_SITE_ID, actorId);
}

/**
 * Every table's row count (one table a Prisma model), so a refusal can be shown to have stored nothing anywhere,
 * audit log included. Works on SQLite and PostgreSQL alike.
 */
export async function countAllRows(): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of MODEL_NAMES) {
    const [row] = await prisma.$queryRawUnsafe<{ n: bigint | number }[]>(`SELECT COUNT(*) AS n FROM "${table}"`);
    counts[table] = Number(row!.n);
  }
  return counts;
}

/** A second connection, to another database, for tests that move data between two. */
export const openDatabase = createPrismaClient;

/** Every model (table) of the schema. */
export const MODEL_NAMES: readonly string[] = Object.values(Prisma.ModelName);

/** Prisma's SQL template helpers, for tests that compare two ways of running one statement. */
export const sql = Prisma.sql;
export const rawSql = Prisma.raw;
export const joinSql = Prisma.join;
export type Sql = Prisma.Sql;
