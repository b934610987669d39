import { beforeAll, describe, expect, it } from "vitest";
import { createSite, mainScope, makeUser, resetDatabase, siteScope, testDb } from "./support/db";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { exportCoil, exportFleet } from "@/lib/db/export";
import { importLogbook, ImportConflictError } from "@/lib/db/import";
import { getCurrentPolicy } from "@/lib/db/policy";
import { describeLogbookIssues, logbookDocumentSchema, type LogbookDocument } from "@/lib/validation/export";
import { DEFAULT_SITE_ID, type SiteScope } from "@/lib/db/site-scope";

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

let steward: SiteScope = mainScope(null);
/** Anyone at the demo's own site (exports are any member's). */
const main = mainScope(null);
const ofMainSite = { coil: { siteId: DEFAULT_SITE_ID } };

beforeAll(async () => {
  await resetDatabase();
  // Passwords are not exercised here, so one placeholder hash serves every demo person.
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  const dataset = generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes });
  await loadDemoDataset(dataset);
  steward = mainScope((await testDb.user.findFirstOrThrow({ where: { memberships: { some: { siteId: DEFAULT_SITE_ID, role: "steward" } } } })).id);
});

describe("logbook export and import", () => {
  it("exports a coil with every kind of record and a format and version", async () => {
    const doc = await exportCoil(main, "KM-01");
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
    const before = await exportFleet(main);
    const importsBefore = await testDb.auditEvent.count({ where: { action: "import" } });
    const mainCounts = async () => ({
      sessions: await testDb.runSession.count({ where: ofMainSite }),
      samples: await testDb.heatSinkSample.count({ where: { session: ofMainSite } }),
      points: await testDb.sweepPoint.count({ where: { sweep: ofMainSite } }),
      loans: await testDb.loan.count({ where: ofMainSite }),
    });
    const counts = await mainCounts();
    const elsewhere = await testDb.coil.count({ where: { siteId: { not: DEFAULT_SITE_ID } } });
    await testDb.coil.deleteMany({ where: { siteId: DEFAULT_SITE_ID } });
    expect(await testDb.runSession.count({ where: ofMainSite })).toBe(0);
    const summary = await importLogbook(steward, parse(before));
    expect(summary.unknownPeople).toEqual([]);
    expect(summary.coils.every((c) => !c.rekeyed)).toBe(true);
    const after = await exportFleet(main);
    expect({ ...after, exportedAt: "" }).toEqual({ ...before, exportedAt: "" });
    expect(await mainCounts()).toEqual(counts);
    expect(await testDb.coil.count({ where: { siteId: { not: DEFAULT_SITE_ID } } })).toBe(elsewhere);
    expect(await testDb.auditEvent.count({ where: { action: "import" } })).toBe(importsBefore + before.coils.length);
  });

  it("imports a coil under a new tag as a re-keyed copy that exports equal apart from ids and tag", async () => {
    const original = (await exportCoil(main, "KM-05"))!;
    const summary = await importLogbook(steward, parse(original), { asTag: "KM-05-COPY" });
    expect(summary.coils[0]).toMatchObject({ tag: "KM-05-COPY", rekeyed: true });
    const copy = (await exportCoil(main, "KM-05-COPY"))!;
    const withTag = { ...original, coils: [{ ...original.coils[0]!, tag: "KM-05-COPY" }] };
    expect(canonical(copy)).toEqual(canonical(withTag));
    // The replacement links point at the copy's own parts, not the original's.
    const copiedIds = new Set(copy.coils[0]!.components.map((c) => c.id));
    for (const c of copy.coils[0]!.components) if (c.replacedById) expect(copiedIds.has(c.replacedById)).toBe(true);
  });

  it("refuses a tag that already exists and stores nothing", async () => {
    const doc = parse(await exportCoil(main, "KM-02"));
    const before = await testDb.runSession.count();
    await expect(importLogbook(steward, doc)).rejects.toBeInstanceOf(ImportConflictError);
    expect(await testDb.runSession.count()).toBe(before);
  });

  it("names the JSON path of a bad field", async () => {
    const doc = (await exportCoil(main, "KM-03"))! as unknown as { coils: { sweeps: { points: { frequencyHz: unknown }[] }[]; sessions: { topLoadId: unknown }[] }[] };
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

describe("export and import between sites", () => {
  let north = { id: "" };
  beforeAll(async () => {
    north = await createSite("north");
  });

  it("a second site cannot export the first site's coils, one by one or as a fleet", async () => {
    const northScope = siteScope(north.id, null);
    const mainTags = (await testDb.coil.findMany({ where: { siteId: DEFAULT_SITE_ID }, select: { tag: true } })).map((c) => c.tag);
    expect(mainTags.length).toBeGreaterThan(0);
    for (const tag of mainTags) expect(await exportCoil(northScope, tag)).toBeNull();
    expect((await exportFleet(northScope)).coils).toEqual([]);
    // The first site's fleet file holds its own coils and nobody else's.
    expect((await exportFleet(main)).coils.map((c) => c.tag).sort()).toEqual([...mainTags].sort());
  });

  it("a file exported at one site and imported at another lands in the importing site, the first site's coils untouched", async () => {
    const northSteward = await makeUser("steward@north.test", "steward", "Nell North", north.id);
    const northScope = siteScope(north.id, northSteward.id);
    const file = (await exportCoil(main, "KM-05"))!;
    const mainBefore = await exportCoil(main, "KM-05");
    const mainCoil = await testDb.coil.findUniqueOrThrow({ where: { siteId_tag: { siteId: DEFAULT_SITE_ID, tag: "KM-05" } } });

    const summary = await importLogbook(northScope, parse(file));

    // Same tag at the other site is no conflict; the ids are the server's, so the copy is re-keyed.
    expect(summary.coils).toEqual([expect.objectContaining({ tag: "KM-05", rekeyed: true })]);
    const imported = await testDb.coil.findUniqueOrThrow({ where: { siteId_tag: { siteId: north.id, tag: "KM-05" } } });
    expect(imported.id).not.toBe(mainCoil.id);
    const copy = (await exportCoil(northScope, "KM-05"))!;
    // People are matched only among the importing site's members: the first site's are left blank and reported.
    const unknown = new Set(summary.unknownPeople);
    expect(unknown.has("steward@kettlewell.example")).toBe(true);
    const blank = (value: unknown): unknown =>
      Array.isArray(value) ? value.map(blank) : value && typeof value === "object" ? Object.fromEntries(Object.entries(value).map(([k, v]) => [k, typeof v === "string" && unknown.has(v) ? null : blank(v)])) : value;
    expect(canonical(copy)).toEqual(canonical(blank(file) as LogbookDocument));
    // The import's audit event is the importing site's, by the importing steward.
    expect(await testDb.auditEvent.findFirstOrThrow({ where: { action: "import", entityId: imported.id } })).toMatchObject({ siteId: north.id, actorId: northSteward.id });
    // Every record of the copy hangs off the importing site's coil; the first site's coil is as it was.
    expect(await testDb.runSession.count({ where: { coilId: imported.id } })).toBe(file.coils[0]!.sessions.length);
    expect(await exportCoil(main, "KM-05")).toEqual({ ...mainBefore, exportedAt: expect.any(String) });
    expect((await exportFleet(northScope)).coils.map((c) => c.tag)).toEqual(["KM-05"]);
    expect((await exportFleet(main)).coils.some((c) => c.id === imported.id)).toBe(false);

    // A second import of the same file at the importing site is refused by tag, as at any site.
    await expect(importLogbook(northScope, parse(file))).rejects.toBeInstanceOf(ImportConflictError);
  });

  it("a clearance's policy version held by another site is recreated at the importing site from the file, never linked", async () => {
    const file = (await exportCoil(main, "KM-02"))!;
    const rulesJson = file.coils[0]!.clearances[0]!.policyRulesJson;
    const latest = (await testDb.clearancePolicy.aggregate({ _max: { version: true } }))._max.version!;
    const mainOwn = await testDb.clearancePolicy.create({ data: { siteId: DEFAULT_SITE_ID, version: latest + 1, rulesJson: '{"mainSiteOnly":true}', note: "Main site's own" } });
    const doc = parse(file);
    for (const clearance of doc.coils[0]!.clearances) clearance.policyVersion = mainOwn.version;

    const before = await getCurrentPolicy(siteScope(north.id, null));
    await importLogbook(siteScope(north.id, null), doc, { asTag: "KM-02-N" });

    // The copy is only a record of what those clearances were judged by: the importing site's policy is unchanged.
    expect(await getCurrentPolicy(siteScope(north.id, null))).toEqual(before);
    const clearances = await testDb.clearance.findMany({ where: { coil: { siteId: north.id, tag: "KM-02-N" } }, include: { policy: true } });
    expect(clearances.length).toBe(doc.coils[0]!.clearances.length);
    for (const clearance of clearances) {
      expect(clearance.policyId).not.toBe(mainOwn.id);
      expect(clearance.policy).toMatchObject({ siteId: north.id, version: mainOwn.version + 1, rulesJson, recordOnly: true });
    }
    expect(await testDb.clearancePolicy.findUniqueOrThrow({ where: { id: mainOwn.id } })).toEqual(mainOwn);
  });
});
