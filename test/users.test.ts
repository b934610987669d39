import { beforeEach, describe, expect, it } from "vitest";
import { makeUser, resetDatabase, testDb, TEST_PASSWORD } from "./support/db";
import { createUser, DuplicateEmailError, LastAdminError, updateUserAccess } from "@/lib/db/users";
import { attemptSignIn } from "@/lib/auth/sign-in";
import { THROTTLE } from "@/lib/auth/throttle-policy";

beforeEach(resetDatabase);

describe("user administration", () => {
  it("adds a user with an audit entry in the same transaction", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    const user = await createUser(admin.id, { email: "New@Club.test", name: "New Member", role: "member", passwordHash: "x" });
    expect(user.email).toBe("new@club.test");
    const audit = await testDb.auditEvent.findMany({ where: { entityId: user.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.actorId).toBe(admin.id);
  });

  it("refuses a duplicate e-mail and stores nothing", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    await expect(createUser(admin.id, { email: "ADMIN@club.test", name: "Dup", role: "member", passwordHash: "x" })).rejects.toBeInstanceOf(DuplicateEmailError);
    expect(await testDb.user.count()).toBe(1);
    expect(await testDb.auditEvent.count()).toBe(0);
  });

  it("never leaves the installation without an active admin, and rolls the change back", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    await expect(updateUserAccess(admin.id, admin.id, { role: "member" })).rejects.toBeInstanceOf(LastAdminError);
    await expect(updateUserAccess(admin.id, admin.id, { active: false })).rejects.toBeInstanceOf(LastAdminError);
    const after = await testDb.user.findUniqueOrThrow({ where: { id: admin.id } });
    expect(after.role).toBe("admin");
    expect(after.active).toBe(true);
  });

  it("changes a role and records before and after", async () => {
    const admin = await makeUser("admin@club.test", "admin");
    const member = await makeUser("m@club.test", "member");
    await updateUserAccess(admin.id, member.id, { role: "steward" });
    const event = await testDb.auditEvent.findFirstOrThrow({ where: { entityId: member.id } });
    expect(event.summary).toContain("member → steward");
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
