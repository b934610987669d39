import { DEFAULT_CLEARANCE_POLICY } from "@/lib/calc/clearance-policy";
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { createSession, findLastTopLoadId, getSessionDetail, listSessions } from "@/lib/db/sessions";
import { backfillSessionFits, backfillSessionFitsEverySite } from "@/lib/db/session-fits";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
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
    const session = await createSession(mainScope(member.id), input);

    const detail = await getSessionDetail(mainScope(member.id), session.id);
    expect(detail?.samples).toHaveLength(7);
    expect(detail).toMatchObject({ supplyVoltageV: 48, durationS: 720, runningFrequencyHz: 334_000, loggedById: member.id, topLoadId: topLoad.id });
    const audit = await testDb.auditEvent.findMany({ where: { entity: "RunSession", entityId: session.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.summary).toContain("7 heat-sink samples");
    expect(audit[0]!).toMatchObject({ siteId: DEFAULT_SITE_ID, actorId: member.id });
    expect(await findLastTopLoadId(mainScope(member.id), coil.id)).toBe(topLoad.id);

    const analysis = analyzeRunSession(detail!.coil, detail!, detail!.coil.components, detail!.samples, { policy: DEFAULT_CLEARANCE_POLICY });
    expect(analysis.margins.voltage.status).not.toBe("unknown");
    expect(analysis.warmUp?.fit.steadyState).toBeGreaterThan(45);
  });

  it("refuses a top load of another coil and stores nothing", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id, "T-01");
    const other = await makeBenchCoil(member.id, "T-02");
    const input = sessionSchema.parse(form(coil.id, { topLoadId: other.topLoad.id }));
    await expect(createSession(mainScope(member.id), input)).rejects.toMatchObject({ field: "topLoadId" });
    await expect(createSession(mainScope(member.id), input)).rejects.toBeInstanceOf(RecordRefusedError);
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
    const session = await createSession(mainScope(steward.id), sessionSchema.parse(form(coil.id)));
    expect(session.loanId).toBe(loan.id);
  });
});

describe("a second site", () => {
  async function twoSites() {
    const member = await makeUser("m@club.test", "member");
    const { coil, topLoad } = await makeBenchCoil(member.id, "T-01");
    const session = await createSession(mainScope(member.id), sessionSchema.parse(form(coil.id, { topLoadId: topLoad.id, notes: "Fine run on the bench" })));
    const north = await createSite("north");
    const northMember = await makeUser("n@north.test", "member", "Nell North", north.id);
    return { member, coil, topLoad, session, north: siteScope(north.id, northMember.id), northSiteId: north.id };
  }

  it("cannot open, list or search the first site's sessions, nor read its coil's top load", async () => {
    const { coil, topLoad, session, north } = await twoSites();
    expect(await getSessionDetail(north, session.id)).toBeNull();
    expect((await getSessionDetail(mainScope(null), session.id))!.id).toBe(session.id);
    for (const filter of [{}, { q: "T-01" }, { q: "Test coil" }, { q: "fine run" }, { coilTag: "T-01" }, { outcome: "normal" as const }]) {
      expect((await listSessions(north, filter)).total).toBe(0);
      expect((await listSessions(mainScope(null), filter)).total).toBe(1);
    }
    expect(await findLastTopLoadId(north, coil.id)).toBeNull();
    expect(await findLastTopLoadId(mainScope(null), coil.id)).toBe(topLoad.id);
  });

  it("cannot log onto the first site's coil: refused as a coil that does not exist, and nothing stored", async () => {
    const { coil, north } = await twoSites();
    const before = { sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), audits: await testDb.auditEvent.count() };
    const otherSite = await createSession(north, sessionSchema.parse(form(coil.id))).catch((e: unknown) => e);
    const missing = await createSession(north, sessionSchema.parse(form("no-such-coil"))).catch((e: unknown) => e);
    expect(otherSite).toBeInstanceOf(RecordRefusedError);
    expect(otherSite).toMatchObject({ field: "coilId", message: (missing as Error).message });
    expect({ sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), audits: await testDb.auditEvent.count() }).toEqual(before);
  });

  it("logs onto its own coil of the same tag, audited at its own site; each site lists only its own", async () => {
    const { session, north, northSiteId } = await twoSites();
    const { coil: northCoil } = await makeBenchCoil(north.actorId!, "T-01", northSiteId);
    const northSession = await createSession(north, sessionSchema.parse(form(northCoil.id)));
    expect(northSession).toMatchObject({ coilTag: "T-01", loggedById: north.actorId });
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { entity: "RunSession", entityId: northSession.id } })).toMatchObject({ siteId: northSiteId, actorId: north.actorId });
    expect((await listSessions(north, { coilTag: "T-01" })).rows.map((r) => r.id)).toEqual([northSession.id]);
    expect((await listSessions(mainScope(null), { coilTag: "T-01" })).rows.map((r) => r.id)).toEqual([session.id]);
    expect(await getSessionDetail(mainScope(null), northSession.id)).toBeNull();
  });
});

describe("the warm-up fit backfill", () => {
  it("fits one site's sessions under its scope, and the setup task fits every site's, once", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id, "T-01");
    const north = await createSite("north");
    const { coil: northCoil } = await makeBenchCoil(member.id, "T-01", north.id);
    const samples = [0, 120, 240, 360, 480].map((elapsedS, i) => ({ elapsedS, temperatureC: 21 + 4 * i }));
    // Sessions as they were stored before fits were kept with the session: samples, no fit.
    const unfitted = (coilId: string) =>
      testDb.runSession.create({
        data: { coilId, startedAt: new Date("2026-01-10T14:05:00Z"), supplyVoltageV: 24, supplyCurrentA: 2, durationS: 480, ambientTempC: 21, samples: { create: samples } },
      });
    const mainSessions = [await unfitted(coil.id), await unfitted(coil.id)];
    const northSessions = [await unfitted(northCoil.id)];
    const fitted = async (ids: string[]) => testDb.runSession.count({ where: { id: { in: ids }, sinkFitSampleCount: { not: null } } });

    expect(await backfillSessionFits(mainScope(null))).toBe(2);
    expect(await fitted(mainSessions.map((s) => s.id))).toBe(2);
    expect(await fitted(northSessions.map((s) => s.id))).toBe(0);
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { entity: "RunSession", action: "update" } })).toMatchObject({ siteId: DEFAULT_SITE_ID, actorId: null });

    expect(Object.fromEntries(await backfillSessionFitsEverySite())).toEqual({ [DEFAULT_SITE_ID]: 0, [north.id]: 1 });
    expect(await fitted(northSessions.map((s) => s.id))).toBe(1);
    expect(await testDb.auditEvent.count({ where: { entity: "RunSession", action: "update", siteId: north.id } })).toBe(1);
    expect([...(await backfillSessionFitsEverySite()).values()]).toEqual([0, 0]);
  });
});
