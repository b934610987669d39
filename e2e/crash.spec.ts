/**
 * Crash safety: the server process is killed hard (SIGKILL to its whole process group) while it is writing,
 * once in a burst of session POSTs and once in the middle of a large sweep import's transaction. Afterwards
 * the SQLite file passes its integrity and foreign-key checks, every write the server acknowledged is there
 * whole, nothing half-written is (every session has all its heat-sink samples and its audit entry, every
 * sweep all its points), and the app starts again on the same file and serves the coil's page.
 * Runs its own `next start` (port E2E_CRASH_PORT, default E2E_PORT + 1) on its own copy of the demo database.
 */
import { expect, test } from "@playwright/test";
import Database from "better-sqlite3";
import path from "node:path";
import { OwnServer, prepareDemoDatabase } from "./support/own-server";
import { localMinute, signInByHand } from "./support/http-client";
import { WalWatcher, readWal } from "./support/wal";
import { DEMO, signInAs } from "./support/accounts";
import { createLineModel, simulateSweep } from "../lib/calc/line-model";
import { createSeededRandom } from "../lib/calc/seeded-random";

// Beside the shared server's port (E2E_PORT, default 3100), so checkouts running side by side do not collide.
const PORT = Number(process.env.E2E_CRASH_PORT ?? Number(process.env.E2E_PORT ?? 3100) + 1);
const DIR = path.resolve(`data/e2e-crash-${PORT}`);
const server = new OwnServer(PORT, DIR);
let template = "";

test.use({ baseURL: server.baseURL });
test.describe.configure({ mode: "serial", timeout: 90_000 });

test.beforeAll(async () => {
  test.setTimeout(90_000);
  template = prepareDemoDatabase(path.join(DIR, "template"));
});
test.afterAll(async () => {
  await server.kill();
});

/** What the database file says after the kill, opened the way the app opens it (WAL recovery included). */
function checkFile(file: string) {
  const db = new Database(file);
  try {
    return { db, integrity: db.pragma("integrity_check", { simple: true }), foreignKeyProblems: db.pragma("foreign_key_check") as unknown[] };
  } catch (error) {
    db.close();
    throw error;
  }
}

const SESSION_POSTS = 240;
const SESSIONS_IN_FLIGHT = 12;
const KILL_AFTER_SESSIONS = 40;
/** Session i carries a known number of heat-sink samples, written into its notes so a partial write shows. */
const samplesOf = (i: number) => 20 + (i % 7) * 30;

function sessionBody(i: number) {
  const n = samplesOf(i);
  const samples = Array.from({ length: n }, (_, k) => `${k * 3}, ${(21 + k * 0.05).toFixed(2)}`).join("\n");
  return {
    coilId: ["coil-KM-01", "coil-KM-02", "coil-KM-04", "coil-KM-06"][i % 4],
    startedAt: localMinute(60 + i),
    supplyVoltageV: 24,
    supplyCurrentA: 1.5,
    durationS: "10 min",
    ambientTempC: 21,
    notes: `crash-session ${i} samples=${n}`,
    samples,
  };
}

