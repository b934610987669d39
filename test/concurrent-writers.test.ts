/**
 * Concurrent writers on the same coil lose nothing and double nothing. Each test fires the same write from
 * several connections at once (test/support/writers.ts) and checks the database afterwards: one loan, one
 * return, one successor part, one post-mortem, one lapse record, no silently overwritten edit, every failed
 * sign-in counted. SQLite takes one writer at a time; PostgreSQL under READ COMMITTED does not, which is what
 * the conditional updates and lib/db/serializable.ts are for — these tests are meant to run against both.
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { closeWriters, openWriters, outcomes, type Writer } from "./support/writers";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import { signClearance, getClearanceStateById } from "@/lib/db/clearances";
import { createLoan } from "@/lib/db/loans";
import { setCoilStatus, updateCoil, CoilEditConflictError } from "@/lib/db/coils";
import { recordFailure } from "@/lib/auth/throttle-policy";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { coilUpdateSchema } from "@/lib/validation/coil";
import { replaceComponentSchema } from "@/lib/validation/component";
import { postMortemSchema } from "@/lib/validation/failure";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

const WRITERS = 4;
const DAY = 86_400_000;
/** A datetime-local string `days` before now (makeCleanCoil fits its parts 30 days ago). */
const daysAgo = (days: number) => new Date(Date.now() - days * DAY).toISOString().slice(0, 16);
let writers: Writer[] = [];

beforeEach(async () => {
  await resetDatabase();
  writers = await openWriters(WRITERS);
});
afterEach(() => closeWriters(writers));

async function stewards() {
  return Promise.all(writers.map((_, i) => makeUser(`steward${i}@club.test`, "steward", `Steward ${i}`)));
}

async function clearedCoil(stewardId: string) {
  const now = new Date();
  const coil = await makeCleanCoil("RACE-1", now);
  await signClearance(mainScope(stewardId), clearanceDecisionSchema.parse({ coilId: coil.id, verdict: "cleared", checklist: ALL_YES }), now);
  return { coil, now };
}

describe("loans", () => {
  it("two stewards lending the same coil at once make one loan; the others are told it is out", async () => {
    const people = await stewards();
    const { coil, now } = await clearedCoil(people[0]!.id);
    const back = new Date(now.getTime() + 3 * DAY);
    const settled = await Promise.allSettled(
      writers.map((w, i) => w.loans.createLoan(mainScope(people[i]!.id), { coilId: coil.id, borrower: `Borrower ${i}`, borrowerContact: "", event: "Open day", expectedBackAt: back }, new Date(now.getTime() + 1000))),
    );
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    expect(refused.map((e) => e.reason)).toEqual(Array(WRITERS - 1).fill("already-out"));
    expect(await testDb.loan.count({ where: { coilId: coil.id, returnedAt: null } })).toBe(1);
    expect(await testDb.auditEvent.count({ where: { entity: "Loan" } })).toBe(1);
  });

  it("two stewards receiving the same loan at once record one return, the first one's", async () => {
    const people = await stewards();
    const { coil, now } = await clearedCoil(people[0]!.id);
    const loan = await createLoan(mainScope(people[0]!.id), { coilId: coil.id, borrower: "Library", borrowerContact: "", event: "Open day", expectedBackAt: new Date(now.getTime() + 3 * DAY) }, new Date(now.getTime() + 1000));
    const returnedAt = new Date(now.getTime() + 2000);
    const settled = await Promise.allSettled(
      writers.map((w, i) => w.loans.returnLoan(mainScope(people[i]!.id), { loanId: loan.id, returnedAt, returnCondition: "ok", returnNotes: `Checked by steward ${i}`, sessionIds: [] }, new Date(now.getTime() + 3000))),
    );
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    expect(refused.map((e) => e.reason)).toEqual(Array(WRITERS - 1).fill("already-returned"));
    const after = await testDb.loan.findUniqueOrThrow({ where: { id: loan.id } });
    expect(after.receivedById).toBe(stored[0]!.receivedById);
    expect(after.returnNotes).toBe(stored[0]!.returnNotes);
    expect(await testDb.auditEvent.count({ where: { entity: "Loan", action: "update" } })).toBe(1);
  });
});

