import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { closeWriters, openWriters, outcomes, type Writer } from "./support/writers";
import { addMembership, createSite, mainScope, makeOrganisationAdmin, makeUser, makeUserAtSite, resetDatabase, siteScope, testDb, TEST_PASSWORD } from "./support/db";
import { createUser, DuplicateEmailError, LastAdminError, listSiteMembers, setOrganisationAdmin, SiteAccessError, updateUserAccess, UserNotFoundError } from "@/lib/db/users";
import { addMemberByEmail, AlreadyMemberError, AccountNotFoundError, createSite as createSiteAsActor, DuplicateSiteSlugError, listSites, removeMember, renameSite } from "@/lib/db/sites";
import { getUserAccess } from "@/lib/db/site-access";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import { attemptSignIn } from "@/lib/auth/sign-in";
import { THROTTLE } from "@/lib/auth/throttle-policy";

beforeEach(resetDatabase);

const roleAt = async (userId: string, siteId: string) => (await testDb.siteMembership.findUnique({ where: { userId_siteId: { userId, siteId } } }))?.role;

describe("user administration at a site", () => {
  it("adds a user as a member of the acting admin's site, with an audit entry of that site in the same transaction", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    const user = await createUser(mainScope(admin.id), { email: "New@Club.test", name: "New Member", role: "steward", passwordHash: "x" });
    expect(user.email).toBe("new@club.test");
    expect(await roleAt(user.id, DEFAULT_SITE_ID)).toBe("steward");
    expect(await testDb.siteMembership.count({ where: { userId: user.id } })).toBe(1);
    const audit = await testDb.auditEvent.findMany({ where: { entityId: user.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actorId: admin.id, siteId: DEFAULT_SITE_ID });
  });

  it("refuses a duplicate e-mail and stores nothing", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    await expect(createUser(mainScope(admin.id), { email: "ADMIN@club.test", name: "Dup", role: "member", passwordHash: "x" })).rejects.toBeInstanceOf(DuplicateEmailError);
    expect(await testDb.user.count()).toBe(1);
    expect(await testDb.auditEvent.count()).toBe(0);
  });

  it("refuses a steward, or an admin of another site, adding members here", async () => {
    const north = await createSite("north");
    const steward = await makeUser("s@club.test", "steward");
    const northAdmin = await makeUserAtSite(north.id, "admin", "a@north.test");
    for (const actor of [steward, northAdmin]) {
      await expect(createUser(mainScope(actor.id), { email: "x@club.test", name: "X", role: "member", passwordHash: "x" })).rejects.toBeInstanceOf(SiteAccessError);
    }
    expect(await testDb.user.count()).toBe(2);
  });

  it("changes a role at one site only and records before and after", async () => {
    const north = await createSite("north");
    const admin = await makeUser("admin@club.test", "admin");
    const member = await makeUser("m@club.test", "member");
    await addMembership(member.id, north.id, "member");
    await updateUserAccess(mainScope(admin.id), member.id, { role: "steward" });
    expect(await roleAt(member.id, DEFAULT_SITE_ID)).toBe("steward");
    expect(await roleAt(member.id, north.id)).toBe("member");
    const event = await testDb.auditEvent.findFirstOrThrow({ where: { entityId: member.id } });
    expect(event.summary).toContain("member → steward");
    expect(event.siteId).toBe(DEFAULT_SITE_ID);
  });

  it("answers not found for a user of another site, whatever the change, and changes nothing", async () => {
    const north = await createSite("north");
    const admin = await makeUser("admin@club.test", "admin");
    const stranger = await makeUserAtSite(north.id, "member", "m@north.test");
    await expect(updateUserAccess(mainScope(admin.id), stranger.id, { role: "admin" })).rejects.toBeInstanceOf(UserNotFoundError);
    await expect(updateUserAccess(mainScope(admin.id), stranger.id, { active: false })).rejects.toBeInstanceOf(UserNotFoundError);
    await expect(removeMember(mainScope(admin.id), stranger.id)).rejects.toBeInstanceOf(UserNotFoundError);
    expect(await roleAt(stranger.id, north.id)).toBe("member");
    expect((await testDb.user.findUniqueOrThrow({ where: { id: stranger.id } })).active).toBe(true);
    expect((await listSiteMembers(mainScope(admin.id))).map((m) => m.email)).toEqual(["admin@club.test"]);
  });

  it("lets a site admin deactivate only accounts that belong to no other site", async () => {
    const north = await createSite("north");
    const admin = await makeUser("admin@club.test", "admin");
    const shared = await makeUser("shared@club.test", "member");
    await addMembership(shared.id, north.id, "steward");
    const own = await makeUser("own@club.test", "member");
    await expect(updateUserAccess(mainScope(admin.id), shared.id, { active: false })).rejects.toBeInstanceOf(SiteAccessError);
    await updateUserAccess(mainScope(admin.id), own.id, { active: false });
    expect((await testDb.user.findUniqueOrThrow({ where: { id: own.id } })).active).toBe(false);
    // An organisation admin may.
    const organisation = await makeOrganisationAdmin("org@district.test");
    await updateUserAccess(mainScope(organisation.id), shared.id, { active: false });
    expect((await testDb.user.findUniqueOrThrow({ where: { id: shared.id } })).active).toBe(false);
  });
});