test("a burst of session writes killed hard: acknowledged sessions are whole, nothing is half-written", async ({ page }) => {
  server.useCopyOf(template);
  await server.start();
  const cookie = await signInByHand(server.baseURL, DEMO.member.email, DEMO.member.password);

  const acknowledged = new Map<string, number>(); // session id → its index
  let sent = 0;
  let answered = 0;
  let killed: Promise<void> | null = null;
  let inFlightAtKill = -1;
  const worker = async () => {
    while (sent < SESSION_POSTS && !killed) {
      const i = sent++;
      try {
        const response = await fetch(`${server.baseURL}/api/sessions`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(sessionBody(i)) });
        if (response.status === 201) {
          const { data } = (await response.json()) as { data: { id: string } };
          if (!killed) acknowledged.set(data.id, i);
        } else if (!killed) throw new Error(`POST /api/sessions answered ${response.status} before the kill: ${await response.text()}`);
      } catch (error) {
        if (!killed) throw error; // after the kill, connection errors are the point
      } finally {
        answered++;
      }
      if (!killed && acknowledged.size >= KILL_AFTER_SESSIONS) {
        inFlightAtKill = sent - answered;
        killed = server.kill("SIGKILL");
      }
    }
  };
  await Promise.all(Array.from({ length: SESSIONS_IN_FLIGHT }, worker));
  await killed;

  expect(killed, "the burst finished before the kill").not.toBeNull();
  expect(inFlightAtKill, "requests still in flight when the server was killed").toBeGreaterThan(0);

  const { db, integrity, foreignKeyProblems } = checkFile(server.dbFile);
  try {
    expect(integrity).toBe("ok");
    expect(foreignKeyProblems).toEqual([]);
    const stored = db
      .prepare(
        `SELECT s."id", s."notes", (SELECT COUNT(*) FROM "HeatSinkSample" h WHERE h."sessionId" = s."id") AS "samples",
                (SELECT COUNT(*) FROM "AuditEvent" a WHERE a."entity" = 'RunSession' AND a."entityId" = s."id") AS "audits"
         FROM "RunSession" s WHERE s."notes" LIKE 'crash-session %'`,
      )
      .all() as { id: string; notes: string; samples: number; audits: number }[];
    const byId = new Map(stored.map((row) => [row.id, row]));
    for (const [id, i] of acknowledged) {
      expect(byId.get(id), `acknowledged session ${i} (${id})`).toMatchObject({ samples: samplesOf(i), audits: 1 });
    }
    // Sessions committed but not acknowledged (the answer was lost in the kill) must be whole too.
    for (const row of stored) {
      const expected = Number(/samples=(\d+)/.exec(row.notes)![1]);
      expect(row, `stored session ${row.id}`).toMatchObject({ samples: expected, audits: 1 });
    }
    const committedUnanswered = stored.length - acknowledged.size;
    test.info().annotations.push({
      type: "crash",
      description: `${sent} sessions sent, ${acknowledged.size} acknowledged, ${inFlightAtKill} in flight at the kill; ${committedUnanswered} committed without an answer, ${sent - stored.length} never stored; all ${stored.length} stored are whole`,
    });
    console.log(`[crash] sessions: ${test.info().annotations.at(-1)!.description}`);
  } finally {
    db.close();
  }

  await server.start();
  await signInAs(page, "member");
  const [firstId] = acknowledged.keys();
  await page.goto(`/sessions/${firstId}`);
  await expect(page.getByText(`crash-session ${acknowledged.get(firstId!)} `)).toBeVisible();
  await page.goto("/coils/KM-06");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("KM-06");
  await server.stop();
});

const SWEEP_POINTS = 150_000;
const SWEEP_IMPORTS = 4;
/** Waves sent at most while waiting to catch a transaction mid-write. */
const SWEEP_WAVES = 4;
/** Pages a sweep's transaction must have spilled into the log, uncommitted, before the kill (4 KiB each). */
const UNCOMMITTED_FRAMES_TO_KILL = 64;

function sweepReadings(count: number) {
  const model = createLineModel({ firstSeriesResonance: 265_000, characteristicImpedance: 75_000, topCapacitance: 12e-12, dispersionExponent: 0.12, q: 90 });
  const frequencies = Array.from({ length: count }, (_, i) => 265_000 * 0.5 * 8 ** (i / (count - 1)));
  const points = simulateSweep({ model, seriesResistance: 22_000, sourceAmplitude: 20, frequencies, noise: { relative: 0.005, absolute: 0.001 }, rng: createSeededRandom(7) });
  return { frequenciesHz: points.map((p) => p.frequency), amplitudesV: points.map((p) => Math.min(p.amplitude, 19.9)) };
}

