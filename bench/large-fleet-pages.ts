/**
 * `npm run bench -- --large`: the server work of three pages at large-fleet size (bench/large-fleet.ts), each
 * against the floor — the fastest raw SQL through better-sqlite3 that reads the same figures.
 * The lib/db modules are imported after DATABASE_URL points at the fixture, so their Prisma client opens it.
 */
import Database from "better-sqlite3";
import { ensureLargeFleet, LARGE_DB_PATH, LARGE_DB_URL } from "./large-fleet";
import { medianMs } from "./large-fleet-timing";

const BUSY_TAG = "LF-042";

function rawFloors(db: Database.Database) {
  const coilAggregates = db.prepare(`SELECT coilId, count(*) AS n, sum(durationS) AS seconds, max(startedAt) AS lastAt FROM RunSession GROUP BY coilId`);
  const recentSessions = db.prepare(
    `SELECT s.* FROM Coil c JOIN RunSession s ON s.coilId = c.id
       AND s.startedAt >= coalesce((SELECT r.startedAt FROM RunSession r WHERE r.coilId = c.id ORDER BY r.startedAt DESC LIMIT 1 OFFSET 59), '')
     UNION
     SELECT s.* FROM Coil c JOIN RunSession s ON s.coilId = c.id
       AND s.startedAt <= (SELECT r.startedAt FROM RunSession r WHERE r.coilId = c.id ORDER BY r.startedAt ASC LIMIT 1 OFFSET 2)`,
  );
  const others = [
    db.prepare(`SELECT * FROM Coil ORDER BY tag`),
    db.prepare(`SELECT * FROM Component`),
    db.prepare(`SELECT id, coilId, takenAt, topLoadId, firstSeriesResonanceHz FROM Sweep ORDER BY takenAt`),
    db.prepare(`SELECT coilId, status, occurredAt FROM Failure`),
    db.prepare(`SELECT coilId, verdict, max(decidedAt), validUntil FROM Clearance GROUP BY coilId`),
    db.prepare(`SELECT * FROM Loan WHERE returnedAt IS NULL`),
  ];
  const coilByTag = db.prepare(`SELECT * FROM Coil WHERE tag = ?`);
  const coilParts = db.prepare(`SELECT * FROM Component WHERE coilId = ?`);
  const coilTopLoads = db.prepare(`SELECT * FROM TopLoad WHERE coilId = ?`);
  const coilSweeps = db.prepare(`SELECT id, takenAt, topLoadId, firstSeriesResonanceHz FROM Sweep WHERE coilId = ? ORDER BY takenAt`);
  const coilSessions = db.prepare(`SELECT * FROM RunSession WHERE coilId = ? ORDER BY startedAt`);
  const coilTimeline = db.prepare(`SELECT id, startedAt FROM RunSession WHERE coilId = ? ORDER BY startedAt DESC LIMIT 25`);
  const listPage = db.prepare(
    `SELECT s.*, c.tag, c.name, u.name AS loggedBy, t.name AS topLoad FROM RunSession s JOIN Coil c ON c.id = s.coilId
     LEFT JOIN User u ON u.id = s.loggedById LEFT JOIN TopLoad t ON t.id = s.topLoadId
     WHERE c.tag = ? ORDER BY s.startedAt DESC, s.id DESC LIMIT 25 OFFSET 50`,
  );
  const listCount = db.prepare(`SELECT count(*) FROM RunSession s JOIN Coil c ON c.id = s.coilId WHERE c.tag = ?`);
  return {
    dashboard: () => [coilAggregates.all(), recentSessions.all(), ...others.map((q) => q.all())],
    coilPage: () => {
      const coil = coilByTag.get(BUSY_TAG) as { id: string };
      return [coilParts.all(coil.id), coilTopLoads.all(coil.id), coilSweeps.all(coil.id), coilSessions.all(coil.id), coilTimeline.all(coil.id)];
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
  const { loadCoilPage } = await import("./coil-page-work");
  const db = new Database(LARGE_DB_PATH, { readonly: true });
  const floors = rawFloors(db);
  const cases: [string, () => unknown, () => unknown][] = [
    ["fleet dashboard", async () => selectFleetRows(await getFleetOverview(), fleetQuerySchema.parse({})), floors.dashboard],
    [`coil page (${BUSY_TAG}, 500 sessions)`, () => loadCoilPage(BUSY_TAG), floors.coilPage],
    [`session list (${BUSY_TAG}, page 3)`, () => listSessions({ coilTag: BUSY_TAG }, { page: 3 }), floors.sessionList],
  ];
  for (const [name, run, floor] of cases) {
    const ms = await medianMs(run);
    const floorMs = await medianMs(floor);
    console.log(`  ${name.padEnd(34)} median ${ms.toFixed(1).padStart(7)} ms   raw-SQL floor ${floorMs.toFixed(1).padStart(6)} ms   ×${(ms / floorMs).toFixed(1)}`);
  }
  db.close();
  console.log(
    "  What made the difference (DEVELOPERS.md, Performance): the dashboard used to read all 250 000 sessions through Prisma and\n" +
      "  analyse every one on every request (median 51 s here). It now reads each coil's health window (first 3 + last 60 sessions,\n" +
      "  lib/analysis/health-window.ts) with per-coil index seeks, and its totals as one GROUP BY over a covering index.",
  );
}