describe("the admin rule: every site keeps an admin, the organisation an organisation admin", () => {
  it("never leaves a site without an active admin when there is no organisation admin, and rolls the change back", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    await expect(updateUserAccess(mainScope(admin.id), admin.id, { role: "member" })).rejects.toBeInstanceOf(LastAdminError);
    await expect(updateUserAccess(mainScope(admin.id), admin.id, { active: false })).rejects.toBeInstanceOf(LastAdminError);
    await expect(removeMember(mainScope(admin.id), admin.id)).rejects.toThrow(/Main site must keep at least one active admin/);
    expect(await roleAt(admin.id, DEFAULT_SITE_ID)).toBe("admin");
    expect((await testDb.user.findUniqueOrThrow({ where: { id: admin.id } })).active).toBe(true);
  });

  it("counts a deactivated account out of every site it belonged to", async () => {
    const north = await createSite("north");
    const both = await makeUser("both@club.test", "admin");
    await addMembership(both.id, north.id, "admin");
    await makeUser("other@club.test", "admin"); // main keeps an admin; north would not
    const organisation = await makeOrganisationAdmin("org@district.test");
    // With an organisation admin every site is covered: allowed.
    await updateUserAccess(mainScope(organisation.id), both.id, { active: false });
    await updateUserAccess(mainScope(organisation.id), both.id, { active: true });
    // Without one (a script on the server acting, actor null), north would lose its only admin.
    await testDb.user.update({ where: { id: organisation.id }, data: { organisationAdmin: false } });
    await expect(updateUserAccess(mainScope(null), both.id, { active: false })).rejects.toThrow(/North must keep at least one active admin/);
    expect((await testDb.user.findUniqueOrThrow({ where: { id: both.id } })).active).toBe(true);
  });

  it("keeps the organisation's last active organisation admin", async () => {
    const organisation = await makeOrganisationAdmin("org@district.test", "Org", DEFAULT_SITE_ID);
    await expect(setOrganisationAdmin(mainScope(organisation.id), organisation.id, false)).rejects.toThrow(/at least one active organisation admin/);
    await expect(updateUserAccess(mainScope(organisation.id), organisation.id, { active: false })).rejects.toBeInstanceOf(LastAdminError);
    const second = await makeUser("second@club.test", "member");
    await setOrganisationAdmin(mainScope(organisation.id), second.id, true);
    await setOrganisationAdmin(mainScope(second.id), organisation.id, false);
    expect(await testDb.user.count({ where: { organisationAdmin: true } })).toBe(1);
    const events = await testDb.auditEvent.findMany({ where: { entity: "User", action: "update" }, orderBy: { id: "asc" } });
    expect(events.map((e) => [e.siteId, e.summary])).toEqual([
      [null, "second: made an organisation admin"],
      [null, "Org: no longer an organisation admin"],
    ]);
  });

  it("lets only an organisation admin grant organisation admin", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    await expect(setOrganisationAdmin(mainScope(admin.id), admin.id, true)).rejects.toBeInstanceOf(SiteAccessError);
    expect((await testDb.user.findUniqueOrThrow({ where: { id: admin.id } })).organisationAdmin).toBe(false);
  });
});

