/**
 * `npm run bench -- --large`: the server work of three pages at large-fleet size (bench/large-fleet.ts), each
 * against the floor — the fastest raw SQL through better-sqlite3 that reads the same figures.
 * The lib/db modules are imported after DATABASE_URL points at the fixture, so their Prisma client opens it.
 */
import { benchScope } from "./bench-scope";
import Database from "better-sqlite3";
import { ensureLargeFleet, LARGE_DB_PATH, LARGE_DB_URL } from "./large-fleet";
import { pairedMs } from "./large-fleet-timing";
import { recordFigure, type RowKey } from "./figures";

export const BUSY_TAG = "LF-042";

export function rawFloors(db: Database.Database) {
  // Cold: nothing stored, so the floor is reading what the computation reads — each coil's health window and totals.
  const coilAggregates = db.prepare(`SELECT "coilId", count(*) AS n, sum("durationS") AS seconds, max("startedAt") AS "lastAt" FROM "RunSession" GROUP BY "coilId"`);
  // Each coil's health window, as the fastest raw SQL reads it: two index seeks per coil on (coilId, startedAt), the last
  // 60 and the first 3. (A single correlated UNION over all coils, the floor used before, took ~1.8 s: ×3 slower than
  // these seeks, which made the cold dashboard look closer to its floor than it is.)
  // Only the columns the judgement reads (lib/db/coil-history.ts sessionSelect): `SELECT *` also read the notes, who
  // logged it, the loan and the fit's other columns, and building those 26-column rows made the floor ~×2.5 slower
  // than the reads the app must make.
  const coilIds = (db.prepare(`SELECT id FROM "Coil"`).all() as { id: string }[]).map((c) => c.id);
  const windowColumns = `id, "coilId", "startedAt", "supplyVoltageV", "supplyCurrentA", "durationS", "ambientTempC", "heatSinkStartC", "heatSinkEndC",
    "runningFrequencyHz", "peakSwitchVoltageV", "dutyCycle", outcome, "topLoadId", "sinkFitSampleCount", "sinkFitJson"`;
  const windowEnd = db.prepare(`SELECT ${windowColumns} FROM "RunSession" WHERE "coilId" = ? ORDER BY "startedAt" DESC, id DESC LIMIT 60`);
  const windowStart = db.prepare(`SELECT ${windowColumns} FROM "RunSession" WHERE "coilId" = ? ORDER BY "startedAt", id LIMIT 3`);
  const recentSessions = { all: () => coilIds.flatMap((id) => [...windowEnd.all(id), ...windowStart.all(id)]) };
  const coldOthers = [
    db.prepare(`SELECT * FROM "Coil" ORDER BY tag`),
    db.prepare(`SELECT * FROM "Component"`),
    db.prepare(`SELECT id, "coilId", "takenAt", "topLoadId", "firstSeriesResonanceHz" FROM "Sweep" ORDER BY "takenAt"`),
    db.prepare(`SELECT * FROM "TopLoad"`),
  ];
  // Warm: the stored summaries (margins in brief) plus what is worked out at read time (failures, latest clearance, open loans, parts
  // fitted since a clearance, the policy version), exactly the figures the dashboard shows.
  const readTime = [
    db.prepare(`SELECT "coilId", status, "occurredAt", mode FROM "Failure"`),
    db.prepare(`SELECT c.* FROM "Clearance" c WHERE c."decidedAt" = (SELECT max(d."decidedAt") FROM "Clearance" d WHERE d."coilId" = c."coilId")`),
    db.prepare(`SELECT * FROM "Loan" WHERE "returnedAt" IS NULL`),
    // Parts matter only to a coil with a clearance (fitted since signing lapses it).
    db.prepare(`SELECT id, "coilId", kind, "partNumber", "installedAt", "removedAt" FROM "Component" WHERE "coilId" IN (SELECT "coilId" FROM "Clearance")`),
    db.prepare(`SELECT version FROM "ClearancePolicy" ORDER BY version DESC LIMIT 1`),
  ];
  const summaries = db.prepare(`SELECT c.id, c.tag, c.name, c.status, s.* FROM "Coil" c LEFT JOIN "CoilSummary" s ON s."coilId" = c.id ORDER BY c.tag`);
  const coilByTag = db.prepare(`SELECT c.*, u.name AS "createdByName" FROM "Coil" c LEFT JOIN "User" u ON u.id = c."createdById" WHERE c.tag = ?`);
  const policy = db.prepare(`SELECT * FROM "ClearancePolicy" ORDER BY version DESC LIMIT 1`);
  const coilParts = db.prepare(`SELECT * FROM "Component" WHERE "coilId" = ? ORDER BY "installedAt"`);
  const coilTopLoads = db.prepare(`SELECT * FROM "TopLoad" WHERE "coilId" = ?`);
  const coilSweeps = db.prepare(`SELECT id, "takenAt", "topLoadId", "firstSeriesResonanceHz" FROM "Sweep" WHERE "coilId" = ? ORDER BY "takenAt"`);
  // The coil page reads the health window, not the whole logbook: both ends of the (coilId, startedAt) index.
  const firstSessions = db.prepare(`SELECT * FROM "RunSession" WHERE "coilId" = ? ORDER BY "startedAt", id LIMIT 3`);
  const lastSessions = db.prepare(`SELECT * FROM "RunSession" WHERE "coilId" = ? ORDER BY "startedAt" DESC, id DESC LIMIT 60`);
  const runningSession = db.prepare(`SELECT * FROM "RunSession" WHERE "coilId" = ? AND "topLoadId" = ? AND "runningFrequencyHz" IS NOT NULL ORDER BY "startedAt" DESC LIMIT 1`);
  const timeline = [
    db.prepare(`SELECT id, "startedAt", "supplyVoltageV", "supplyCurrentA", "durationS", outcome FROM "RunSession" WHERE "coilId" = ? ORDER BY "startedAt" DESC LIMIT 25`),
    db.prepare(`SELECT w.id, w."takenAt", w."firstSeriesResonanceHz", t.name FROM "Sweep" w LEFT JOIN "TopLoad" t ON t.id = w."topLoadId" WHERE w."coilId" = ? ORDER BY w."takenAt" DESC LIMIT 25`),
    db.prepare(`SELECT * FROM "Failure" WHERE "coilId" = ? ORDER BY "occurredAt" DESC LIMIT 25`),
    db.prepare(`SELECT * FROM "Clearance" WHERE "coilId" = ? ORDER BY "decidedAt" DESC LIMIT 25`),
    db.prepare(`SELECT * FROM "Loan" WHERE "coilId" = ? ORDER BY "outAt" DESC LIMIT 25`),
    ...["RunSession", "Sweep", "Failure", "Component", "Clearance", "Loan"].map((table) => db.prepare(`SELECT count(*) FROM "${table}" WHERE "coilId" = ?`)),
  ];
  const listPage = db.prepare(
    `SELECT s.*, c.tag, c.name, u.name AS "loggedBy", t.name AS "topLoad" FROM "RunSession" s JOIN "Coil" c ON c.id = s."coilId"
     LEFT JOIN "User" u ON u.id = s."loggedById" LEFT JOIN "TopLoad" t ON t.id = s."topLoadId"
     WHERE c.tag = ? ORDER BY s."startedAt" DESC, s.id DESC LIMIT 25 OFFSET 50`,
  );
  const listCount = db.prepare(`SELECT count(*) FROM "RunSession" s JOIN "Coil" c ON c.id = s."coilId" WHERE c.tag = ?`);
  return {
    dashboardCold: () => [coilAggregates.all(), recentSessions.all(), ...coldOthers.map((q) => q.all()), ...readTime.map((q) => q.all())],
    dashboardWarm: () => [summaries.all(), ...readTime.map((q) => q.all())],
    coilPage: () => {
      const coil = coilByTag.get(BUSY_TAG) as { id: string };
      policy.get();
      const last = lastSessions.all(coil.id) as { topLoadId: string }[];
      return [coilParts.all(coil.id), coilTopLoads.all(coil.id), coilSweeps.all(coil.id), firstSessions.all(coil.id), last, runningSession.get(coil.id, last[0]!.topLoadId), ...timeline.map((q) => q.all(coil.id))];
    },
    sessionList: () => [listPage.all(BUSY_TAG), listCount.get(BUSY_TAG)],
  };
}

