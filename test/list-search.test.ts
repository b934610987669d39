/**
 * The lists' server-side search (sweeps and sessions, by coil) and the admin audit log's filters, through lib/db's
 * text search so both databases match case-insensitively (run on PostgreSQL too by scripts/test-postgres.sh).
 */
import { beforeEach, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { listSweeps } from "@/lib/db/sweeps";
import { listSessions } from "@/lib/db/sessions";
import { listAuditEntities, listAuditEvents } from "@/lib/db/audit";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

const main = mainScope(null);

beforeEach(resetDatabase);

describe("list search", () => {
  it("finds a coil's sweeps and sessions by its tag or name, whatever the case", async () => {
    const now = new Date();
    await makeCleanCoil("KM-21", now);
    await makeCleanCoil("QX-9", now);
    for (const q of ["qx-9", "Coil QX"]) {
      const sweeps = await listSweeps(main, { q });
      expect(sweeps.total).toBeGreaterThan(0);
      expect(sweeps.rows.every((s) => s.coil.tag === "QX-9")).toBe(true);
      const sessions = await listSessions(main, { q });
      expect(sessions.total).toBeGreaterThan(0);
      expect(sessions.rows.every((s) => s.coil.tag === "QX-9")).toBe(true);
    }
    expect((await listSweeps(main, { q: "no such coil" })).total).toBe(0);
    expect((await listSweeps(main, {})).total).toBe((await listSweeps(main, { q: "km-21" })).total + (await listSweeps(main, { q: "QX-9" })).total);
  });

  it("looks only inside the searching site, even for a tag both sites use", async () => {
    const now = new Date();
    const mainCoil = await makeCleanCoil("QX-9", now);
    const north = await createSite("north");
    const northCoil = await makeCleanCoil("QX-9", now, undefined, north.id);
    await makeCleanCoil("NW-4", now, undefined, north.id);
    const northScope = siteScope(north.id, null);
    for (const q of ["qx-9", "Coil QX", "coil"]) {
      for (const [scope, coilId] of [[main, mainCoil.id], [northScope, northCoil.id]] as const) {
        const sweeps = await listSweeps(scope, { q, coilTag: "QX-9" });
        expect(sweeps.total).toBeGreaterThan(0);
        expect(sweeps.rows.every((s) => s.coilId === coilId)).toBe(true);
        const sessions = await listSessions(scope, { q, coilTag: "QX-9" });
        expect(sessions.total).toBeGreaterThan(0);
        expect(sessions.rows.every((s) => s.coilId === coilId)).toBe(true);
      }
    }
    const northCoilIds = new Set([northCoil.id, (await testDb.coil.findFirstOrThrow({ where: { siteId: north.id, tag: "NW-4" } })).id]);
    expect((await listSweeps(main, { q: "NW-4" })).total).toBe(0);
    expect((await listSessions(main, { coilTag: "NW-4" })).total).toBe(0);
    expect((await listSweeps(northScope, {})).rows.every((s) => northCoilIds.has(s.coilId))).toBe(true);
    expect((await listSessions(northScope, {}, { pageSize: 100 })).rows.every((s) => northCoilIds.has(s.coilId))).toBe(true);
    expect((await listSessions(northScope, {}, { pageSize: 100 })).total).toBe(await testDb.runSession.count({ where: { coil: { siteId: north.id } } }));
  });
});

describe("audit log filters", () => {
  it("narrows by who (a user, or the system), the kind of record, words of the summary and an inclusive time window", async () => {
    const ines = await makeUser("ines@club.test", "steward", "Ines");
    const rafe = await makeUser("rafe@club.test", "member", "Rafe");
    const at = (iso: string) => new Date(iso);
    await testDb.auditEvent.createMany({
      data: [
        { siteId: DEFAULT_SITE_ID, at: at("2026-03-01T10:00:00Z"), actorId: ines.id, action: "create", entity: "Loan", entityId: "l1", summary: "KM-03 lent to Riverside Library" },
        { siteId: DEFAULT_SITE_ID, at: at("2026-03-02T10:00:00Z"), actorId: rafe.id, action: "create", entity: "Sweep", entityId: "s1", summary: "Recorded a sweep of KM-01, first series resonance 331 kHz" },
        { siteId: DEFAULT_SITE_ID, at: at("2026-03-03T10:00:00Z"), actorId: null, action: "lapse", entity: "Clearance", entityId: "c1", summary: "Clearance lapsed: failure" },
      ],
    });
    const summaries = async (filter: Parameters<typeof listAuditEvents>[1]) => (await listAuditEvents(main, filter)).map((e) => e.entityId);
    expect(await summaries({ actorId: ines.id })).toEqual(["l1"]);
    expect(await summaries({ actorId: "system" })).toEqual(["c1"]);
    expect(await summaries({ entity: "Sweep" })).toEqual(["s1"]);
    expect(await summaries({ q: "riverside" })).toEqual(["l1"]);
    expect(await summaries({ from: at("2026-03-02T00:00:00Z"), to: at("2026-03-02T23:59:59.999Z") })).toEqual(["s1"]);
    expect(await summaries({ from: at("2026-03-02T10:00:00Z") })).toEqual(["c1", "s1"]);
    expect(await summaries({ actorId: rafe.id, entity: "Loan" })).toEqual([]);
    expect(await listAuditEntities(main)).toEqual(["Clearance", "Loan", "Sweep"]);
  });
});
