/**
 * Moving a whole database (the README's route from the SQLite file to PostgreSQL): every table copied with its ids,
 * the copy verified by count and digest, and the logbook export of the copy identical to the original's. In the
 * PostgreSQL pass this is a real SQLite → PostgreSQL → SQLite round trip.
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
import { exportFleet } from "@/lib/db/export";
import { COPY_ORDER, CopyRefusedError, copyDatabase, verifyCopy } from "@/lib/db/copy-database";
import { recordSweep } from "@/lib/db/sweeps";

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
let original: unknown;

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, `hash-of-${p.key}`])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: NOW, passwordHashes }));
  original = await exportFleet(NOW);
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
    await expect(copyDatabase(testDb, file, FILE_URL)).rejects.toThrow(/not empty: User has \d+ row/);
    expect(await file.runSession.count()).toBe(before);
  });

  it("notices a copy that differs from its source and names the table", async () => {
    const sample = await file.heatSinkSample.findFirstOrThrow();
    await file.heatSinkSample.update({ where: { id: sample.id }, data: { temperatureC: sample.temperatureC + 0.001 } });
    await expect(verifyCopy(testDb, file)).rejects.toThrow(/HeatSinkSample: \d+ row\(s\) in the source, \d+ in the copy, contents differ/);
    await file.heatSinkSample.update({ where: { id: sample.id }, data: { temperatureC: sample.temperatureC } });
    await expect(verifyCopy(testDb, file)).resolves.toBeTruthy();
  });

  it(`copies back into the emptied ${INTEGRATION_URL.startsWith("file:") ? "SQLite" : "PostgreSQL"} database losslessly, and new rows get fresh ids`, async () => {
    await resetDatabase();
    await copyDatabase(file, testDb, INTEGRATION_URL);
    expect(JSON.parse(JSON.stringify(await exportFleet(NOW)))).toEqual(JSON.parse(JSON.stringify(original)));
    // Autoincrement keys continue after the copied ones (PostgreSQL's sequences are moved past them).
    const coil = await testDb.coil.findFirstOrThrow({ where: { tag: "KM-02" } });
    const steward = await testDb.user.findFirstOrThrow({ where: { role: "steward" } });
    const maxBefore = (await testDb.sweepPoint.aggregate({ _max: { id: true } }))._max.id!;
    const points = Array.from({ length: 40 }, (_, i) => ({ frequencyHz: 200_000 + i * 1000, amplitudeV: 1 + Math.sin(i / 5) }));
    await recordSweep(steward.id, { coilId: coil.id, topLoadId: null, takenAt: new Date(), seriesResistanceOhm: 10_000, sourceAmplitudeV: 10, amplitudeConvention: "peak_to_peak", environmentNotes: "", notes: "after the move", points });
    expect((await testDb.sweepPoint.aggregate({ _min: { id: true } , where: { id: { gt: maxBefore } } }))._min.id).toBe(maxBefore + 1);
  }, 120_000);
});