export async function benchLargeFleetPages(): Promise<void> {
  const built = ensureLargeFleet();
  console.log(`\nLarge fleet (${LARGE_DB_PATH}${built ? `, built in ${built.toFixed(0)} s` : ", reused"}): 500 coils, 250 000 sessions, 2.5 M samples, 5 000 sweeps × 400 points`);
  process.env.DATABASE_URL = LARGE_DB_URL;
  const { getFleetOverview, selectFleetRows } = await import("../lib/db/fleet");
  const { fleetQuerySchema } = await import("../lib/validation/fleet-query");
  const { listSessions } = await import("../lib/db/sessions");
  const { computeCoilPageFigures, loadCoilPage, readBusyCoilPage } = await import("./coil-page-work");
  const db = new Database(LARGE_DB_PATH, { readonly: true });
  // A second handle that may write, only to empty the summaries before each cold round (untimed).
  const writer = new Database(LARGE_DB_PATH);
  const forgetSummaries = () => writer.prepare(`DELETE FROM "CoilSummary"`).run();
  const floors = rawFloors(db);
  const dashboard = async () => selectFleetRows(await getFleetOverview(benchScope(null)), fleetQuerySchema.parse({}));
  const cases: [string, () => unknown, () => unknown, { prepare?: () => unknown; rounds?: number; warmUp?: number }, RowKey?][] = [
    ["fleet dashboard, cold (no summaries)", dashboard, floors.dashboardCold, { prepare: forgetSummaries, rounds: 9, warmUp: 1 }, "dashboardCold"],
    ["fleet dashboard, warm (summaries current)", dashboard, floors.dashboardWarm, {}, "dashboardWarm"],
    [`coil page (${BUSY_TAG}, 500 sessions)`, () => loadCoilPage(BUSY_TAG), floors.coilPage, {}],
    [`session list (${BUSY_TAG}, page 3)`, () => listSessions(benchScope(null), { coilTag: BUSY_TAG }, { page: 3 }), floors.sessionList, {}],
  ];
  const line = (name: string, ms: number, floor: string, ratio: number) =>
    console.log(`  ${name.padEnd(48)} median ${ms.toFixed(1).padStart(7)} ms   ${floor}   ×${ratio.toFixed(1)}`);
  for (const [name, run, floor, options, key] of cases) {
    const { ms, floorMs, ratio } = await pairedMs(run, floor, options);
    line(name, ms, `raw-SQL floor ${floorMs.toFixed(1).padStart(6)} ms`, ratio);
    if (key) recordFigure({ key, value: ms, floor: floorMs, ratio });
  }
  // The coil page's figures (prediction table, health and its trends) are lib/ arithmetic on what it read; no SQL
  // produces them, so the floor for the figures themselves is the raw reads followed by that same arithmetic.
  const { history, policy } = await readBusyCoilPage(BUSY_TAG);
  const figures = () => computeCoilPageFigures(history, policy.rules);
  const { ms, floorMs, ratio } = await pairedMs(() => loadCoilPage(BUSY_TAG), () => (floors.coilPage(), figures()));
  line("coil page, against raw reads + its lib/ figures", ms, `floor ${floorMs.toFixed(1).padStart(4)} ms (reads + arithmetic)`, ratio);
  recordFigure({ key: "coilPageLarge", value: ms, floor: floorMs, ratio });
  writer.close();
  db.close();
  console.log(
    "  What made the difference (DEVELOPERS.md, Performance): the dashboard reads a stored per-coil summary (health, reasons,\n" +
      "  latest margins, totals; lib/db/coil-summary.ts) kept current by every logbook write, and recomputes only coils written to\n" +
      "  since, judged under an older policy, or past the moment time alone changes their verdict. Cold, it reads 32 coils' health\n" +
      "  windows (first 3 + last 60 sessions, index seeks) at a time straight through the driver adapter, judges them as verdicts\n" +
      "  (older sessions' headrooms only; a trend fitted only where it can raise a finding) and drops them, and stores the\n" +
      "  summaries in one adapter transaction. The coil page reads that window, not the logbook, and counts its records per table\n" +
      "  instead of Prisma's relation _count (which grouped all 250 000 sessions). Both pages read raw SQL through the driver\n" +
      "  adapter (lib/db/adapter-read.ts): Prisma 6.19 compiles every query-API call on the main thread (lib/db/raw-read.ts).",
  );
}
