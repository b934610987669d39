import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { ALL_YES, makeCleanCoil } from "./fleet-fixtures";
import * as clearances from "@/lib/db/clearances";
import { ClearanceRefusedError, getClearanceStateById, listClearancesWithState, recordClearanceLapse, signClearance } from "@/lib/db/clearances";
import { createFailure } from "@/lib/db/failures";
import { createLoan, getLoanHandover, listLoansNeedingRecall } from "@/lib/db/loans";
import { getFleetOverview } from "@/lib/db/fleet";
import { failureSchema } from "@/lib/validation/failure";
import { toLocalDateTimeValue } from "@/lib/validation/session";
import { getCurrentPolicy, listPolicyVersions, saveDefaultPolicyVersion } from "@/lib/db/policy";
import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { clearanceDecisionSchema } from "@/lib/validation/clearance";
import { policyFormSchema } from "@/lib/validation/policy";

beforeEach(resetDatabase);

/** Reads at the default site, as a single-club install makes them. */
const MAIN = mainScope(null);

const decision = (coilId: string, over: Record<string, unknown> = {}) =>
  clearanceDecisionSchema.parse({ coilId, verdict: "cleared", checklist: ALL_YES, maxSupplyVoltageV: "24 V", maxRunS: "12", conditions: "Indoors only", ...over });

describe("signing a clearance", () => {
  it("stores the decision with every rule result, the policy version and the checklist, with an audit entry", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    const c = await signClearance(mainScope(steward.id), decision(coil.id), now);
    const row = await testDb.clearance.findUniqueOrThrow({ where: { id: c.id }, include: { policy: true } });
    expect(row.verdict).toBe("cleared");
    expect(row.policy.version).toBe(1);
    expect(row.maxRunS).toBe(720); // "12" is read in minutes
    expect(row.maxSupplyVoltageV).toBe(24);
    const rules = JSON.parse(row.ruleResultsJson) as { id: string; pass: boolean }[];
    expect(rules.map((r) => r.id)).toEqual(expect.arrayContaining(["voltage-headroom", "broadcast-band", "sweep-age", "failure-free-sessions"]));
    expect(rules.every((r) => r.pass)).toBe(true);
    expect((JSON.parse(row.checklistJson) as { answer: boolean }[]).every((i) => i.answer)).toBe(true);
    expect(row.validUntil.getTime() - row.decidedAt.getTime()).toBe(60 * 86_400_000);
    expect(await testDb.auditEvent.count({ where: { entity: "Clearance", entityId: c.id } })).toBe(1);
  });

  it("refuses to clear when a rule fails (a checklist item answered no) and stores nothing; a refusal may be recorded", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    const partial = { ...ALL_YES, "discharge-wand": false };
    await expect(signClearance(mainScope(steward.id), decision(coil.id, { checklist: partial }), now)).rejects.toBeInstanceOf(ClearanceRefusedError);
    expect(await testDb.clearance.count()).toBe(0);
    expect(await testDb.auditEvent.count({ where: { entity: "Clearance" } })).toBe(0);

    const refusal = await signClearance(mainScope(steward.id), decision(coil.id, { checklist: partial, verdict: "refused" }), now);
    const rules = JSON.parse((await testDb.clearance.findUniqueOrThrow({ where: { id: refusal.id } })).ruleResultsJson) as { id: string; pass: boolean }[];
    expect(rules.find((r) => r.id === "checklist:discharge-wand")?.pass).toBe(false);
  });

  it("names unticked boxes by item and, when every recorded check passes, suggests no refusal", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    const partial: Record<string, boolean> = { ...ALL_YES, "discharge-wand": false, ventilation: false };
    const error = (await signClearance(mainScope(steward.id), decision(coil.id, { checklist: partial }), now).catch((e: unknown) => e)) as ClearanceRefusedError;
    expect(error).toBeInstanceOf(ClearanceRefusedError);
    expect(error.uncheckedItemIds.sort()).toEqual(["discharge-wand", "ventilation"]);
    expect(error.failedChecks).toEqual([]);
    expect(error.message).toBe(`Not signed: ${error.uncheckedItemIds.length} checklist items are not ticked. Tick the marked items to clear the coil.`);
    expect(error.message).not.toMatch(/refus/i);
  });

  it("re-evaluates from the stored history: an open failure blocks clearing whatever the form says", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    await testDb.failure.create({ data: { coilId: coil.id, occurredAt: new Date(now.getTime() - 3600_000), mode: "over_current", symptoms: "Switch shorted" } });
    const error = await signClearance(mainScope(steward.id), decision(coil.id), now).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ClearanceRefusedError);
    expect((error as ClearanceRefusedError).failedRules.map((r) => r.id)).toEqual(expect.arrayContaining(["open-failures", "failure-free-sessions"]));
    expect((error as ClearanceRefusedError).message).toMatch(/^Not signed: \d+ recorded checks fail, so the coil cannot be cleared; record a refusal instead\.$/);
  });

  it("rejects bad condition input with the field named", () => {
    const result = clearanceDecisionSchema.safeParse({ coilId: "x", verdict: "cleared", checklist: {}, maxSupplyVoltageV: "5 kV", maxRunS: "", conditions: "" });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toMatch(/Maximum supply voltage must be between/);
  });

  it("has no edit path: the module offers no update, and a lapse is recorded once, never overwritten", async () => {
    expect(Object.keys(clearances).filter((name) => /update|edit/i.test(name))).toEqual([]);
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    const c = await signClearance(mainScope(steward.id), decision(coil.id), now);
    const before = await testDb.clearance.findUniqueOrThrow({ where: { id: c.id } });
    await testDb.failure.create({ data: { coilId: coil.id, occurredAt: new Date(now.getTime() + 1000), mode: "over_voltage", symptoms: "Pop" } });
    const state = (await getClearanceStateById(MAIN, c.id, new Date(now.getTime() + 5000)))!;
    expect(state.kind).toBe("lapsed-failure");
    expect(await recordClearanceLapse(MAIN, c.id, state)).toBe(true);
    expect(await recordClearanceLapse(MAIN, c.id, { ...state, explanation: "something else" })).toBe(false);
    const after = await testDb.clearance.findUniqueOrThrow({ where: { id: c.id } });
    expect(after.lapseReason).toBe(state.explanation);
    expect(after.ruleResultsJson).toBe(before.ruleResultsJson);
    expect(after.verdict).toBe(before.verdict);
    expect(after.validUntil).toEqual(before.validUntil);
    expect(await testDb.auditEvent.count({ where: { entity: "Clearance", action: "lapse" } })).toBe(1);
  });
});