describe("the admin rule under concurrent writes (one connection each, as two server processes)", () => {
  let writers: Writer[] = [];
  beforeAll(async () => {
    writers = await openWriters(2);
  });
  afterAll(() => closeWriters(writers));

  it("two site admins demoting each other at once leave the site one admin", async () => {
    const ann = await makeUser("ann@club.test", "admin");
    const ben = await makeUser("ben@club.test", "admin");
    const settled = await Promise.allSettled([
      writers[0]!.users.updateUserAccess(mainScope(ann.id), ben.id, { role: "member" }),
      writers[1]!.users.updateUserAccess(mainScope(ben.id), ann.id, { role: "member" }),
    ]);
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    // The loser, run again after the conflict, finds either no other admin left or that it is no longer an admin itself.
    expect(refused).toHaveLength(1);
    expect(refused[0]).toSatisfy((e) => e instanceof writers[0]!.users.LastAdminError || e instanceof writers[0]!.users.SiteAccessError || e instanceof writers[1]!.users.LastAdminError || e instanceof writers[1]!.users.SiteAccessError);
    expect(await testDb.siteMembership.count({ where: { siteId: DEFAULT_SITE_ID, role: "admin" } })).toBe(1);
  });

  it("one admin removing the other from the site while the other demotes the first leaves one admin", async () => {
    const ann = await makeUser("ann@club.test", "admin");
    const ben = await makeUser("ben@club.test", "admin");
    // The removal runs on the test's own connection, the demotion on a writer's: two connections, side by side.
    const settled = await Promise.allSettled([removeMember(mainScope(ann.id), ben.id), writers[1]!.users.updateUserAccess(mainScope(ben.id), ann.id, { role: "steward" })]);
    expect(outcomes(settled).stored).toHaveLength(1);
    expect(await testDb.siteMembership.count({ where: { siteId: DEFAULT_SITE_ID, role: "admin" } })).toBe(1);
  });

  it("two organisation admins withdrawing each other at once leave the organisation one", async () => {
    const ann = await makeOrganisationAdmin("ann@district.test", "Ann");
    const ben = await makeOrganisationAdmin("ben@district.test", "Ben");
    const settled = await Promise.allSettled([
      writers[0]!.users.setOrganisationAdmin(mainScope(ann.id), ben.id, false),
      writers[1]!.users.setOrganisationAdmin(mainScope(ben.id), ann.id, false),
    ]);
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    // The loser either re-read the winner's change (the last organisation admin) or had lost its own authority to it.
    expect(refused.map((e) => e.message)).toEqual([expect.stringMatching(/at least one active organisation admin|needs an organisation admin/)]);
    expect(await testDb.user.count({ where: { organisationAdmin: true, active: true } })).toBe(1);
  });
});

describe("sites and memberships", () => {
  it("lets an organisation admin create and rename sites, refusing a short name in use, with organisation-wide audit events", async () => {
    const organisation = await makeOrganisationAdmin("org@district.test");
    const site = await createSiteAsActor(mainScope(organisation.id), { slug: "north-school", name: "North School" });
    await expect(createSiteAsActor(mainScope(organisation.id), { slug: "north-school", name: "Again" })).rejects.toBeInstanceOf(DuplicateSiteSlugError);
    await expect(renameSite(mainScope(organisation.id), site.id, { slug: "main", name: "Clash" })).rejects.toBeInstanceOf(DuplicateSiteSlugError);
    await renameSite(mainScope(organisation.id), site.id, { slug: "north", name: "North Academy" });
    expect((await listSites(mainScope(organisation.id))).map((s) => [s.slug, s.name])).toEqual([
      ["main", "Main site"],
      ["north", "North Academy"],
    ]);
    const events = await testDb.auditEvent.findMany({ where: { entity: "Site" }, orderBy: { id: "asc" } });
    expect(events.map((e) => [e.siteId, e.action])).toEqual([
      [null, "create"],
      [null, "update"],
    ]);
  });

  it("refuses a site admin creating or renaming sites, and lists only their own sites", async () => {
    await createSite("north");
    const admin = await makeUser("admin@club.test", "admin");
    await expect(createSiteAsActor(mainScope(admin.id), { slug: "south", name: "South" })).rejects.toBeInstanceOf(SiteAccessError);
    await expect(renameSite(mainScope(admin.id), DEFAULT_SITE_ID, { slug: "main", name: "Mine now" })).rejects.toBeInstanceOf(SiteAccessError);
    expect((await listSites(mainScope(admin.id))).map((s) => s.slug)).toEqual(["main"]);
  });

  it("adds an existing account to a site by e-mail and removes it again; the account keeps its other sites", async () => {
    const north = await createSite("north");
    const northAdmin = await makeUserAtSite(north.id, "admin", "a@north.test");
    const member = await makeUser("m@club.test", "member", "Mo");
    const scope = siteScope(north.id, northAdmin.id);
    await addMemberByEmail(scope, { email: "M@Club.test", role: "steward" });
    await expect(addMemberByEmail(scope, { email: "m@club.test", role: "member" })).rejects.toBeInstanceOf(AlreadyMemberError);
    await expect(addMemberByEmail(scope, { email: "nobody@club.test", role: "member" })).rejects.toBeInstanceOf(AccountNotFoundError);
    expect((await getUserAccess(member.id))!.sites.map((s) => [s.slug, s.role])).toEqual([
      ["main", "member"],
      ["north", "steward"],
    ]);
    expect((await listSiteMembers(scope)).find((m) => m.id === member.id)).toMatchObject({ role: "steward", otherSites: 1 });
    await removeMember(scope, member.id);
    expect(await roleAt(member.id, north.id)).toBeUndefined();
    expect(await roleAt(member.id, DEFAULT_SITE_ID)).toBe("member");
    const events = await testDb.auditEvent.findMany({ where: { entityId: member.id }, orderBy: { id: "asc" } });
    expect(events.map((e) => [e.siteId, e.action, e.summary])).toEqual([
      [north.id, "create", "Mo joined North as steward"],
      [north.id, "delete", "Mo left North (was steward)"],
    ]);
  });
});

