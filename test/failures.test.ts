import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { beforeEach, describe, expect, it } from "vitest";
import { mainScope, makeUser, resetDatabase, testDb } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { createSession } from "@/lib/db/sessions";
import { completePostMortem, createFailure, getFailureDetail, listFailures } from "@/lib/db/failures";
import { getFleetOverview, getPartReliability } from "@/lib/db/fleet";
import { sessionSchema } from "@/lib/validation/session";
import { failureSchema, postMortemSchema } from "@/lib/validation/failure";
import { analyzePostMortem } from "@/lib/analysis/post-mortem";
import { judgeCoil } from "@/lib/analysis/coil-health-input";
import { readCoilPage } from "@/lib/db/coil-page";

beforeEach(resetDatabase);

/** Reads at the default site, as a single-club install makes them. */
const MAIN = mainScope(null);

async function benchWithSession() {
  const member = await makeUser("m@club.test", "member");
  const steward = await makeUser("s@club.test", "steward");
  const bench = await makeBenchCoil(member.id);
  const session = await createSession(mainScope(member.id),
    sessionSchema.parse({
      coilId: bench.coil.id,
      startedAt: "2026-01-10T14:05",
      supplyVoltageV: "160 V",
      supplyCurrentA: "3 A",
      durationS: "10 min",
      ambientTempC: "22",
      heatSinkEndC: "70",
      peakSwitchVoltageV: "380 V",
      samples: "0:00 22\n2:00 40\n4:00 52\n6:00 60\n8:00 66\n10:00 70",
    }),
  );
  return { member, steward, ...bench, session };
}

const failureForm = (coilId: string, extra: Record<string, string> = {}) => ({
  coilId,
  mode: "over_voltage",
  occurredAt: "2026-01-10T14:14",
  symptoms: "Loud crack, supply tripped; switch short collector to emitter.",
  ...extra,
});

describe("recording a failure", () => {
  it("stores the failure and sets its session's outcome to failed in one transaction", async () => {
    const { member, coil, sw, session } = await benchWithSession();
    const failure = await createFailure(mainScope(member.id), failureSchema.parse(failureForm(coil.id, { sessionId: session.id, componentId: sw.id })));
    expect(failure.status).toBe("open");
    expect((await testDb.runSession.findUniqueOrThrow({ where: { id: session.id } })).outcome).toBe("failed");
    expect(await testDb.auditEvent.count({ where: { entity: "Failure", entityId: failure.id } })).toBe(1);
  });

  it("refuses a part that was not fitted then, and leaves the session untouched", async () => {
    const { member, coil, session } = await benchWithSession();
    const later = await testDb.component.create({ data: { coilId: coil.id, kind: "fan", partNumber: "Fan 80", installedAt: new Date("2026-02-01") } });
    await expect(createFailure(mainScope(member.id), failureSchema.parse(failureForm(coil.id, { sessionId: session.id, componentId: later.id })))).rejects.toMatchObject({
      field: "componentId",
    });
    expect(await testDb.failure.count()).toBe(0);
    expect((await testDb.runSession.findUniqueOrThrow({ where: { id: session.id } })).outcome).toBe("normal");
  });

  it("refuses missing symptoms and an unknown mode in the schema", () => {
    const result = failureSchema.safeParse(failureForm("x", { symptoms: "", mode: "gremlins" }));
    expect(result.error!.issues.map((i) => i.path[0])).toEqual(expect.arrayContaining(["symptoms", "mode"]));
  });
});