describe("lending policy versions", () => {
  it("creates the default as version 1 on first use, once", async () => {
    const [a, b] = await Promise.all([getCurrentPolicy(MAIN), getCurrentPolicy(MAIN)]);
    expect(a.version).toBe(1);
    expect(b.version).toBe(1);
    expect(await testDb.clearancePolicy.count()).toBe(1);
    expect(a.rules).toEqual(JSON.parse(JSON.stringify(DEFAULT_CLEARANCE_POLICY)));
  });

  it("saves every edit as a new version; clearances keep the version they used", async () => {
    const admin = await makeOrganisationAdmin("a@club.test");
    const steward = await makeUser("s@club.test", "steward");
    const now = new Date();
    const coil = await makeCleanCoil("T-1", now);
    const first = await signClearance(mainScope(steward.id), decision(coil.id), now);
    const v2 = await saveDefaultPolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, validityDays: 30, ituRegion: 1 }, "Shorter validity");
    expect(v2.version).toBe(2);
    expect((await getCurrentPolicy(MAIN)).rules.validityDays).toBe(30);
    expect((await listPolicyVersions(MAIN)).map((v) => v.version)).toEqual([2, 1]);
    const second = await signClearance(mainScope(steward.id), decision(coil.id), new Date(now.getTime() + 1000));
    const rows = await testDb.clearance.findMany({ where: { id: { in: [first.id, second.id] } }, include: { policy: true } });
    expect(rows.find((r) => r.id === first.id)!.policy.version).toBe(1);
    expect(rows.find((r) => r.id === second.id)!.policy.version).toBe(2);
    expect(await testDb.auditEvent.count({ where: { entity: "ClearancePolicy", actorId: admin.id } })).toBe(1);
  });

  it("keeps every one of several versions saved at the same moment, numbered in turn", async () => {
    const admin = await makeOrganisationAdmin("a@club.test");
    await getCurrentPolicy(MAIN);
    const notes = ["first", "second", "third", "fourth"];
    const saved = await Promise.all(notes.map((note, i) => saveDefaultPolicyVersion(mainScope(admin.id), { ...DEFAULT_CLEARANCE_POLICY, validityDays: 10 + i }, note)));
    expect(saved.map((v) => v.version).sort()).toEqual([2, 3, 4, 5]);
    const stored = await listPolicyVersions(MAIN);
    expect(stored.map((v) => v.note).slice(0, 4).sort()).toEqual([...notes].sort());
    expect(await testDb.auditEvent.count({ where: { entity: "ClearancePolicy", actorId: admin.id } })).toBe(4);
  });

  it("refuses a bad policy form with the field named and stores nothing", async () => {
    const result = policyFormSchema.safeParse({
      minVoltageHeadroomPct: "120",
      minCurrentHeadroomPct: "20",
      minThermalHeadroomPct: "20",
      minJunctionMarginK: "25",
      acceptEstimatedMargins: "on",
      ituRegion: "2",
      maxSweepAgeDays: "90",
      minFailureFreeSessions: "3",
      validityDays: "60",
      checklist: "good-id | A fine caution text | common practice\nbroken line without pipes",
      note: "",
    });
    expect(result.success).toBe(false);
    const messages = result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(messages.some((m) => m.startsWith("minVoltageHeadroomPct") && /between 0 and 100/.test(m))).toBe(true);
    expect(messages.some((m) => /Checklist line 2/.test(m))).toBe(true);
    expect(await testDb.clearancePolicy.count()).toBe(0);
  });

  it("reads a good policy form into rules", () => {
    const result = policyFormSchema.parse({
      minVoltageHeadroomPct: "25",
      minCurrentHeadroomPct: "20",
      minThermalHeadroomPct: "20",
      minJunctionMarginK: "25",
      acceptEstimatedMargins: "",
      ituRegion: "3",
      maxSweepAgeDays: "60",
      minFailureFreeSessions: "2",
      validityDays: "30",
      checklist: "one-item | Keep a clear zone around the coil |",
      note: "Tighter",
    });
    expect(result.rules).toMatchObject({ minVoltageHeadroom: 0.25, acceptEstimatedMargins: false, ituRegion: 3, requiredChecklist: [{ id: "one-item", source: "common practice" }] });
  });
});

