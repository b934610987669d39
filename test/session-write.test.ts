/**
 * The session write's own SQL (lib/db/sessions.ts insertSession on lib/db/session-write.ts's adapter transaction)
 * against the query API's reading of what it stored, on SQLite and on PostgreSQL (scripts/test-postgres.sh): the
 * returned session is the stored row field for field (types included), the samples and audit event are what the query
 * API would have written, the checks inside the INSERT pick the same loan and refuse the same coils and top loads as
 * the query API's look-ups, and the revision bump matches the upsert every other writer uses.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { createSession } from "@/lib/db/sessions";
import { markCoilChanged } from "@/lib/db/coil-summary";
import { inAdapterTransaction, newRecordId } from "@/lib/db/session-write";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import { sessionSchema } from "@/lib/validation/session";

beforeEach(resetDatabase);

const form = (coilId: string, extra: Record<string, string> = {}) => ({
  coilId,
  startedAt: "2026-01-10T14:05",
  supplyVoltageV: "48 V",
  supplyCurrentA: "2.5 A",
  durationS: "12 min",
  ambientTempC: "21",
  samples: "0:00,21\n2:00,30.6\n4:00,37.1\n6:00,41.2\n8:00,43.9",
  ...extra,
});

/** What the query API would have chosen as the session's loan (the look-up the write used to make). */
function loanByQueryApi(coilId: string, startedAt: Date) {
  return testDb.loan.findFirst({ where: { coilId, outAt: { lte: startedAt }, OR: [{ returnedAt: null }, { returnedAt: { gt: startedAt } }] }, select: { id: true } });
}

async function makeLoan(coilId: string, outAt: string, returnedAt: string | null) {
  const policy = (await testDb.clearancePolicy.findFirst({ where: { version: 1 } })) ?? (await testDb.clearancePolicy.create({ data: { version: 1, rulesJson: "{}" } }));
  const clearance = await testDb.clearance.create({
    data: { coilId, policyId: policy.id, decidedAt: new Date("2025-12-01"), validUntil: new Date("2026-12-01"), verdict: "cleared", ruleResultsJson: "[]", checklistJson: "[]" },
  });
  return testDb.loan.create({
    data: { coilId, clearanceId: clearance.id, borrower: "School fair", event: "Open day", outAt: new Date(outAt), expectedBackAt: new Date("2026-02-01"), returnedAt: returnedAt ? new Date(returnedAt) : null },
  });
}