describe("completing a post-mortem", () => {
  async function openFailure() {
    const bench = await benchWithSession();
    const failure = await createFailure(mainScope(bench.member.id), failureSchema.parse(failureForm(bench.coil.id, { sessionId: bench.session.id, componentId: bench.sw.id })));
    return { ...bench, failure };
  }

  const completion = (failureId: string, replacement?: Record<string, string>) =>
    postMortemSchema.parse({
      failureId,
      rootCause: "Peak collector voltage ran at 95 % of the rating with no clamp fitted.",
      correctiveAction: "Fit an 800 V part and a clamp; log the peak voltage every session.",
      replacement,
    });

  it("closes the failure and records the replacement part with the failed part's removal, audited", async () => {
    const { steward, failure, sw, coil } = await openFailure();
    const result = await completePostMortem(mainScope(steward.id), completion(failure.id, { partNumber: "MJE13009G", installedAt: "2026-01-12T10:00", voltageRatingV: "700 V", peakCurrentA: "24", maxJunctionTempC: "150" }));

    const closed = await testDb.failure.findUniqueOrThrow({ where: { id: failure.id } });
    expect(closed).toMatchObject({ status: "closed", closedById: steward.id, replacementComponentId: result.replacementId });
    expect(closed.closedAt).toBeInstanceOf(Date);
    const failed = await testDb.component.findUniqueOrThrow({ where: { id: sw.id } });
    expect(failed.replacedById).toBe(result.replacementId);
    expect(failed.removedAt?.getTime()).toBe(new Date("2026-01-12T10:00").getTime());
    expect(failed.removalReason).toMatch(/^Failed \(over voltage\)/);
    const replacement = await testDb.component.findUniqueOrThrow({ where: { id: result.replacementId! } });
    expect(replacement).toMatchObject({ coilId: coil.id, kind: "switch", switchType: "bjt", voltageRatingV: 700, peakCurrentA: 24 });
    expect(await testDb.auditEvent.count({ where: { entityId: { in: [failure.id, replacement.id] }, action: { not: "create" } } })).toBe(1);
    expect(await testDb.auditEvent.count({ where: { entity: "Component", entityId: replacement.id } })).toBe(1);
  });

  it("leaves nothing half-written when the replacement is refused part-way (fitted before the failure)", async () => {
    const { steward, failure, sw } = await openFailure();
    const auditBefore = await testDb.auditEvent.count();
    await expect(completePostMortem(mainScope(steward.id), completion(failure.id, { partNumber: "MJE13009G", installedAt: "2026-01-01T10:00" }))).rejects.toMatchObject({
      field: "replacement.installedAt",
    });
    expect((await testDb.failure.findUniqueOrThrow({ where: { id: failure.id } })).status).toBe("open");
    expect((await testDb.component.findUniqueOrThrow({ where: { id: sw.id } })).removedAt).toBeNull();
    expect(await testDb.component.count()).toBe(2);
    expect(await testDb.auditEvent.count()).toBe(auditBefore);
  });

  it("sets the mode the post-mortem found, audited, and the list, reliability and ranking follow it", async () => {
    const bench = await benchWithSession();
    const failure = await createFailure(mainScope(bench.member.id),
      failureSchema.parse(failureForm(bench.coil.id, { sessionId: bench.session.id, componentId: bench.sw.id, mode: "unknown" })),
    );
    await completePostMortem(mainScope(bench.steward.id), postMortemSchema.parse({ ...completion(failure.id), mode: "over_voltage" }));

    expect((await testDb.failure.findUniqueOrThrow({ where: { id: failure.id } })).mode).toBe("over_voltage");
    const audit = await testDb.auditEvent.findFirstOrThrow({ where: { entity: "Failure", entityId: failure.id, action: "update" } });
    expect(audit.summary).toMatch(/mode unknown → over voltage/);
    expect(JSON.parse(audit.detailJson ?? "{}")).toMatchObject({ mode: { from: "unknown", to: "over_voltage" } });
    expect((await listFailures(MAIN, { mode: "over_voltage" })).rows.map((f) => f.id)).toEqual([failure.id]);
    expect((await listFailures(MAIN, { mode: "unknown" })).total).toBe(0);
    const { parts } = await getPartReliability(MAIN);
    expect(parts.find((p) => p.partNumber === "MJE13009")?.failureModes).toEqual([["over_voltage", 1]]);
    const detail = (await getFailureDetail(MAIN, failure.id))!;
    const analysis = analyzePostMortem({ coil: detail.coil, components: detail.coil.components, failure: detail, sessionsBefore: detail.recentSessions, policy: DEFAULT_CLEARANCE_POLICY });
    expect(analysis.causes[0]!.cause).toBe("over_voltage");
  });

  it("keeps the recorded mode when the post-mortem names none", async () => {
    const { steward, failure } = await openFailure();
    await completePostMortem(mainScope(steward.id), completion(failure.id));
    expect((await testDb.failure.findUniqueOrThrow({ where: { id: failure.id } })).mode).toBe("over_voltage");
  });

  it("holds the coil on the dashboard and its page while the failure is open, and lets the margins judge it again once closed", async () => {
    const { steward, failure, coil } = await openFailure();
    const now = new Date();
    const dashboardRow = async () => (await getFleetOverview(MAIN, now)).find((r) => r.id === coil.id)!;
    const pageHealth = async () => judgeCoil((await readCoilPage(MAIN, coil.tag))!.history, DEFAULT_CLEARANCE_POLICY, now).health!;

    const open = await dashboardRow();
    expect(open.health).toBe("hold");
    expect(open.reasons[0]).toMatch(/^A failure \(over voltage\) recorded on .* is still open/);
    expect((await pageHealth()).status).toBe("hold");
    expect((await pageHealth()).reasons).toEqual(open.reasons);

    await completePostMortem(mainScope(steward.id), completion(failure.id));
    const closed = await dashboardRow();
    expect(closed.reasons.some((r) => r.includes("is still open"))).toBe(false);
    expect((await pageHealth()).status).toBe(closed.health);
  });

  it("refuses to complete a post-mortem twice", async () => {
    const { steward, failure } = await openFailure();
    await completePostMortem(mainScope(steward.id), completion(failure.id));
    await expect(completePostMortem(mainScope(steward.id), completion(failure.id))).rejects.toMatchObject({ conflict: true });
  });

  it("refuses a replacement without a part number in the schema", () => {
    const result = postMortemSchema.safeParse({ failureId: "f", rootCause: "x".repeat(12), correctiveAction: "y".repeat(12), replacement: { partNumber: "", installedAt: "2026-01-12T10:00" } });
    expect(result.error!.issues[0]!.path.join(".")).toBe("replacement.partNumber");
  });

  it("reads the sessions before the failure into ranked causes with evidence", async () => {
    const { failure } = await openFailure();
    const detail = (await getFailureDetail(MAIN, failure.id))!;
    const analysis = analyzePostMortem({ coil: detail.coil, components: detail.coil.components, failure: detail, sessionsBefore: detail.recentSessions, policy: DEFAULT_CLEARANCE_POLICY });
    expect(analysis.sessions).toHaveLength(1);
    expect(analysis.partsAtFailure.switches.map((s) => s.partNumber)).toEqual(["MJE13009"]);
    expect(analysis.causes[0]!.cause).toBe("over_voltage");
    expect(analysis.causes[0]!.evidence.join(" ")).toMatch(/over-voltage|voltage/);
  });
});
