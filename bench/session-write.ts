/**
 * The session write (lib/db/sessions.ts createSession: what the log form's action and POST /api/sessions store) against
 * its floor: the same statements through better-sqlite3 alone, prepared, in one transaction.
 *
 * `npm run bench -- --write` runs this file in a child process (bench/run.ts), because it needs lib/db's client opened
 * on its own fresh database (data/bench/session-write.db) and the client is made once per process. The fixture and
 * the floors are shared with bench/prisma-lines.ts, which compares Prisma lines on the same write.
 *
 * The floor is the statements createSession sends (lib/db/sessions.ts insertSession, on lib/db/session-write.ts's
 * adapter transaction): BEGIN; INSERT RunSession with the coil, top-load and loan checks inside it, RETURNING the tag;
 * INSERT HeatSinkSample (one multi-row statement); the summary's revision upsert; INSERT AuditEvent; COMMIT. It skips
 * what is not a statement: zod, the warm-up fit of the samples, building the SQL and the adapter's argument handling;
 * that is what the ratio measures. `sessionWrite` keeps the ten statements the query API sent for the same write
 * (BEGIN; the key look-up; the coil; the top load; the open loan; INSERT RunSession; INSERT HeatSinkSample; the
 * created session read back; the upsert; INSERT AuditEvent; COMMIT): bench/prisma-lines.ts compares Prisma lines on it.
 */
import { execFileSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import Database from "better-sqlite3";
import pg from "pg";
import { fitSessionSamples } from "../lib/analysis/session-fit";
import { DEFAULT_SITE_ID } from "../lib/db/site-scope";
import { emitFigure } from "./figures";
import { alternateBatches } from "./large-fleet-timing";

export const SESSION_WRITE_IDS = { user: "pl-user", coil: "pl-coil", topLoad: "pl-top" } as const;
const IDS = SESSION_WRITE_IDS;
export const SESSION_SAMPLES = [
  { elapsedS: 0, temperatureC: 21 },
  { elapsedS: 300, temperatureC: 30 },
  { elapsedS: 600, temperatureC: 34 },
];
const SAMPLES = SESSION_SAMPLES;
/** The stored warm-up fit of SESSION_SAMPLES, the same for every write (the floor stores it as computed once). */
export const SESSION_FIT = fitSessionSamples(SESSION_SAMPLES);
const FIT = SESSION_FIT;

let sessionNumber = 0;
/** A new submission: its own key, a start a minute after the last one's. */
export function nextSession() {
  sessionNumber++;
  return { clientKey: randomUUID(), startedAt: new Date(Date.UTC(2026, 0, 1) + sessionNumber * 60_000), notes: `bench session ${sessionNumber}` };
}

// ───────────────────────── the raw floors: the same statements, prepared, in one transaction ─────────────────────────

export function sqliteSessionWriteFloor(db: Database.Database) {
  const byKey = db.prepare(`SELECT * FROM "RunSession" WHERE "clientKey" = ? LIMIT 1`);
  const coil = db.prepare(`SELECT id, tag FROM "Coil" WHERE id = ? LIMIT 1`);
  const topLoad = db.prepare(`SELECT "coilId" FROM "TopLoad" WHERE id = ? LIMIT 1`);
  const loan = db.prepare(`SELECT id FROM "Loan" WHERE "coilId" = ? AND "outAt" <= ? AND ("returnedAt" IS NULL OR "returnedAt" > ?) LIMIT 1`);
  const session = db.prepare(
    `INSERT INTO "RunSession" (id, "coilId", "topLoadId", "startedAt", "loggedById", "supplyVoltageV", "supplyCurrentA", "durationS", "ambientTempC", "heatSinkEndC", outcome, notes,
       "loanId", "createdAt", "clientKey", "sinkFitSampleCount", "sinkSteadyStateC", "sinkSteadyStateSeK", "sinkTimeConstantS", "sinkFitExtrapolation", "sinkFitJson")
     VALUES (?, ?, ?, ?, ?, 24, 1.2, 600, 21, 34, 'normal', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?) RETURNING id`,
  );
  const samples = db.prepare(`INSERT INTO "HeatSinkSample" ("sessionId", "elapsedS", "temperatureC") VALUES (?, ?, ?), (?, ?, ?), (?, ?, ?) RETURNING id`);
  // The client reads the created session back (a nested create returns the parent row after its children).
  const created = db.prepare(`SELECT * FROM "RunSession" WHERE id = ? LIMIT 1`);
  const summary = db.prepare(`INSERT INTO "CoilSummary" ("coilId", revision) VALUES (?, 1) ON CONFLICT ("coilId") DO UPDATE SET revision = revision + 1 RETURNING *`);
  const audit = db.prepare(`INSERT INTO "AuditEvent" ("siteId", at, "actorId", action, entity, "entityId", summary, "detailJson") VALUES (?, ?, ?, 'create', 'RunSession', ?, ?, ?)`);
  const write = db.transaction(() => {
    const { clientKey, startedAt, notes } = nextSession();
    const at = startedAt.toISOString();
    if (byKey.get(clientKey)) return;
    const c = coil.get(IDS.coil) as { id: string; tag: string };
    topLoad.get(IDS.topLoad);
    const l = loan.get(c.id, at, at) as { id: string } | undefined;
    const id = randomUUID();
    session.get(id, c.id, IDS.topLoad, at, IDS.user, notes, l?.id ?? null, new Date().toISOString(), clientKey, FIT.sinkFitSampleCount, FIT.sinkSteadyStateC, FIT.sinkSteadyStateSeK, FIT.sinkTimeConstantS, FIT.sinkFitExtrapolation, FIT.sinkFitJson);
    samples.all(...SAMPLES.flatMap((s) => [id, s.elapsedS, s.temperatureC]));
    created.get(id);
    summary.get(c.id);
    audit.run(DEFAULT_SITE_ID, new Date().toISOString(), IDS.user, id, `Logged a 10 min session on ${c.tag} at 24 V with 3 heat-sink samples`, JSON.stringify({ clientKey, notes }));
  });
  // What createSession sends today (lib/db/sessions.ts insertSession): the checks and the loan inside the INSERT, no
  // key look-up first (the unique index answers), no read-back; samples, summary bump and audit event.
  const checkedSession = db.prepare(
    `INSERT INTO "RunSession" (id, "coilId", "topLoadId", "startedAt", "loggedById", "supplyVoltageV", "supplyCurrentA", "durationS", "ambientTempC",
       "heatSinkStartC", "heatSinkEndC", "runningFrequencyHz", "peakSwitchVoltageV", "dutyCycle", outcome, notes, "loanId", "createdAt", "clientKey",
       "sinkFitSampleCount", "sinkSteadyStateC", "sinkSteadyStateSeK", "sinkTimeConstantS", "sinkFitExtrapolation", "sinkFitJson")
     VALUES (?, (SELECT c.id FROM "Coil" c WHERE c.id = ? AND c."siteId" = ? AND EXISTS (SELECT 1 FROM "TopLoad" t WHERE t.id = ? AND t."coilId" = c.id)),
       ?, ?, ?, 24, 1.2, 600, 21, NULL, 34, NULL, NULL, NULL, 'normal', ?,
       (SELECT l.id FROM "Loan" l WHERE l."coilId" = ? AND l."outAt" <= ? AND (l."returnedAt" IS NULL OR l."returnedAt" > ?) LIMIT 1),
       ?, ?, ?, ?, ?, ?, ?, ?)
     RETURNING "loanId", (SELECT tag FROM "Coil" WHERE "Coil".id = "RunSession"."coilId") AS "coilTag"`,
  );
  const samplesNow = db.prepare(`INSERT INTO "HeatSinkSample" ("sessionId", "elapsedS", "temperatureC") VALUES (?, ?, ?), (?, ?, ?), (?, ?, ?)`);
  const summaryNow = db.prepare(`INSERT INTO "CoilSummary" ("coilId", revision) VALUES (?, 1) ON CONFLICT ("coilId") DO UPDATE SET revision = "CoilSummary".revision + 1`);
  const auditNow = db.prepare(`INSERT INTO "AuditEvent" ("siteId", at, "actorId", action, entity, "entityId", summary, "detailJson") VALUES (?, ?, ?, 'create', 'RunSession', ?, ?, ?)`);
  const writeNow = db.transaction(() => {
    const { clientKey, startedAt, notes } = nextSession();
    const at = startedAt.toISOString().replace("Z", "+00:00");
    const id = randomUUID();
    const row = checkedSession.get(id, IDS.coil, DEFAULT_SITE_ID, IDS.topLoad, IDS.topLoad, at, IDS.user, notes, IDS.coil, at, at, new Date().toISOString().replace("Z", "+00:00"), clientKey,
      FIT.sinkFitSampleCount, FIT.sinkSteadyStateC, FIT.sinkSteadyStateSeK, FIT.sinkTimeConstantS, FIT.sinkFitExtrapolation, FIT.sinkFitJson) as { coilTag: string };
    samplesNow.run(...SAMPLES.flatMap((s) => [id, s.elapsedS, s.temperatureC]));
    summaryNow.run(IDS.coil);
    auditNow.run(DEFAULT_SITE_ID, new Date().toISOString().replace("Z", "+00:00"), IDS.user, id, `Logged a 10 min session on ${row.coilTag} at 24 V with 3 heat-sink samples`, JSON.stringify({ clientKey, notes }));
  });
  const findById = db.prepare(`SELECT * FROM "Coil" WHERE id = ? LIMIT 1`);
  const narrow = db.prepare(`SELECT id, tag, name FROM "Coil" WHERE id = ?`);
  return {
    findUnique: async () => findById.get(IDS.coil),
    queryRaw: async () => narrow.all(IDS.coil),
    // SQLite's transaction is what the app's Serializable one is there (BEGIN … COMMIT on one connection).
    sessionWrite: async () => write(),
    /** The statements createSession sends now (its floor in `--write`). */
    currentSessionWrite: async () => writeNow(),
  };
}

export function postgresSessionWriteFloor(client: pg.Client) {
  const q = (name: string, text: string, values: unknown[]) => client.query({ name, text, values });
  return {
    findUnique: () => q("coil", `SELECT * FROM "Coil" WHERE id = $1 LIMIT 1`, [IDS.coil]),
    queryRaw: () => q("narrow", `SELECT id, tag, name FROM "Coil" WHERE id = $1`, [IDS.coil]),
    sessionWrite: async () => {
      const { clientKey, startedAt, notes } = nextSession();
      await client.query("BEGIN ISOLATION LEVEL SERIALIZABLE");
      try {
        await q("key", `SELECT * FROM "RunSession" WHERE "clientKey" = $1 LIMIT 1`, [clientKey]);
        const c = (await q("c", `SELECT id, tag FROM "Coil" WHERE id = $1 LIMIT 1`, [IDS.coil])).rows[0] as { id: string; tag: string };
        await q("t", `SELECT "coilId" FROM "TopLoad" WHERE id = $1 LIMIT 1`, [IDS.topLoad]);
        const l = (await q("l", `SELECT id FROM "Loan" WHERE "coilId" = $1 AND "outAt" <= $2 AND ("returnedAt" IS NULL OR "returnedAt" > $2) LIMIT 1`, [c.id, startedAt])).rows[0] as { id: string } | undefined;
        const id = randomUUID();
        await q(
          "s",
          `INSERT INTO "RunSession" (id, "coilId", "topLoadId", "startedAt", "loggedById", "supplyVoltageV", "supplyCurrentA", "durationS", "ambientTempC", "heatSinkEndC", outcome, notes,
             "loanId", "createdAt", "clientKey", "sinkFitSampleCount", "sinkSteadyStateC", "sinkSteadyStateSeK", "sinkTimeConstantS", "sinkFitExtrapolation", "sinkFitJson")
           VALUES ($1, $2, $3, $4, $5, 24, 1.2, 600, 21, 34, 'normal', $6, $7, now(), $8, $9, $10, $11, $12, $13, $14) RETURNING id`,
          [id, c.id, IDS.topLoad, startedAt, IDS.user, notes, l?.id ?? null, clientKey, FIT.sinkFitSampleCount, FIT.sinkSteadyStateC, FIT.sinkSteadyStateSeK, FIT.sinkTimeConstantS, FIT.sinkFitExtrapolation, FIT.sinkFitJson],
        );
        await q("h", `INSERT INTO "HeatSinkSample" ("sessionId", "elapsedS", "temperatureC") VALUES ($1, $2, $3), ($1, $4, $5), ($1, $6, $7) RETURNING id`, [id, ...SAMPLES.flatMap((s) => [s.elapsedS, s.temperatureC])]);
        await q("r", `SELECT * FROM "RunSession" WHERE id = $1 LIMIT 1`, [id]);
        await q("u", `INSERT INTO "CoilSummary" ("coilId", revision) VALUES ($1, 1) ON CONFLICT ("coilId") DO UPDATE SET revision = "CoilSummary".revision + 1 RETURNING *`, [c.id]);
        await q("a", `INSERT INTO "AuditEvent" ("siteId", "actorId", action, entity, "entityId", summary, "detailJson") VALUES ($1, $2, 'create', 'RunSession', $3, $4, $5)`, [DEFAULT_SITE_ID, IDS.user, id, `Logged a session on ${c.tag}`, JSON.stringify({ clientKey, notes })]);
        await client.query("COMMIT");
      } catch (error) {
        await client.query("ROLLBACK");
        throw error;
      }
    },
  };
}

// ───────────────────────── fixtures ─────────────────────────

/** A freshly migrated SQLite file with one user, one coil of the default site and its top load. */
export function freshSessionWriteSqlite(file: string): void {
  mkdirSync(path.dirname(file), { recursive: true });
  for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
  const env = { ...process.env, DATABASE_URL: `file:${file}` };
  execFileSync("npx", ["prisma", "migrate", "deploy"], { env, stdio: "ignore" });
  execFileSync("npx", ["tsx", "scripts/prepare-db.ts"], { env, stdio: "ignore" });
  const db = new Database(file);
  const now = new Date().toISOString().replace("Z", "+00:00");
  db.prepare(`INSERT INTO "User" (id, email, name, passwordHash, active, createdAt, updatedAt) VALUES (?, 'lines@example.org', 'Bench', 'x', 1, ?, ?)`).run(IDS.user, now, now);
  db.prepare(
    `INSERT INTO "Coil" (id, "siteId", tag, name, "builderName", status, topology, "formDiameterM", "windingLengthM", turns, "wireDiameterM", "wireMaterial", notes, "createdAt", "updatedAt", version)
     VALUES (?, ?, 'PL-01', 'Lines coil', 'Bench', 'active', 'single_switch', 0.075, 0.3, 1000, 0.0003, 'copper', '', ?, ?, 0)`,
  ).run(IDS.coil, DEFAULT_SITE_ID, now, now);
  db.prepare(`INSERT INTO "TopLoad" (id, "coilId", name, shape, "diameterM", "tubeDiameterM", notes, "createdAt") VALUES (?, ?, 'Toroid', 'toroid', 0.2, 0.05, '', ?)`).run(IDS.topLoad, IDS.coil, now);
  db.close();
}

/** The same in an emptied PostgreSQL database (its public schema is dropped). */
export async function freshSessionWritePostgres(url: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  await client.query('DROP SCHEMA IF EXISTS "public" CASCADE');
  await client.query('CREATE SCHEMA "public"');
  await client.end();
  execFileSync("npx", ["prisma", "migrate", "deploy"], { env: { ...process.env, DATABASE_URL: url }, stdio: "ignore" });
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  await db.query(`INSERT INTO "User" (id, email, name, "passwordHash", active, "updatedAt") VALUES ($1, 'lines@example.org', 'Bench', 'x', true, now())`, [IDS.user]);
  await db.query(
    `INSERT INTO "Coil" (id, "siteId", tag, name, "builderName", "formDiameterM", "windingLengthM", turns, "wireDiameterM", "updatedAt") VALUES ($1, $2, 'PL-01', 'Lines coil', 'Bench', 0.075, 0.3, 1000, 0.0003, now())`,
    [IDS.coil, DEFAULT_SITE_ID],
  );
  await db.query(`INSERT INTO "TopLoad" (id, "coilId", name, shape, "diameterM", "tubeDiameterM") VALUES ($1, $2, 'Toroid', 'toroid', 0.2, 0.05)`, [IDS.topLoad, IDS.coil]);
  await db.end();
}


// ───────────────────────── the --write section ─────────────────────────

const DB_PATH = path.resolve("data/bench/session-write.db");

export async function benchSessionWrite(): Promise<void> {
  freshSessionWriteSqlite(DB_PATH);
  process.env.DATABASE_URL = `file:${DB_PATH}`;
  const { logSessionThroughApp } = await import("./app-calls");
  const { sessionSchema } = await import("../lib/validation/session");
  const form = sessionSchema.parse({
    coilId: IDS.coil,
    topLoadId: IDS.topLoad,
    startedAt: "2026-01-01T10:00",
    supplyVoltageV: "24 V",
    supplyCurrentA: "1.2",
    durationS: "10 min",
    ambientTempC: "21",
    heatSinkEndC: "34",
    notes: "",
    samples: SAMPLES.map((s) => `${s.elapsedS}, ${s.temperatureC}`).join("\n"),
    clientKey: randomUUID(),
  });
  const raw = new Database(DB_PATH);
  const floor = sqliteSessionWriteFloor(raw);
  // Ratios are to the last contender: createSession's own statements, prepared. The earlier ten-statement write
  // (the query API's statements, bench/prisma-lines.ts) is timed beside it for comparison.
  const [app, earlier, rawFloor] = await alternateBatches(
    [
      { name: "createSession", call: () => { const next = nextSession(); return logSessionThroughApp(IDS.user, { ...form, ...next }); } },
      { name: "better-sqlite3, the query API's ten statements", call: floor.sessionWrite },
      { name: "better-sqlite3", call: floor.currentSessionWrite },
    ],
    { batch: 20, rounds: 15, warmUp: 40 },
  );
  raw.close();
  console.log(`\nSession write (SQLite, ${DB_PATH}): per write, median of 15 alternating rounds of 20`);
  console.log(`  lib/db createSession ${app!.ms.toFixed(2)} ms   raw better-sqlite3, same statements ${rawFloor!.ms.toFixed(3)} ms   ×${app!.ratio.toFixed(1)}`);
  console.log(`  (raw better-sqlite3, the query API's earlier ten statements: ${earlier!.ms.toFixed(3)} ms, ×${earlier!.ratio.toFixed(1)} the floor)`);
  emitFigure({ key: "sessionWrite", value: app!.ms, floor: rawFloor!.ms, ratio: app!.ratio });
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  benchSessionWrite().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
