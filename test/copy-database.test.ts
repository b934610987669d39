/**
 * Moving a whole database (the README's route from the SQLite file to PostgreSQL): every table copied with its ids,
 * the copy verified by count and digest, and every record still owned by the site it belonged to (sites, memberships,
 * coils, policies, audit events). In the PostgreSQL pass this is a real SQLite → PostgreSQL → SQLite round trip.
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MODEL_NAMES, countAllRows, openDatabase, resetDatabase, testDb } from "./support/db";
import { INTEGRATION_DB_FILE } from "./support/paths";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { COPY_ORDER, CopyRefusedError, copyDatabase, verifyCopy } from "@/lib/db/copy-database";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";

const FILE = path.join(path.dirname(INTEGRATION_DB_FILE), "copy-target.db");
const FILE_URL = `file:${FILE}`;
const INTEGRATION_URL = process.env.DATABASE_URL!;
let file: ReturnType<typeof openDatabase>;

function freshSqliteFile() {
  mkdirSync(path.dirname(FILE), { recursive: true });
  for (const suffix of ["", "-wal", "-shm", "-journal"]) rmSync(FILE + suffix, { force: true });
  execFileSync(path.resolve("node_modules/.bin/prisma"), ["migrate", "deploy"], { env: { ...process.env, DATABASE_URL: FILE_URL }, stdio: "pipe" });
}

const NOW = new Date(Date.UTC(2025, 4, 1));

type Client = ReturnType<typeof openDatabase>;

/** Who owns what: each site's members with their roles, coils, policies and audit events, by id. */
async function ownership(db: Client) {
  const [sites, memberships, coils, policies, audit, loans] = await Promise.all([
    db.site.findMany({ select: { id: true, slug: true, name: true }, orderBy: { id: "asc" } }),
    db.siteMembership.findMany({ select: { userId: true, siteId: true, role: true }, orderBy: [{ userId: "asc" }, { siteId: "asc" }] }),
    db.coil.findMany({ select: { id: true, siteId: true }, orderBy: { id: "asc" } }),
    db.clearancePolicy.findMany({ select: { id: true, siteId: true }, orderBy: { id: "asc" } }),
    db.auditEvent.findMany({ select: { id: true, siteId: true }, orderBy: { id: "asc" } }),
    db.loan.findMany({ select: { id: true, borrowerSiteId: true }, orderBy: { id: "asc" } }),
  ]);
  const organisationAdmins = await db.user.findMany({ where: { organisationAdmin: true }, select: { id: true }, orderBy: { id: "asc" } });
  return { sites, memberships, coils, policies, audit, loans, organisationAdmins };
}
let original: Awaited<ReturnType<typeof ownership>>;

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, `hash-of-${p.key}`])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: NOW, passwordHashes }));
  // A cross-site loan and a site's own policy, so ownership of every kind is exercised (the demo has neither yet).
  const fenwick = await testDb.site.findFirstOrThrow({ where: { id: { not: DEFAULT_SITE_ID } } });
  await testDb.loan.updateMany({ where: { returnedAt: null }, data: { borrowerSiteId: fenwick.id } });
  const latest = await testDb.clearancePolicy.findFirstOrThrow({ orderBy: { version: "desc" } });
  await testDb.clearancePolicy.create({ data: { siteId: fenwick.id, version: latest.version + 1, rulesJson: latest.rulesJson, note: "the school's own" } });
  original = await ownership(testDb);
  freshSqliteFile();
  file = openDatabase(FILE_URL);
}, 120_000);

afterAll(async () => {
  await file?.$disconnect();
});

describe("copying a whole database", () => {
  it("lists every table of the schema exactly once", () => {
    expect(COPY_ORDER.map((t) => t.model).sort()).toEqual([...MODEL_NAMES].sort());
  });

  it("copies every row out to an empty SQLite file and proves the copy table by table", async () => {
    const before = await countAllRows();
    const heard: string[] = [];
    const report = await copyDatabase(testDb, file, FILE_URL, (model) => heard.push(model));
    expect(heard).toEqual(COPY_ORDER.map((t) => t.model));
    expect(Object.fromEntries(report.tables.map((t) => [t.model, t.rows]))).toEqual(before);
    expect(report.totalRows).toBeGreaterThan(10_000);
    // The demo has a replaced part: the self-reference was filled in after every part existed.
    expect(await file.component.count({ where: { replacedById: { not: null } } })).toBe(await testDb.component.count({ where: { replacedById: { not: null } } }));
  }, 120_000);

  it("refuses a target that already holds rows, and changes nothing in it", async () => {
    const before = await file.runSession.count();
    await expect(copyDatabase(testDb, file, FILE_URL)).rejects.toThrow(CopyRefusedError);
    await expect(copyDatabase(testDb, file, FILE_URL)).rejects.toThrow(/not empty: Site has \d+ row/);
    expect(await file.runSession.count()).toBe(before);
  });

  it("notices a copy that differs from its source and names the table", async () => {
    const sample = await file.heatSinkSample.findFirstOrThrow();
    await file.heatSinkSample.update({ where: { id: sample.id }, data: { temperatureC: sample.temperatureC + 0.001 } });
    await expect(verifyCopy(testDb, file)).rejects.toThrow(/HeatSinkSample: \d+ row\(s\) in the source, \d+ in the copy, contents differ/);
    await file.heatSinkSample.update({ where: { id: sample.id }, data: { temperatureC: sample.temperatureC } });
    await expect(verifyCopy(testDb, file)).resolves.toBeTruthy();
  });

  it("keeps every record's site: sites, memberships and roles, coils, policies, audit events, cross-site loans", async () => {
    expect(await ownership(file)).toEqual(original);
    expect(original.sites.length).toBeGreaterThan(1);
    expect(new Set(original.coils.map((c) => c.siteId)).size).toBeGreaterThan(1);
    expect(original.policies.some((p) => p.siteId !== null)).toBe(true);
    expect(original.loans.some((l) => l.borrowerSiteId !== null)).toBe(true);
  });

  it(`copies back into the emptied ${INTEGRATION_URL.startsWith("file:") ? "SQLite" : "PostgreSQL"} database losslessly, and new rows get fresh ids`, async () => {
    // Emptied, it holds the default site as a freshly migrated database does; the copy replaces it with the source's.
    await resetDatabase();
    expect(await testDb.site.findMany({ select: { id: true } })).toEqual([{ id: DEFAULT_SITE_ID }]);
    await copyDatabase(file, testDb, INTEGRATION_URL);
    // verifyCopy (run by copyDatabase) compared every table's rows; check ownership outright too.
    expect(await ownership(testDb)).toEqual(original);
    // Autoincrement keys continue after the copied ones (PostgreSQL's sequences are moved past them).
    const sweep = await testDb.sweep.findFirstOrThrow({ where: { coil: { tag: "KM-02", siteId: DEFAULT_SITE_ID } } });
    const maxBefore = (await testDb.sweepPoint.aggregate({ _max: { id: true } }))._max.id!;
    const added = await testDb.sweepPoint.create({ data: { sweepId: sweep.id, frequencyHz: 123_456, amplitudeV: 1 } });
    expect(added.id).toBe(maxBefore + 1);
    const event = await testDb.auditEvent.create({ data: { siteId: DEFAULT_SITE_ID, action: "update", entity: "Coil", entityId: "x", summary: "after the move" } });
    expect(event.id).toBe(Math.max(...original.audit.map((e) => e.id)) + 1);
  }, 120_000);
});
