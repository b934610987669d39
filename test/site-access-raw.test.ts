/**
 * getUserAccess (read on every request by lib/auth/session.ts) goes through $queryRaw; here its answer is compared
 * with the query API asking the same question — the account, its memberships with each site's role, sorted by site
 * name; an organisation admin as admin everywhere — same values and types, on SQLite and on PostgreSQL.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { addMembership, createSite, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { getUserAccess, type SiteRole, type UserAccess } from "@/lib/db/site-access";

/** The query API's answer, as getUserAccess gave it before it went raw. */
async function accessThroughQueryApi(userId: string): Promise<UserAccess | null> {
  const user = await testDb.user.findUnique({
    where: { id: userId },
    select: { id: true, email: true, name: true, active: true, organisationAdmin: true, memberships: { select: { role: true, site: { select: { id: true, slug: true, name: true } } } } },
  });
  if (!user) return null;
  const sites: SiteRole[] = user.organisationAdmin
    ? (await testDb.site.findMany({ select: { id: true, slug: true, name: true } })).map((site) => ({ ...site, role: "admin" as const }))
    : user.memberships.map((m) => ({ ...m.site, role: m.role }));
  sites.sort((a, b) => a.name.localeCompare(b.name));
  return { id: user.id, email: user.email, name: user.name, active: user.active, organisationAdmin: user.organisationAdmin, sites };
}

describe("getUserAccess (raw) against the query API", () => {
  beforeEach(resetDatabase);

  it("gives the same account, sites, roles and order for members of one site, several, none, inactive and organisation admins", async () => {
    const north = await createSite("north", "Northgate Academy");
    const annex = await createSite("annex", "Annex Lab");
    const member = await makeUser("m@club.test", "member");
    const several = await makeUser("s@club.test", "steward");
    await addMembership(several.id, north.id, "admin");
    await addMembership(several.id, annex.id, "member");
    const nowhere = await makeUser("n@club.test", "member");
    await testDb.siteMembership.deleteMany({ where: { userId: nowhere.id } });
    const inactive = await makeUser("i@club.test", "steward");
    await testDb.user.update({ where: { id: inactive.id }, data: { active: false } });
    const orgAdmin = await makeOrganisationAdmin("o@club.test");

    for (const user of [member, several, nowhere, inactive, orgAdmin]) {
      const raw = await getUserAccess(user.id);
      expect(raw, user.email).toEqual(await accessThroughQueryApi(user.id));
      expect(typeof raw!.active).toBe("boolean");
      expect(typeof raw!.organisationAdmin).toBe("boolean");
    }
    const severalSites = (await getUserAccess(several.id))!.sites;
    expect(severalSites.map((site) => [site.slug, site.role])).toEqual(expect.arrayContaining([["annex", "member"], ["north", "admin"]]));
    expect(severalSites).toHaveLength(3);
    expect(severalSites.map((site) => site.name)).toEqual(severalSites.map((site) => site.name).sort((a, b) => a.localeCompare(b)));
    expect((await getUserAccess(nowhere.id))!.sites).toEqual([]);
    expect((await getUserAccess(inactive.id))!.active).toBe(false);
    expect((await getUserAccess(orgAdmin.id))!.sites.every((site) => site.role === "admin")).toBe(true);
  });

  it("finds no account for an unknown id", async () => {
    expect(await getUserAccess("no-such-user")).toBeNull();
    expect(await accessThroughQueryApi("no-such-user")).toBeNull();
  });
});
