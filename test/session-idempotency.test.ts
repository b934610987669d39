/**
 * The session log's idempotency key (RunSession.clientKey): a replayed, double-tapped or racing submit with one
 * key stores one session, its heat-sink samples once, one audit event and one summary bump. Meant to run on both
 * databases (SQLite by default; scripts/test-postgres.sh for PostgreSQL), since PostgreSQL's concurrent
 * transactions expose the race that SQLite's single writer hides.
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { addMembership, createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
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
    const first = await createSession(mainScope(member.id), input);
    const before = await rowsFor(coil.id);
    const second = await createSession(mainScope(member.id), input);

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

    const { stored, refused } = outcomes(await Promise.allSettled(writers.map((w) => w.sessions.createSession(mainScope(member.id), input))));

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
    const a = await createSession(mainScope(member.id), input);
    const b = await createSession(mainScope(member.id), input);
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
    await createSession(mainScope(member.id), input);
    const refusal = createSession(mainScope(other.id), input);
    await expect(refusal).rejects.toBeInstanceOf(RecordRefusedError);
    await expect(createSession(mainScope(other.id), input)).rejects.toMatchObject({ field: "clientKey" });
    expect((await rowsFor(coil.id)).sessions).toHaveLength(1);
  });

  it("refuses a key used at another site without showing that session, even to the member who logged it there", async () => {
    const member = await makeUser("m@club.test", "member", "Mira Main");
    const { coil } = await makeBenchCoil(member.id, "T-01");
    const stored = await createSession(mainScope(member.id), sessionSchema.parse(form(coil.id, { clientKey: KEY })));
    const north = await createSite("north");
    const northMember = await makeUser("n@north.test", "member", "Nell North", north.id);
    const { coil: northCoil } = await makeBenchCoil(northMember.id, "N-01", north.id);
    await addMembership(member.id, north.id, "member");
    const before = { sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), audits: await testDb.auditEvent.count() };

    for (const actorId of [northMember.id, member.id]) {
      const refusal = await createSession(siteScope(north.id, actorId), sessionSchema.parse(form(northCoil.id, { clientKey: KEY }))).catch((e: unknown) => e);
      expect(refusal).toBeInstanceOf(RecordRefusedError);
      expect(refusal).toMatchObject({ field: "clientKey" });
      // Nothing of the first site's session comes back: not its id, coil or who logged it.
      const said = JSON.stringify({ message: (refusal as Error).message, ...(refusal as object) });
      for (const secret of [stored.id, coil.id, coil.tag, "Mira Main"]) expect(said).not.toContain(secret);
    }
    // Sent at its own site by the member who logged it, the same key is still a replay.
    expect(await createSession(mainScope(member.id), sessionSchema.parse(form(coil.id, { clientKey: KEY })))).toMatchObject({ id: stored.id, replayed: true });
    expect({ sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), audits: await testDb.auditEvent.count() }).toEqual(before);
  });

  it("sent at the same moment from two sites with one key: one session is stored, and only its own site is answered with it", async () => {
    writers = await openWriters(4);
    const member = await makeUser("m@club.test", "member");
    const { coil } = await makeBenchCoil(member.id, "T-01");
    const north = await createSite("north");
    const northMember = await makeUser("n@north.test", "member", "Nell North", north.id);
    const { coil: northCoil } = await makeBenchCoil(northMember.id, "T-01", north.id);
    const sides = [
      { scope: mainScope(member.id), input: sessionSchema.parse(form(coil.id, { clientKey: KEY })), coilId: coil.id },
      { scope: siteScope(north.id, northMember.id), input: sessionSchema.parse(form(northCoil.id, { clientKey: KEY })), coilId: northCoil.id },
    ];

    const settled = await Promise.allSettled(writers.map((w, i) => w.sessions.createSession(sides[i % 2]!.scope, sides[i % 2]!.input)));

    const [session, ...others] = await testDb.runSession.findMany({ where: { clientKey: KEY } });
    expect(others).toEqual([]);
    const winner = sides.find((side) => side.coilId === session!.coilId)!;
    settled.forEach((result, i) => {
      if (sides[i % 2] === winner) expect(result).toMatchObject({ status: "fulfilled", value: { id: session!.id } });
      else expect(result).toMatchObject({ status: "rejected", reason: { field: "clientKey" } });
    });
    expect(await testDb.heatSinkSample.count()).toBe(SAMPLE_COUNT);
    expect(await testDb.auditEvent.count({ where: { entity: "RunSession" } })).toBe(1);
  });

  it("reads the key as a UUID, case-insensitively, and refuses anything else by name", () => {
    expect(sessionSchema.parse(form("c1", { clientKey: KEY.toUpperCase() })).clientKey).toBe(KEY);
    expect(sessionSchema.parse(form("c1", { clientKey: "" })).clientKey).toBeUndefined();
    const parsed = sessionSchema.safeParse(form("c1", { clientKey: "resend-1" }));
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]).toMatchObject({ path: ["clientKey"], message: expect.stringContaining("Submission key") });
  });
});
