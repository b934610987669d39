/**
 * What a signed-in user may reach: their account and the sites they belong to, with their role at each.
 * One read per request (lib/auth/session.ts caches it for the request).
 */
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
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

interface AccessRow {
  id: string;
  email: string;
  name: string;
  active: boolean;
  organisationAdmin: boolean;
  siteId: string | null;
  siteSlug: string | null;
  siteName: string | null;
  role: Role | null;
}

/**
 * Read on every request, so raw (lib/db/raw-read.ts says why): the account and its memberships in one statement.
 * test/site-access-raw.test.ts checks it against the query API's answer on SQLite and PostgreSQL.
 */
export async function getUserAccess(userId: string): Promise<UserAccess | null> {
  const rows = await readRows<AccessRow>(Prisma.sql`
    SELECT "User"."id", "User"."email", "User"."name", "User"."active", "User"."organisationAdmin",
      "Site"."id" AS "siteId", "Site"."slug" AS "siteSlug", "Site"."name" AS "siteName", "SiteMembership"."role"
    FROM "User"
    LEFT JOIN "SiteMembership" ON "SiteMembership"."userId" = "User"."id"
    LEFT JOIN "Site" ON "Site"."id" = "SiteMembership"."siteId"
    WHERE "User"."id" = ${userId}`);
  const user = rows[0];
  if (!user) return null;
  const sites: SiteRole[] = user.organisationAdmin
    ? (await readRows<SiteRef>(Prisma.sql`SELECT "id", "slug", "name" FROM "Site"`)).map((site) => ({ ...site, role: "admin" as const }))
    : rows.flatMap((row) => (row.siteId !== null && row.siteSlug !== null && row.siteName !== null && row.role !== null ? [{ id: row.siteId, slug: row.siteSlug, name: row.siteName, role: row.role }] : []));
  sites.sort((a, b) => a.name.localeCompare(b.name));
  return { id: user.id, email: user.email, name: user.name, active: Boolean(user.active), organisationAdmin: Boolean(user.organisationAdmin), sites };
}
