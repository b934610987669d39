import { beforeAll, describe, expect, it } from "vitest";
import { resetDatabase, testDb } from "./support/db";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { exportCoil, exportFleet } from "@/lib/db/export";
import { importLogbook, ImportConflictError } from "@/lib/db/import";
import { describeLogbookIssues, logbookDocumentSchema, type LogbookDocument } from "@/lib/validation/export";

/** Ids replaced by their order of first appearance, so a re-keyed copy compares equal to the original. */
function canonical(doc: LogbookDocument, idKeys = /^(id|.*Id)$/): unknown {
  const seen = new Map<string, string>();
  const walk = (value: unknown, key = ""): unknown => {
    if (Array.isArray(value)) return value.map((v) => walk(v));
    if (value && typeof value === "object") return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, walk(v, k)]));
    if (typeof value === "string" && idKeys.test(key)) {
      if (!seen.has(value)) seen.set(value, `#${seen.size}`);
      return seen.get(value);
    }
    return value;
  };
  return walk({ ...doc, exportedAt: "(ignored)" });
}

const parse = (doc: unknown) => logbookDocumentSchema.parse(JSON.parse(JSON.stringify(doc)));

let stewardId = "";

beforeAll(async () => {
  await resetDatabase();
  // Passwords are not exercised here, so one placeholder hash serves every demo person.
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  const dataset = generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes });
  await loadDemoDataset(dataset);
  stewardId = (await testDb.user.findFirstOrThrow({ where: { role: "steward" } })).id;
});

describe("logbook export and import", () => {
  it("exports a coil with every kind of record and a format and version", async () => {
    const doc = await exportCoil("KM-01");
    expect(doc?.format).toBe("coilyard-logbook");
    expect(doc?.version).toBe(1);
    const coil = doc!.coils[0]!;
    expect(coil.sessions.length).toBeGreaterThan(0);
    expect(coil.sweeps.some((s) => s.points.length > 0)).toBe(true);
    expect(coil.failures.length).toBeGreaterThan(0);
    expect(coil.components.some((c) => c.replacedById !== null)).toBe(true);
    expect(logbookDocumentSchema.safeParse(doc).success).toBe(true);
  });

  it("round-trips the whole fleet losslessly: export → wipe → import → export gives the same file", async () => {
    const before = await exportFleet();
    const importsBefore = await testDb.auditEvent.count({ where: { action: "import" } });
    const counts = { sessions: await testDb.runSession.count(), samples: await testDb.heatSinkSample.count(), points: await testDb.sweepPoint.count(), loans: await testDb.loan.count() };
    await testDb.coil.deleteMany();
    expect(await testDb.runSession.count()).toBe(0);
    const summary = await importLogbook(stewardId, parse(before));
    expect(summary.unknownPeople).toEqual([]);
    expect(summary.coils.every((c) => !c.rekeyed)).toBe(true);
    const after = await exportFleet();
    expect({ ...after, exportedAt: "" }).toEqual({ ...before, exportedAt: "" });
    expect(await testDb.runSession.count()).toBe(counts.sessions);
    expect(await testDb.heatSinkSample.count()).toBe(counts.samples);
    expect(await testDb.sweepPoint.count()).toBe(counts.points);
    expect(await testDb.loan.count()).toBe(counts.loans);
    expect(await testDb.auditEvent.count({ where: { action: "import" } })).toBe(importsBefore + before.coils.length);
  });

  it("imports a coil under a new tag as a re-keyed copy that exports equal apart from ids and tag", async () => {
    const original = (await exportCoil("KM-05"))!;
    const summary = await importLogbook(stewardId, parse(original), { asTag: "KM-05-COPY" });
    expect(summary.coils[0]).toMatchObject({ tag: "KM-05-COPY", rekeyed: true });
    const copy = (await exportCoil("KM-05-COPY"))!;
    const withTag = { ...original, coils: [{ ...original.coils[0]!, tag: "KM-05-COPY" }] };
    expect(canonical(copy)).toEqual(canonical(withTag));
    // The replacement links point at the copy's own parts, not the original's.
    const copiedIds = new Set(copy.coils[0]!.components.map((c) => c.id));
    for (const c of copy.coils[0]!.components) if (c.replacedById) expect(copiedIds.has(c.replacedById)).toBe(true);
  });

  it("refuses a tag that already exists and stores nothing", async () => {
    const doc = parse(await exportCoil("KM-02"));
    const before = await testDb.runSession.count();
    await expect(importLogbook(stewardId, doc)).rejects.toBeInstanceOf(ImportConflictError);
    expect(await testDb.runSession.count()).toBe(before);
  });

  it("names the JSON path of a bad field", async () => {
    const doc = (await exportCoil("KM-03"))! as unknown as { coils: { sweeps: { points: { frequencyHz: unknown }[] }[]; sessions: { topLoadId: unknown }[] }[] };
    const goodPoint = doc.coils[0]!.sweeps[0]!.points[2]!.frequencyHz;
    doc.coils[0]!.sweeps[0]!.points[2]!.frequencyHz = "fast";
    const badType = logbookDocumentSchema.safeParse(doc);
    expect(badType.success).toBe(false);
    expect(describeLogbookIssues(badType.error!)).toContain("coils.0.sweeps.0.points.2.frequencyHz: expected a number");

    // Links are checked once every field reads: a session pointing at a top load not in the file.
    doc.coils[0]!.sweeps[0]!.points[2]!.frequencyHz = goodPoint;
    doc.coils[0]!.sessions[0]!.topLoadId = "no-such-top-load";
    const badLink = logbookDocumentSchema.safeParse(doc);
    expect(badLink.success).toBe(false);
    expect(describeLogbookIssues(badLink.error!).some((l) => l.startsWith("coils.0.sessions.0.topLoadId: refers to top load"))).toBe(true);
  });
});
