import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeUser, resetDatabase, testDb } from "./support/db";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import { signClearance } from "@/lib/db/clearances";
import { createLoan, LoanRefusedError, returnLoan } from "@/lib/db/loans";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { loanCreateSchema, loanReturnSchema } from "@/lib/validation/loan";

beforeEach(resetDatabase);

const DAY = 86_400_000;

async function setup(opts: { clear?: "cleared" | "refused" | null } = { clear: "cleared" }) {
  const steward = await makeUser("s@club.test", "steward");
  const now = new Date();
  const coil = await makeCleanCoil("T-1", now);
  if (opts.clear) await signClearance(mainScope(steward.id), clearanceDecisionSchema.parse({ coilId: coil.id, verdict: opts.clear, checklist: ALL_YES }), now);
  return { steward, coil, now };
}

const loanInput = (coilId: string, back: Date) => ({ coilId, borrower: "Riverside Library", borrowerContact: "", event: "Family science morning", expectedBackAt: back });

async function expectRefusal(promise: Promise<unknown>, reason: string, message: RegExp) {
  const error = await promise.catch((e: unknown) => e);
  expect(error).toBeInstanceOf(LoanRefusedError);
  expect((error as LoanRefusedError).reason).toBe(reason);
  expect((error as LoanRefusedError).message).toMatch(message);
}

describe("lending a coil", () => {
  it("lends a cleared coil against its clearance, with an audit entry", async () => {
    const { steward, coil, now } = await setup();
    const loan = await createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), new Date(now.getTime() + 1000));
    expect(loan.clearanceId).toBeTruthy();
    expect(await testDb.auditEvent.count({ where: { entity: "Loan", entityId: loan.id } })).toBe(1);
  });

  it("refuses a coil without a clearance", async () => {
    const { steward, coil, now } = await setup({ clear: null });
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), now), "none", /no clearance/);
    expect(await testDb.loan.count()).toBe(0);
  });

  it("refuses a coil whose latest decision was a refusal", async () => {
    const { steward, coil, now } = await setup({ clear: "refused" });
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), new Date(now.getTime() + 1000)), "refused", /refusal/);
  });

  it("refuses after the clearance expired", async () => {
    const { steward, coil, now } = await setup();
    const later = new Date(now.getTime() + 61 * DAY);
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(later.getTime() + 3 * DAY)), later), "expired", /expired/);
  });

  it("refuses after a failure recorded since the clearance", async () => {
    const { steward, coil, now } = await setup();
    await testDb.failure.create({ data: { coilId: coil.id, occurredAt: new Date(now.getTime() + 1000), mode: "over_temperature", symptoms: "Hot" } });
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), new Date(now.getTime() + 2000)), "lapsed-failure", /lapsed after a failure/);
  });

  it("refuses after a part was replaced since the clearance", async () => {
    const { steward, coil, now } = await setup();
    await testDb.component.create({ data: { coilId: coil.id, kind: "fan", partNumber: "FAN-80", installedAt: new Date(now.getTime() + 1000) } });
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), new Date(now.getTime() + 2000)), "lapsed-part", /part replacement/);
  });

  it("refuses a coil already out, and a return date past the clearance", async () => {
    const { steward, coil, now } = await setup();
    await createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), new Date(now.getTime() + 1000));
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 4 * DAY)), new Date(now.getTime() + 2000)), "already-out", /already out/);
    expect(await testDb.loan.count()).toBe(1);
  });

  it("refuses an expected-back date after the clearance ends", async () => {
    const { steward, coil, now } = await setup();
    await expectRefusal(createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 90 * DAY)), new Date(now.getTime() + 1000)), "bad-date", /clearance runs out/);
  });

  it("rejects bad form input with the field named", () => {
    const result = loanCreateSchema.safeParse({ coilId: "c", borrower: "", event: "Fair", expectedBackAt: "next week" });
    expect(result.success).toBe(false);
    const messages = result.error!.issues.map((i) => i.message).join(" ");
    expect(messages).toMatch(/Borrower/);
    expect(messages).toMatch(/Expected back: enter a date as YYYY-MM-DD; “next week” is not one/);
  });
});

describe("returning a loan", () => {
  it("records the return and links the sessions run while away", async () => {
    const { steward, coil, now } = await setup();
    const outAt = new Date(now.getTime() + 1000);
    const loan = await createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), outAt);
    const away = await testDb.runSession.create({
      data: { coilId: coil.id, startedAt: new Date(outAt.getTime() + 3600_000), supplyVoltageV: 24, supplyCurrentA: 2, durationS: 300, ambientTempC: 20 },
    });
    const returnedAt = new Date(outAt.getTime() + DAY);
    const input = loanReturnSchema.parse({ loanId: loan.id, returnedAt: "2020-01-01", returnCondition: "Good order", sessionIds: [away.id] });
    await returnLoan(mainScope(steward.id), { ...input, returnedAt }, new Date(returnedAt.getTime() + 1000));
    const stored = await testDb.loan.findUniqueOrThrow({ where: { id: loan.id } });
    expect(stored.returnedAt).toEqual(returnedAt);
    expect(stored.receivedById).toBe(steward.id);
    expect((await testDb.runSession.findUniqueOrThrow({ where: { id: away.id } })).loanId).toBe(loan.id);
  });

  it("refuses a session from outside the loan window and changes nothing", async () => {
    const { steward, coil, now } = await setup();
    const outAt = new Date(now.getTime() + 1000);
    const loan = await createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), outAt);
    const before = await testDb.runSession.findFirstOrThrow({ where: { coilId: coil.id }, orderBy: { startedAt: "asc" } });
    const returnedAt = new Date(outAt.getTime() + DAY);
    await expect(
      returnLoan(mainScope(steward.id), { loanId: loan.id, returnedAt, returnCondition: "Good", returnNotes: "", sessionIds: [before.id] }, new Date(returnedAt.getTime() + 1000)),
    ).rejects.toBeInstanceOf(LoanRefusedError);
    expect((await testDb.loan.findUniqueOrThrow({ where: { id: loan.id } })).returnedAt).toBeNull();
    expect((await testDb.runSession.findUniqueOrThrow({ where: { id: before.id } })).loanId).toBeNull();
  });

  it("refuses a second return", async () => {
    const { steward, coil, now } = await setup();
    const outAt = new Date(now.getTime() + 1000);
    const loan = await createLoan(mainScope(steward.id), loanInput(coil.id, new Date(now.getTime() + 3 * DAY)), outAt);
    const returnedAt = new Date(outAt.getTime() + 3600_000);
    const input = { loanId: loan.id, returnedAt, returnCondition: "Good", returnNotes: "", sessionIds: [] };
    await returnLoan(mainScope(steward.id), input, new Date(returnedAt.getTime() + 1000));
    await expect(returnLoan(mainScope(steward.id), input, new Date(returnedAt.getTime() + 2000))).rejects.toThrow(/already returned/);
  });
});