describe("the session write's SQL, read back through the query API", () => {
  it("returns exactly the stored row, with every optional field, the fit, the key and the loan", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil, topLoad } = await makeBenchCoil(member.id);
    const loan = await makeLoan(coil.id, "2026-01-09T12:00:00Z", null);
    const input = sessionSchema.parse(
      form(coil.id, {
        topLoadId: topLoad.id,
        heatSinkStartC: "21",
        heatSinkEndC: "46",
        runningFrequencyHz: "334k",
        peakSwitchVoltageV: "160 V",
        dutyCycle: "0.42",
        outcome: "anomaly",
        notes: "Arc to the strike rail; “quotes” and 'apostrophes' kept",
        clientKey: "7d0c1b7e-5a2d-4c8e-9b1f-2d6a7e8c9f02",
      }),
    );
    const { coilTag, replayed, ...returned } = await createSession(mainScope(member.id), input);

    const stored = await testDb.runSession.findUniqueOrThrow({ where: { id: returned.id } });
    expect(returned).toStrictEqual(stored);
    expect({ coilTag, replayed }).toEqual({ coilTag: coil.tag, replayed: false });
    expect(stored).toMatchObject({ loanId: loan.id, topLoadId: topLoad.id, loggedById: member.id, outcome: "anomaly", dutyCycle: 0.42, sinkFitSampleCount: 5 });
    expect(stored.startedAt).toEqual(input.startedAt);
    expect(stored.sinkSteadyStateC).toEqual(expect.any(Number));
  });

  it("returns the stored row for a bare session too: nulls where nothing was given, no loan, no fit below three samples", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const { coilTag: _tag, replayed: _replayed, ...returned } = await createSession(mainScope(member.id), sessionSchema.parse(form(coil.id, { samples: "0:00,21\n2:00,30" })));
    const stored = await testDb.runSession.findUniqueOrThrow({ where: { id: returned.id } });
    expect(returned).toStrictEqual(stored);
    expect(stored).toMatchObject({ topLoadId: null, loanId: null, clientKey: null, heatSinkEndC: null, sinkFitSampleCount: 2, sinkFitJson: null, outcome: "normal", notes: "" });
  });

  it("stores the samples in order, as numbers, and the audit event as recordAudit's query-API path writes it", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id));
    const before = new Date();
    const session = await createSession(mainScope(member.id), input);
    const after = new Date();

    const samples = await testDb.heatSinkSample.findMany({ where: { sessionId: session.id }, orderBy: { id: "asc" }, select: { elapsedS: true, temperatureC: true } });
    expect(samples).toEqual(input.samples.map((s) => ({ elapsedS: s.elapsedS, temperatureC: s.temperatureC })));
    const [event, ...others] = await testDb.auditEvent.findMany({ where: { entity: "RunSession", entityId: session.id } });
    expect(others).toEqual([]);
    const { samples: _samples, ...fields } = input;
    expect(event).toMatchObject({
      siteId: DEFAULT_SITE_ID,
      actorId: member.id,
      action: "create",
      summary: `Logged a 12 min session on ${coil.tag} at 48 V with 5 heat-sink samples`,
      detailJson: JSON.stringify({ ...fields, sampleCount: 5 }),
    });
    expect(event!.at).toBeInstanceOf(Date);
    expect(event!.at.getTime()).toBeGreaterThanOrEqual(before.getTime());
    expect(event!.at.getTime()).toBeLessThanOrEqual(after.getTime());
  });

  it("links the same loan as the query API's look-up, at the window's edges too", async () => {
    const member = await makeUser("m@club.test", "member");
    // [outAt, returnedAt] against a start of 2026-01-10 14:05 local time; the edges compare instants as stored.
    const start = sessionSchema.parse(form("x")).startedAt.toISOString();
    const windows: [string, string | null][] = [
      [start, null], // out at the very minute: included (outAt ≤ start)
      ["2026-01-01T00:00:00Z", start], // back at the very minute: not open any more (returnedAt > start fails)
      ["2026-01-01T00:00:00Z", "2026-01-11T00:00:00Z"], // out over the start
      ["2026-01-11T00:00:00Z", null], // out after the start
    ];
    for (const [i, [outAt, returnedAt]] of windows.entries()) {
      const { coil } = await makeBenchCoil(member.id, `L-0${i}`);
      await makeLoan(coil.id, outAt, returnedAt);
      const session = await createSession(mainScope(member.id), sessionSchema.parse(form(coil.id)));
      const expected = await loanByQueryApi(coil.id, session.startedAt);
      expect(session.loanId).toBe(expected?.id ?? null);
    }
    const linked = await testDb.runSession.count({ where: { loanId: { not: null } } });
    expect(linked).toBe(2);
  });

  it("refuses as the query API's look-ups did, and stores nothing: another site's coil, a missing coil, another coil's top load", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil, topLoad } = await makeBenchCoil(member.id, "T-01");
    const other = await makeBenchCoil(member.id, "T-02");
    const north = await createSite("north");
    const northMember = await makeUser("n@north.test", "member", "Nell North", north.id);
    const cases: [ReturnType<typeof mainScope>, Record<string, string>, string, string][] = [
      [siteScope(north.id, northMember.id), form(coil.id), "coilId", "Coil: that coil does not exist."],
      [mainScope(member.id), form("no-such-coil"), "coilId", "Coil: that coil does not exist."],
      [mainScope(member.id), form(coil.id, { topLoadId: other.topLoad.id }), "topLoadId", "Top load: choose one of T-01's top loads."],
      [mainScope(member.id), form(coil.id, { topLoadId: "no-such-top-load" }), "topLoadId", "Top load: choose one of T-01's top loads."],
      [siteScope(north.id, northMember.id), form(coil.id, { topLoadId: topLoad.id }), "coilId", "Coil: that coil does not exist."],
    ];
    for (const [scope, values, field, message] of cases) {
      const refusal = await createSession(scope, sessionSchema.parse(values)).catch((e: unknown) => e);
      expect(refusal).toBeInstanceOf(RecordRefusedError);
      expect(refusal).toMatchObject({ field, message });
    }
    expect({ sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), audits: await testDb.auditEvent.count(), summaries: await testDb.coilSummary.count({ where: { revision: { gt: 1 } } }) }).toEqual({
      sessions: 0,
      samples: 0,
      audits: 0,
      summaries: 0,
    });
  });

  it("bumps the summary's revision as the query API's upsert does: a first write creates it at 1, each later one adds 1", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil: bySql } = await makeBenchCoil(member.id, "S-01");
    const { coil: byUpsert } = await makeBenchCoil(member.id, "S-02");
    await testDb.coilSummary.deleteMany({ where: { coilId: { in: [bySql.id, byUpsert.id] } } });
    for (let i = 0; i < 3; i++) {
      await inAdapterTransaction((runner) => markCoilChanged(runner, bySql.id));
      await testDb.$transaction((tx) => markCoilChanged(tx, byUpsert.id));
      const [a, b] = await Promise.all([bySql.id, byUpsert.id].map((coilId) => testDb.coilSummary.findUniqueOrThrow({ where: { coilId } })));
      const { coilId: _a, ...sqlRow } = a!;
      const { coilId: _b, ...upsertRow } = b!;
      expect(sqlRow).toStrictEqual(upsertRow);
      expect(sqlRow.revision).toBe(i + 1);
    }
  });

  it("rolls the whole transaction back when a statement fails", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const revision = (await testDb.coilSummary.findUnique({ where: { coilId: coil.id } }))?.revision ?? 0;
    const failed = await inAdapterTransaction(async (runner) => {
      await markCoilChanged(runner, coil.id);
      throw new Error("stop here");
    }).catch((e: unknown) => e);
    expect(failed).toMatchObject({ message: "stop here" });
    expect((await testDb.coilSummary.findUnique({ where: { coilId: coil.id } }))?.revision ?? 0).toBe(revision);
  });

  it("makes ids shaped like the query API's cuid() ones, unique and in the order made", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const byQueryApi = (await testDb.runSession.create({ data: { coilId: coil.id, startedAt: new Date(), supplyVoltageV: 24, supplyCurrentA: 1, durationS: 60, ambientTempC: 20 } })).id;
    const ids = Array.from({ length: 200 }, () => newRecordId());
    expect(new Set(ids).size).toBe(ids.length);
    expect([...ids].sort()).toEqual(ids);
    for (const id of [...ids, byQueryApi]) expect(id).toMatch(/^c[0-9a-z]{24}$/);
  });
});