describe("parts", () => {
  it("two stewards replacing the same part at once fit one successor", async () => {
    const people = await stewards();
    const coil = await makeCleanCoil("RACE-2", new Date());
    const old = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id, kind: "switch" } });
    const before = await testDb.component.count();
    const settled = await Promise.allSettled(
      writers.map((w, i) =>
        w.components.replaceComponent(
          mainScope(people[i]!.id),
          replaceComponentSchema.parse({ oldComponentId: old.id, removalReason: `worn (${i})`, coilId: coil.id, kind: "switch", partNumber: `NEW-${i}`, switchType: "bjt", installedAt: daysAgo(1) }),
        ),
      ),
    );
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    expect(refused).toHaveLength(WRITERS - 1);
    for (const error of refused) expect(error.message).toMatch(/already removed|replaced by someone else/);
    expect(await testDb.component.count()).toBe(before + 1);
    const after = await testDb.component.findUniqueOrThrow({ where: { id: old.id } });
    expect(after.replacedById).toBe(stored[0]!.fitted.id);
    expect(await testDb.component.count({ where: { coilId: coil.id, kind: "switch", removedAt: null } })).toBe(1);
  });

  it("two stewards completing the same post-mortem at once close it once, with one replacement", async () => {
    const people = await stewards();
    const coil = await makeCleanCoil("RACE-3", new Date());
    const part = await testDb.component.findFirstOrThrow({ where: { coilId: coil.id, kind: "switch" } });
    const failure = await testDb.failure.create({ data: { coilId: coil.id, componentId: part.id, occurredAt: new Date(Date.now() - 2 * DAY), mode: "over_voltage", symptoms: "Loud crack" } });
    const before = await testDb.component.count();
    const settled = await Promise.allSettled(
      writers.map((w, i) =>
        w.failures.completePostMortem(
          mainScope(people[i]!.id),
          postMortemSchema.parse({
            failureId: failure.id,
            rootCause: `Overshoot on the collector, seen by steward ${i}.`,
            correctiveAction: "Fit a higher-rated part and a clamp.",
            replacement: { partNumber: `REPL-${i}`, installedAt: daysAgo(1) },
          }),
        ),
      ),
    );
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    expect(refused).toHaveLength(WRITERS - 1);
    for (const error of refused) expect(error.message).toMatch(/already completed|completed by someone else/);
    expect(await testDb.component.count()).toBe(before + 1);
    const closed = await testDb.failure.findUniqueOrThrow({ where: { id: failure.id } });
    expect(closed.replacementComponentId).toBe(stored[0]!.replacementId);
    expect((await testDb.component.findUniqueOrThrow({ where: { id: part.id } })).replacedById).toBe(stored[0]!.replacementId);
    expect(await testDb.auditEvent.count({ where: { entity: "Failure", entityId: failure.id } })).toBe(1);
  });
});

describe("clearances", () => {
  it("a lapse detected by several requests at once is recorded once", async () => {
    const people = await stewards();
    const { coil, now } = await clearedCoil(people[0]!.id);
    const clearance = await testDb.clearance.findFirstOrThrow({ where: { coilId: coil.id } });
    await testDb.failure.create({ data: { coilId: coil.id, occurredAt: new Date(now.getTime() + 1000), mode: "over_temperature", symptoms: "Hot" } });
    const state = (await getClearanceStateById(mainScope(null), clearance.id, new Date(now.getTime() + 5000)))!;
    expect(state.kind).toBe("lapsed-failure");
    const results = await Promise.all(writers.map((w, i) => w.clearances.recordClearanceLapse(mainScope(null), clearance.id, { ...state, explanation: `${state.explanation} (${i})` })));
    expect(results.filter(Boolean)).toHaveLength(1);
    const winner = results.indexOf(true);
    expect((await testDb.clearance.findUniqueOrThrow({ where: { id: clearance.id } })).lapseReason).toBe(`${state.explanation} (${winner})`);
    expect(await testDb.auditEvent.count({ where: { entity: "Clearance", action: "lapse" } })).toBe(1);
  });

  it("policy versions saved at once are numbered 1…n with none lost", async () => {
    const admins = await Promise.all(writers.map((_, i) => makeOrganisationAdmin(`admin${i}@club.test`)));
    const settled = await Promise.allSettled(writers.map((w, i) => w.policy.saveDefaultPolicyVersion(mainScope(admins[i]!.id), DEFAULT_CLEARANCE_POLICY, `note ${i}`)));
    const { stored, refused } = outcomes(settled);
    expect(refused).toEqual([]);
    const versions = (await testDb.clearancePolicy.findMany({ orderBy: { version: "asc" } })).map((p) => p.version);
    expect(versions).toEqual(writers.map((_, i) => i + 1));
    expect(stored.map((p) => p.version).sort()).toEqual(versions);
  });
});

