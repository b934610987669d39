/**
 * A seeded large-fleet fixture for the scale benchmarks: 500 coils, 250 000 run sessions with 2.5 million
 * heat-sink samples, and 5 000 sweeps of 400 points, in its own SQLite file (data/bench/large.db) built from
 * the committed migrations. Built once; reused while its row counts are right.
 *
 * Why this bypasses Prisma: loading 4.5 million rows through createMany costs minutes of query building and
 * parameter marshalling, while better-sqlite3 prepared statements inside one transaction load them in well under
 * a minute. This is benchmark fixture generation, not app code (lint allows better-sqlite3 only in bench/).
 * Values are simple synthetic readings (a seeded random walk with a slow drift), not lib/calc's models, which
 * would make generation several times slower for no benefit to the timing.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { DEFAULT_SITE_ID } from "../lib/db/site-scope";

export const LARGE_FLEET = { coils: 500, sessionsPerCoil: 500, samplesPerSession: 10, sweepsPerCoil: 10, pointsPerSweep: 400 } as const;
export const LARGE_DB_PATH = path.resolve("data/bench/large.db");
export const LARGE_DB_URL = `file:${LARGE_DB_PATH}`;
export const LARGE_FLEET_USER_ID = "bench-user";
export const largeFleetCoilId = (index: number) => `lf-coil-${index}`;

const EXPECTED: Record<string, number> = {
  Coil: LARGE_FLEET.coils,
  RunSession: LARGE_FLEET.coils * LARGE_FLEET.sessionsPerCoil,
  HeatSinkSample: LARGE_FLEET.coils * LARGE_FLEET.sessionsPerCoil * LARGE_FLEET.samplesPerSession,
  Sweep: LARGE_FLEET.coils * LARGE_FLEET.sweepsPerCoil,
  SweepPoint: LARGE_FLEET.coils * LARGE_FLEET.sweepsPerCoil * LARGE_FLEET.pointsPerSweep,
};

/** mulberry32: a tiny seeded generator so every machine builds the same fixture. */
function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function hasExpectedCounts(file: string): boolean {
  if (!existsSync(file)) return false;
  const db = new Database(file, { readonly: true });
  try {
    return Object.entries(EXPECTED).every(([table, n]) => (db.prepare(`SELECT count(*) AS n FROM "${table}"`).get() as { n: number }).n === n);
  } catch {
    return false;
  } finally {
    db.close();
  }
}

/** Builds the fixture unless a complete one exists; returns the seconds spent (0 when reused). */
export function ensureLargeFleet(): number {
  const env = { ...process.env, DATABASE_URL: LARGE_DB_URL };
  if (hasExpectedCounts(LARGE_DB_PATH)) {
    // A fixture built before a later migration (an index, say) is brought up to date, not rebuilt.
    execFileSync("npx", ["prisma", "migrate", "deploy"], { env, stdio: "ignore" });
    return 0;
  }
  const started = performance.now();
  mkdirSync(path.dirname(LARGE_DB_PATH), { recursive: true });
  for (const suffix of ["", "-wal", "-shm"]) rmSync(LARGE_DB_PATH + suffix, { force: true });
  execFileSync("npx", ["prisma", "migrate", "deploy"], { env, stdio: "ignore" });
  execFileSync("npx", ["tsx", "scripts/prepare-db.ts"], { env, stdio: "ignore" });
  const db = new Database(LARGE_DB_PATH);
  db.pragma("synchronous = OFF");
  db.transaction(() => insertFleet(db))();
  db.pragma("synchronous = NORMAL");
  db.exec("ANALYZE");
  db.close();
  return (performance.now() - started) / 1000;
}

const DAY_MS = 86_400_000;