describe("lapse state on every view", () => {
  it("a failure on a coil out on loan lapses its clearance at once: stored with the failure, the same on the list, the dashboard and the recall notice", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const signedAt = new Date(Date.now() - 5 * 60_000); // before the failure, whose form time is whole minutes
    const coil = await makeCleanCoil("T-1", signedAt);
    const c = await signClearance(mainScope(steward.id), decision(coil.id), signedAt);
    const loan = await createLoan(mainScope(steward.id), { coilId: coil.id, borrower: "Riverside Library", borrowerContact: "", event: "Family science morning", expectedBackAt: new Date(Date.now() + 3 * 86_400_000) });
    expect(await listLoansNeedingRecall(MAIN)).toEqual([]);
    expect((await getLoanHandover(MAIN, loan.id))?.clearance.decidedAt.getTime()).toBe(signedAt.getTime());

    await createFailure(mainScope(steward.id),
      failureSchema.parse({ coilId: coil.id, mode: "over_voltage", occurredAt: toLocalDateTimeValue(new Date(Date.now() - 1000)), symptoms: "Loud crack; the switch is short." }),
    );
    // Stored by the failure's own transaction, not by a later visit to the decision page.
    const stored = await testDb.clearance.findUniqueOrThrow({ where: { id: c.id } });
    expect(stored.lapsedAt).not.toBeNull();
    expect(await testDb.auditEvent.count({ where: { entity: "Clearance", entityId: c.id, action: "lapse" } })).toBe(1);

    const now = new Date();
    const listed = (await listClearancesWithState(MAIN, now)).find((r) => r.id === c.id)!;
    const dashboard = (await getFleetOverview(MAIN, now)).find((r) => r.id === coil.id)!;
    expect(listed.state.kind).toBe("lapsed-failure");
    expect(dashboard.clearance).toEqual(listed.state);
    expect(listed.state.summary).toMatch(/^Failure recorded \(over voltage\) on \d{4}-\d\d-\d\d \d\d:\d\d UTC; needs a new clearance before lending\.$/);
    const [recall] = await listLoansNeedingRecall(MAIN, now);
    expect(recall).toMatchObject({ loanId: loan.id, coilTag: "T-1", borrower: "Riverside Library" });
    expect(recall!.instruction).toMatch(/^Recall it: failure recorded \(over voltage\)/);
  });
});