describe("sign-in", () => {
  const noWait = { wait: async () => {} };

  it("accepts the right password and refuses a wrong one or a deactivated account", async () => {
    const member = await makeUser("m@club.test", "member");
    expect((await attemptSignIn("M@club.test", TEST_PASSWORD, 15, noWait)).ok).toBe(true);
    expect((await attemptSignIn("m@club.test", "wrong-password", 15, noWait)).ok).toBe(false);
    await testDb.user.update({ where: { id: member.id }, data: { active: false } });
    expect((await attemptSignIn("m@club.test", TEST_PASSWORD, 15, noWait)).ok).toBe(false);
  });

  it("signs in an organisation admin of no site, and tells an account of no site why it cannot", async () => {
    await makeOrganisationAdmin("org@district.test");
    expect((await attemptSignIn("org@district.test", TEST_PASSWORD, 15, noWait)).ok).toBe(true);
    const member = await makeUser("m@club.test", "member");
    await testDb.siteMembership.deleteMany({ where: { userId: member.id } });
    expect(await attemptSignIn("m@club.test", TEST_PASSWORD, 15, noWait)).toEqual({ ok: false, message: expect.stringMatching(/does not belong to any site/) });
  });

  it("records the sign-in as an organisation-wide audit event", async () => {
    const member = await makeUser("m@club.test", "member");
    await attemptSignIn("m@club.test", TEST_PASSWORD, 15, noWait);
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { action: "sign-in" } })).toMatchObject({ actorId: member.id, siteId: null });
  });

  it("slows down repeated failures, then locks the account even against the right password", async () => {
    await makeUser("m@club.test", "member");
    const waits: number[] = [];
    const recording = { wait: async (ms: number) => void waits.push(ms) };
    for (let i = 0; i < THROTTLE.lockAfterFailures; i++) await attemptSignIn("m@club.test", "guess-" + i, 15, recording);
    expect(waits.length).toBeGreaterThan(0);
    expect(waits[0]).toBe(THROTTLE.baseDelayMs);
    const locked = await attemptSignIn("m@club.test", TEST_PASSWORD, 15, recording);
    expect(locked).toEqual({ ok: false, message: expect.stringMatching(/Too many failed sign-ins.*15 minutes/) });
  });

  it("takes an unknown account through the same password check (no enumeration) and throttles it too", async () => {
    const outcome = await attemptSignIn("nobody@club.test", "whatever-pass", 15, noWait);
    expect(outcome.ok).toBe(false);
    expect(await testDb.signInThrottle.findUnique({ where: { key: "email:nobody@club.test" } })).not.toBeNull();
  });
});
