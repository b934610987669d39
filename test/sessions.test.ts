import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { beforeEach, describe, expect, it } from "vitest";
import { makeUser, resetDatabase, testDb } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { createSession, findLastTopLoadId, getSessionDetail } from "@/lib/db/sessions";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { sessionSchema } from "@/lib/validation/session";
import { analyzeRunSession } from "@/lib/analysis/session-analysis";

beforeEach(resetDatabase);

const form = (coilId: string, extra: Record<string, string> = {}) => ({
  coilId,
  startedAt: "2026-01-10T14:05",
  supplyVoltageV: "48 V",
  supplyCurrentA: "2.5 A",
  durationS: "12 min",
  ambientTempC: "21",
  heatSinkStartC: "21",
  heatSinkEndC: "46",
  runningFrequencyHz: "334k",
  samples: "time,temp\n0:00,21\n2:00,30.6\n4:00,37.1\n6:00,41.2\n8:00,43.9\n10:00,45.3\n12:00,46.2",
  ...extra,
});

describe("logging a run session", () => {
  it("stores the session, its samples and an audit entry, and reads back through the analysis", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil, topLoad } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id, { topLoadId: topLoad.id }));
    const session = await createSession(member.id, input);

    const detail = await getSessionDetail(session.id);
    expect(detail?.samples).toHaveLength(7);
    expect(detail).toMatchObject({ supplyVoltageV: 48, durationS: 720, runningFrequencyHz: 334_000, loggedById: member.id, topLoadId: topLoad.id });
    const audit = await testDb.auditEvent.findMany({ where: { entity: "RunSession", entityId: session.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.summary).toContain("7 heat-sink samples");
    expect(await findLastTopLoadId(coil.id)).toBe(topLoad.id);

    const analysis = analyzeRunSession(detail!.coil, detail!, detail!.coil.components, detail!.samples, { policy: DEFAULT_CLEARANCE_POLICY });
    expect(analysis.margins.voltage.status).not.toBe("unknown");
    expect(analysis.warmUp?.fit.steadyState).toBeGreaterThan(45);
  });

  it("refuses a top load of another coil and stores nothing", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id, "T-01");
    const other = await makeBenchCoil(member.id, "T-02");
    const input = sessionSchema.parse(form(coil.id, { topLoadId: other.topLoad.id }));
    await expect(createSession(member.id, input)).rejects.toMatchObject({ field: "topLoadId" });
    await expect(createSession(member.id, input)).rejects.toBeInstanceOf(RecordRefusedError);
    expect(await testDb.runSession.count()).toBe(0);
    expect(await testDb.heatSinkSample.count()).toBe(0);
    expect(await testDb.auditEvent.count()).toBe(0);
  });

  it("refuses bad input before anything is written: the schema names the field, row and column", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const result = sessionSchema.safeParse(form(coil.id, { supplyVoltageV: "lots", samples: "0:00,21\n0:30,hot" }));
    expect(result.success).toBe(false);
    const messages = result.error!.issues.map((i) => i.message).join(" ");
    expect(messages).toMatch(/Supply voltage/);
    expect(messages).toMatch(/Row 2, temperature column/);
    expect(await testDb.runSession.count()).toBe(0);
  });

  it("links a session run while the coil was out on loan to the loan", async () => {
    const steward = await makeUser("s@club.test", "steward");
    const { coil } = await makeBenchCoil(steward.id);
    const policy = await testDb.clearancePolicy.create({ data: { version: 1, rulesJson: "{}" } });
    const clearance = await testDb.clearance.create({
      data: { coilId: coil.id, policyId: policy.id, decidedAt: new Date("2026-01-01"), validUntil: new Date("2026-06-01"), verdict: "cleared", ruleResultsJson: "[]", checklistJson: "[]" },
    });
    const loan = await testDb.loan.create({
      data: { coilId: coil.id, clearanceId: clearance.id, borrower: "School fair", event: "Open day", outAt: new Date("2026-01-09T12:00:00Z"), expectedBackAt: new Date("2026-01-20") },
    });
    const session = await createSession(steward.id, sessionSchema.parse(form(coil.id)));
    expect(session.loanId).toBe(loan.id);
  });
});