function insertFleet(db: Database.Database): void {
  const random = seededRandom(20261202);
  const now = Date.now();
  const iso = (ms: number) => new Date(ms).toISOString().replace("Z", "+00:00");
  const t0 = iso(now - 400 * DAY_MS);
  db.prepare(`INSERT INTO "User" (id, email, name, passwordHash, active, createdAt, updatedAt) VALUES ('bench-user', 'bench@example.org', 'Bench Loader', 'x', 1, ?, ?)`).run(t0, t0);
  // A steward of the single-club site (migration 20261204090000_sites), where every coil of the fixture belongs.
  db.prepare(`INSERT INTO "SiteMembership" (userId, siteId, role, createdAt) VALUES ('bench-user', ?, 'steward', ?)`).run(DEFAULT_SITE_ID, t0);
  const coil = db.prepare(
    `INSERT INTO "Coil" (id, siteId, tag, name, builderName, status, topology, formDiameterM, windingLengthM, turns, wireDiameterM, wireMaterial, notes, createdAt, updatedAt)
     VALUES (?, '${DEFAULT_SITE_ID}', ?, ?, 'District lab', 'active', 'single_switch', 0.075, 0.3, 1000, 0.0003, 'copper', '', ?, ?)`,
  );
  const topLoad = db.prepare(`INSERT INTO "TopLoad" (id, coilId, name, shape, diameterM, tubeDiameterM, notes, createdAt) VALUES (?, ?, 'Spun toroid', 'toroid', 0.2, 0.05, '', ?)`);
  const part = db.prepare(
    `INSERT INTO "Component" (id, coilId, kind, partNumber, manufacturer, description, serial, switchType, voltageRatingV, continuousCurrentA, peakCurrentA,
       powerRating25CW, maxJunctionTempC, thermalResistanceJcKPerW, caseToSinkKPerW, sinkThermalResistanceKPerW, sinkMassKg, clampVoltageV, installedAt)
     VALUES (@id, @coilId, @kind, @partNumber, '', '', '', @switchType, @voltageRatingV, @continuousCurrentA, @peakCurrentA,
       @powerRating25CW, @maxJunctionTempC, @thermalResistanceJcKPerW, @caseToSinkKPerW, @sinkThermalResistanceKPerW, @sinkMassKg, @clampVoltageV, @installedAt)`,
  );
  const session = db.prepare(
    `INSERT INTO "RunSession" (id, coilId, topLoadId, startedAt, loggedById, supplyVoltageV, supplyCurrentA, durationS, ambientTempC, heatSinkStartC, heatSinkEndC,
       runningFrequencyHz, outcome, notes, createdAt) VALUES (?, ?, ?, ?, 'bench-user', ?, ?, ?, ?, ?, ?, ?, 'normal', ?, ?)`,
  );
  const sample = db.prepare(`INSERT INTO "HeatSinkSample" (sessionId, elapsedS, temperatureC) VALUES (?, ?, ?)`);
  const sweep = db.prepare(
    `INSERT INTO "Sweep" (id, coilId, topLoadId, takenAt, takenById, seriesResistanceOhm, sourceAmplitudeV, amplitudeConvention, environmentNotes, notes, pointCount, firstSeriesResonanceHz, createdAt)
     VALUES (?, ?, ?, ?, 'bench-user', 10000, 10, 'peak_to_peak', '', '', ?, ?, ?)`,
  );
  const point = db.prepare(`INSERT INTO "SweepPoint" (sweepId, frequencyHz, amplitudeV) VALUES (?, ?, ?)`);
  const nullParts = { switchType: null, voltageRatingV: null, continuousCurrentA: null, peakCurrentA: null, powerRating25CW: null, maxJunctionTempC: null, thermalResistanceJcKPerW: null, caseToSinkKPerW: null, sinkThermalResistanceKPerW: null, sinkMassKg: null, clampVoltageV: null };

  for (let c = 0; c < LARGE_FLEET.coils; c++) {
    const coilId = largeFleetCoilId(c);
    const tag = `LF-${String(c + 1).padStart(3, "0")}`;
    coil.run(coilId, tag, `Large fleet coil ${c + 1}`, t0, t0);
    const topLoadId = `lf-top-${c}`;
    topLoad.run(topLoadId, coilId, t0);
    part.run({ ...nullParts, id: `lf-sw-${c}`, coilId, kind: "switch", partNumber: "KX-N140", switchType: "bjt", voltageRatingV: 140, continuousCurrentA: 12, peakCurrentA: 20, powerRating25CW: 100, maxJunctionTempC: 150, thermalResistanceJcKPerW: 1.25, caseToSinkKPerW: 0.5, installedAt: t0 });
    part.run({ ...nullParts, id: `lf-sink-${c}`, coilId, kind: "heat_sink", partNumber: "HS-TO220-25", sinkThermalResistanceKPerW: 6.5, sinkMassKg: 0.03, installedAt: t0 });
    const resonanceHz = 300_000 + random() * 200_000;
    const baseCurrent = 0.8 + random() * 0.6;
    const drift = random() < 0.1 ? 0.0006 : 0; // one coil in ten slowly draws more current
    for (let s = 0; s < LARGE_FLEET.sessionsPerCoil; s++) {
      const id = `lf-s-${c}-${s}`;
      const startedMs = now - 360 * DAY_MS + s * (360 / LARGE_FLEET.sessionsPerCoil) * DAY_MS + Math.floor(random() * 3_600_000);
      const voltage = 24 + Math.round(random() * 4);
      const current = baseCurrent * (1 + drift * s) * (0.95 + random() * 0.1);
      const ambient = 19 + random() * 4;
      const durationS = 600 + Math.floor(random() * 1200);
      const rise = 8 + current * 10 + random() * 2;
      session.run(id, coilId, topLoadId, iso(startedMs), voltage, current, durationS, ambient, ambient + 0.5, ambient + rise, resonanceHz * (0.99 + random() * 0.02), s % 50 === 0 ? "checked the fan" : "", iso(startedMs));
      for (let k = 0; k < LARGE_FLEET.samplesPerSession; k++) {
        const t = (durationS * k) / (LARGE_FLEET.samplesPerSession - 1);
        sample.run(id, t, ambient + rise * (1 - Math.exp(-t / 400)) + (random() - 0.5) * 0.2);
      }
    }
    for (let w = 0; w < LARGE_FLEET.sweepsPerCoil; w++) {
      const id = `lf-w-${c}-${w}`;
      const takenMs = now - 360 * DAY_MS + w * 36 * DAY_MS;
      const f0 = resonanceHz * (1 - w * 0.0005);
      sweep.run(id, coilId, topLoadId, iso(takenMs), LARGE_FLEET.pointsPerSweep, f0, iso(takenMs));
      for (let p = 0; p < LARGE_FLEET.pointsPerSweep; p++) {
        const f = f0 * (0.5 + p / LARGE_FLEET.pointsPerSweep);
        const detune = (f - f0) / (f0 / 40);
        point.run(id, f, 10 / Math.sqrt(1 + detune * detune) + random() * 0.01);
      }
    }
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const seconds = ensureLargeFleet();
  console.log(seconds === 0 ? `${LARGE_DB_PATH}: complete fixture reused` : `${LARGE_DB_PATH}: built in ${seconds.toFixed(1)} s`);
}