describe("coil edits", () => {
  const edit = (coilId: string, version: number, change: Record<string, string>) =>
    coilUpdateSchema.parse({ coilId, version, name: "Coil RACE-4", builderName: "Test", formDiameterM: "50 mm", windingLengthM: "200 mm", turns: "900", wireDiameterM: "0.2 mm", ...change });

  it("a save from a form opened before someone else's change is refused, naming them, and overwrites nothing", async () => {
    const ada = await makeUser("ada@club.test", "steward", "Ada Lovelace");
    const bob = await makeUser("bob@club.test", "steward", "Bob Builder");
    const coil = await makeCleanCoil("RACE-4", new Date());
    // Both open the form at version 0; Ada saves first.
    await updateCoil(mainScope(ada.id), edit(coil.id, 0, { name: "Ada's name" }));
    const error = await updateCoil(mainScope(bob.id), edit(coil.id, 0, { notes: "Bob's note" })).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(CoilEditConflictError);
    expect((error as Error).message).toMatch(/^Nothing was saved: Ada Lovelace changed RACE-4 at \d{4}-\d\d-\d\d \d\d:\d\d UTC, after you opened this form/);
    const after = await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } });
    expect(after).toMatchObject({ name: "Ada's name", notes: "", version: 1 });
    expect(await testDb.auditEvent.count({ where: { entity: "Coil", entityId: coil.id } })).toBe(1);
  });

  it("a status change also makes an open form stale", async () => {
    const ada = await makeUser("ada@club.test", "steward", "Ada Lovelace");
    const coil = await makeCleanCoil("RACE-4", new Date());
    await setCoilStatus(mainScope(ada.id), coil.id, "repair");
    await expect(updateCoil(mainScope(ada.id), edit(coil.id, 0, { status: "active", notes: "fixed" }))).rejects.toBeInstanceOf(CoilEditConflictError);
    expect(await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).toMatchObject({ status: "repair", notes: "" });
  });

  it("saves fired at once from forms opened at the same version: one lands, the rest are refused", async () => {
    const people = await stewards();
    const coil = await makeCleanCoil("RACE-4", new Date());
    const settled = await Promise.allSettled(writers.map((w, i) => w.coils.updateCoil(mainScope(people[i]!.id), edit(coil.id, 0, { notes: `note ${i}` }))));
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    expect(refused).toHaveLength(WRITERS - 1);
    for (const error of refused) expect(error.message).toMatch(/^Nothing was saved: Steward \d changed RACE-4/);
    expect(await testDb.coil.findUniqueOrThrow({ where: { id: coil.id } })).toMatchObject({ notes: stored[0]!.notes, version: 1 });
    expect(await testDb.auditEvent.count({ where: { entity: "Coil", entityId: coil.id } })).toBe(1);
  });
});

describe("accounts", () => {
  it("two admins removing each other's admin role at once leave one admin", async () => {
    const ann = await makeUser("ann@club.test", "admin");
    const ben = await makeUser("ben@club.test", "admin");
    const settled = await Promise.allSettled([writers[0]!.users.updateUserAccess(mainScope(ann.id), ben.id, { role: "member" }), writers[1]!.users.updateUserAccess(mainScope(ben.id), ann.id, { role: "member" })]);
    const { stored, refused } = outcomes(settled);
    expect(stored).toHaveLength(1);
    // The one refused is either stopped by the last-admin rule or, having lost the race, is no longer an admin to act.
    const siteName = (await testDb.site.findUniqueOrThrow({ where: { id: DEFAULT_SITE_ID } })).name;
    expect(refused.map((e) => e.message)).toEqual([expect.stringMatching(new RegExp(`^(${siteName} must keep at least one active admin|Managing this site's members needs an admin of the site\\.)$`))]);
    expect(await testDb.siteMembership.count({ where: { siteId: DEFAULT_SITE_ID, role: "admin", user: { active: true } } })).toBe(1);
  });

  it("failed sign-ins fired in parallel are each counted", async () => {
    const key = "email:target@club.test";
    const attempts = writers.flatMap((w) => [w, w]);
    await Promise.all(attempts.map((w) => w.throttle.recordThrottleFailure(key, (current) => recordFailure(current, new Date(), 15))));
    const row = await testDb.signInThrottle.findUniqueOrThrow({ where: { key } });
    expect(row.failures).toBe(attempts.length);
    // Eight failures lock the account (lib/auth/throttle-policy.ts).
    expect(row.lockedUntil).not.toBeNull();
  });
});
