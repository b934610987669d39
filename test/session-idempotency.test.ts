/**
 * The session log's idempotency key (RunSession.clientKey): a replayed, double-tapped or racing submit with one
 * key stores one session, its heat-sink samples once, one audit event and one summary bump. Meant to run on both
 * databases (SQLite by default; scripts/test-postgres.sh for PostgreSQL), since PostgreSQL's concurrent
 * transactions expose the race that SQLite's single writer hides.
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { makeUser, resetDatabase, testDb } from "./support/db";
import { makeBenchCoil } from "./support/bench-fixtures";
import { closeWriters, openWriters, outcomes, type Writer } from "./support/writers";
import { createSession } from "@/lib/db/sessions";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { sessionSchema } from "@/lib/validation/session";

const KEY = "3f0c1b7e-5a2d-4c8e-9b1f-2d6a7e8c9f01";
const SAMPLE_COUNT = 4;

const form = (coilId: string, extra: Record<string, string> = {}) => ({
  coilId,
  startedAt: "2026-01-10T14:05",
  supplyVoltageV: "48 V",
  supplyCurrentA: "2.5 A",
  durationS: "6 min",
  ambientTempC: "21",
  samples: "0:00,21\n2:00,30.6\n4:00,37.1\n6:00,41.2",
  ...extra,
});

let writers: Writer[] = [];
beforeEach(resetDatabase);
afterEach(() => closeWriters(writers));

async function rowsFor(coilId: string) {
  const sessions = await testDb.runSession.findMany({ where: { coilId }, select: { id: true, clientKey: true } });
  return {
    sessions,
    samples: await testDb.heatSinkSample.count({ where: { session: { coilId } } }),
    audits: await testDb.auditEvent.count({ where: { entity: "RunSession" } }),
    revision: (await testDb.coilSummary.findUnique({ where: { coilId } }))?.revision ?? 0,
  };
}

describe("a session submitted with an idempotency key", () => {
  it("is stored once when sent twice in a row: the second answer is the stored session, flagged as a replay", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id, { clientKey: KEY }));
    const first = await createSession(member.id, input);
    const before = await rowsFor(coil.id);
    const second = await createSession(member.id, input);

    expect(first.replayed).toBe(false);
    expect(second).toMatchObject({ id: first.id, coilTag: coil.tag, replayed: true });
    const after = await rowsFor(coil.id);
    expect(after.sessions).toEqual([{ id: first.id, clientKey: KEY }]);
    expect(after.samples).toBe(SAMPLE_COUNT);
    expect(after.audits).toBe(1);
    // The replay wrote nothing, so the coil's summary is not marked changed a second time.
    expect(after.revision).toBe(before.revision);
  });

  it("is stored once when several connections send it at the same moment", async () => {
    writers = await openWriters(4);
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id, { clientKey: KEY }));
    const revisionBefore = (await rowsFor(coil.id)).revision;

    const { stored, refused } = outcomes(await Promise.allSettled(writers.map((w) => w.sessions.createSession(member.id, input))));

    expect(refused).toEqual([]);
    expect(new Set(stored.map((s) => s.id)).size).toBe(1);
    expect(stored.filter((s) => !s.replayed)).toHaveLength(1);
    const after = await rowsFor(coil.id);
    expect(after.sessions).toHaveLength(1);
    expect(after.sessions[0]!.id).toBe(stored[0]!.id);
    expect(after.samples).toBe(SAMPLE_COUNT);
    expect(after.audits).toBe(1);
    expect(after.revision).toBe(revisionBefore + 1);
  });

  it("without a key, each submit is a new session (scripts that send none keep today's behaviour)", async () => {
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id));
    const a = await createSession(member.id, input);
    const b = await createSession(member.id, input);
    expect(a.id).not.toBe(b.id);
    const after = await rowsFor(coil.id);
    expect(after.sessions.map((s) => s.clientKey)).toEqual([null, null]);
    expect(after.samples).toBe(2 * SAMPLE_COUNT);
    expect(after.audits).toBe(2);
  });

  it("refuses another member's key rather than showing them that member's session", async () => {
    const member = await makeUser("m@club.test", "member");
    const other = await makeUser("o@club.test", "member");
    const { coil } = await makeBenchCoil(member.id);
    const input = sessionSchema.parse(form(coil.id, { clientKey: KEY }));
    await createSession(member.id, input);
    const refusal = createSession(other.id, input);
    await expect(refusal).rejects.toBeInstanceOf(RecordRefusedError);
    await expect(createSession(other.id, input)).rejects.toMatchObject({ field: "clientKey" });
    expect((await rowsFor(coil.id)).sessions).toHaveLength(1);
  });

  it("reads the key as a UUID, case-insensitively, and refuses anything else by name", () => {
    expect(sessionSchema.parse(form("c1", { clientKey: KEY.toUpperCase() })).clientKey).toBe(KEY);
    expect(sessionSchema.parse(form("c1", { clientKey: "" })).clientKey).toBeUndefined();
    const parsed = sessionSchema.safeParse(form("c1", { clientKey: "resend-1" }));
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]).toMatchObject({ path: ["clientKey"], message: expect.stringContaining("Submission key") });
  });
});