test("a large sweep import killed in the middle of its transaction leaves no partial sweep", async ({ page }) => {
  server.useCopyOf(template);
  await server.start();
  const cookie = await signInByHand(server.baseURL, DEMO.member.email, DEMO.member.password);
  const readings = sweepReadings(SWEEP_POINTS);
  const wal = new WalWatcher(`${server.dbFile}-wal`);

  const acknowledged: string[] = [];
  let killed: Promise<void> | null = null;
  let atKill = { committedFrames: 0, uncommittedFrames: 0 };
  // One wave: SWEEP_IMPORTS imports at once, which SQLite's single writer takes one after another.
  const fireWave = (wave: number) =>
    Array.from({ length: SWEEP_IMPORTS }, async (_, i) => {
      const body = JSON.stringify({ coilId: "coil-KM-02", topLoadId: "", takenAt: new Date(Date.now() - (wave * SWEEP_IMPORTS + i + 1) * 60_000).toISOString(), seriesResistanceOhm: "22k", sourceAmplitudeV: "20", amplitudeConvention: "peak_to_peak", notes: `crash-sweep ${wave}-${i}`, ...readings });
      try {
        const response = await fetch(`${server.baseURL}/api/sweeps/import`, { method: "POST", headers: { "content-type": "application/json", cookie }, body });
        if (response.status !== 201) throw new Error(`POST /api/sweeps/import answered ${response.status}: ${await response.text()}`);
        const { data } = (await response.json()) as { data: { id: string } };
        if (!killed) acknowledged.push(data.id);
      } catch (error) {
        if (!killed) throw error;
      }
    });
  // Watch the log; kill once a sweep has been acknowledged and another's transaction is visibly mid-write.
  let watching = true;
  const watcher = (async () => {
    while (!killed && watching) {
      const state = wal.read();
      if (acknowledged.length > 0 && state.uncommittedFrames >= UNCOMMITTED_FRAMES_TO_KILL) {
        atKill = state;
        killed = server.kill("SIGKILL");
        return;
      }
      await new Promise((resolve) => setTimeout(resolve, 2));
    }
  })();
  // The watcher polls, so on an unlucky schedule a whole wave can commit between two looks: then send another
  // (a few at most), rather than call the harness's miss a result.
  const imports: Promise<void>[] = [];
  let settled: "killed" | "all answered" = "all answered";
  for (let wave = 0; wave < SWEEP_WAVES && settled !== "killed"; wave++) {
    const thisWave = fireWave(wave);
    imports.push(...thisWave);
    settled = await Promise.race([Promise.all(thisWave).then(() => "all answered" as const), watcher.then(() => "killed" as const)]);
  }
  watching = false;
  await killed;
  await Promise.allSettled(imports);
  const sent = imports.length;
  expect(settled, "every import was answered before a transaction was caught mid-write").toBe("killed");
  const afterKill = readWal(`${server.dbFile}-wal`);

  const { db, integrity, foreignKeyProblems } = checkFile(server.dbFile);
  try {
    expect(integrity).toBe("ok");
    expect(foreignKeyProblems).toEqual([]);
    const stored = db
      .prepare(
        `SELECT w."id", w."pointCount", (SELECT COUNT(*) FROM "SweepPoint" p WHERE p."sweepId" = w."id") AS "points",
                (SELECT COUNT(*) FROM "AuditEvent" a WHERE a."entity" = 'Sweep' AND a."entityId" = w."id") AS "audits"
         FROM "Sweep" w WHERE w."notes" LIKE 'crash-sweep %'`,
      )
      .all() as { id: string; pointCount: number; points: number; audits: number }[];
    const byId = new Map(stored.map((row) => [row.id, row]));
    for (const id of acknowledged) expect(byId.get(id), `acknowledged sweep ${id}`).toEqual({ id, pointCount: SWEEP_POINTS, points: SWEEP_POINTS, audits: 1 });
    for (const row of stored) expect(row, `stored sweep ${row.id}`).toEqual({ id: row.id, pointCount: SWEEP_POINTS, points: SWEEP_POINTS, audits: 1 });
    const orphans = db.prepare(`SELECT COUNT(*) AS n FROM "SweepPoint" p WHERE NOT EXISTS (SELECT 1 FROM "Sweep" w WHERE w."id" = p."sweepId")`).get() as { n: number };
    expect(orphans.n).toBe(0);
    test.info().annotations.push({
      type: "crash",
      description: `${sent} imports of ${SWEEP_POINTS} points sent (${SWEEP_IMPORTS} a wave), ${acknowledged.length} acknowledged; killed with ${atKill.uncommittedFrames} uncommitted pages in the log (${afterKill.uncommittedFrames} when the process died); ${stored.length} sweeps stored, all whole`,
    });
    console.log(`[crash] sweeps: ${test.info().annotations.at(-1)!.description}`);
  } finally {
    db.close();
  }

  await server.start();
  await signInAs(page, "member");
  await page.goto("/coils/KM-02");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("KM-02");
  await server.stop();
});
