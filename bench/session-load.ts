/**
 * `npm run bench -- --load` (after `npm run build`): a small, bounded load generator for session logging.
 * Starts the built app (`next start`) on loopback against a fresh demo database, signs in as the demo member,
 * POSTs a fixed number of sessions to /api/sessions with a few requests in flight, and prints throughput,
 * p50/p99 latency and the count of 5xx answers; then checks every acknowledged session is in the database.
 * Node's own fetch is the client (no load-testing package is installed).
 *
 * With BENCH_POSTGRES_URL (an expendable PostgreSQL database: its schema is dropped and rebuilt) the same load
 * goes to two app instances sharing that database, alternating request by request, as a load balancer with
 * nothing sticky would send it; the acknowledged writes are then looked up in PostgreSQL.
 */
import { execFileSync, spawn } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import Database from "better-sqlite3";
import pg from "pg";
import { localMinute, signInByHand } from "../e2e/support/http-client";

const PORT = Number(process.env.BENCH_PORT ?? 3106);
const BASE = `http://127.0.0.1:${PORT}`;
const POSTGRES_URL = process.env.BENCH_POSTGRES_URL;
/** One instance on SQLite; two sharing the database on PostgreSQL. */
const BASES = POSTGRES_URL ? [BASE, `http://127.0.0.1:${PORT + 1}`] : [BASE];
const REQUESTS = Number(process.env.BENCH_SESSION_POSTS ?? 500);
const IN_FLIGHT = 8;
const DB_PATH = path.resolve("data/bench/load.db");
const MEMBER = { email: "member@kettlewell.example", password: "demo-member-pass" };
const COIL_IDS = ["coil-KM-01", "coil-KM-02", "coil-KM-04", "coil-KM-05", "coil-KM-06"];

function freshDemoDatabase(env: NodeJS.ProcessEnv): void {
  mkdirSync(path.dirname(DB_PATH), { recursive: true });
  for (const suffix of ["", "-wal", "-shm"]) rmSync(DB_PATH + suffix, { force: true });
  execFileSync("npx", ["prisma", "migrate", "deploy"], { env, stdio: "ignore" });
  execFileSync("npx", ["tsx", "scripts/prepare-db.ts"], { env, stdio: "ignore" });
  execFileSync("npx", ["tsx", "prisma/seed.ts"], { env, stdio: "ignore" });
}

async function freshPostgresDatabase(env: NodeJS.ProcessEnv): Promise<void> {
  const client = new pg.Client({ connectionString: POSTGRES_URL });
  await client.connect();
  await client.query('DROP SCHEMA IF EXISTS "public" CASCADE');
  await client.query('CREATE SCHEMA "public"');
  await client.end();
  execFileSync("npx", ["prisma", "migrate", "deploy"], { env, stdio: "ignore" });
  execFileSync("npx", ["tsx", "prisma/seed.ts"], { env, stdio: "ignore" });
}

async function countStored(ids: string[]): Promise<number> {
  if (POSTGRES_URL) {
    const client = new pg.Client({ connectionString: POSTGRES_URL });
    await client.connect();
    const { rows } = await client.query<{ n: string }>('SELECT count(*) AS n FROM "RunSession" WHERE id = ANY($1)', [ids]);
    await client.end();
    return Number(rows[0]!.n);
  }
  const db = new Database(DB_PATH, { readonly: true });
  const found = ids.filter((id) => db.prepare(`SELECT 1 FROM RunSession WHERE id = ?`).get(id)).length;
  db.close();
  return found;
}

async function waitForServer(base: string, deadlineMs: number): Promise<void> {
  while (Date.now() < deadlineMs) {
    try {
      if ((await fetch(`${base}/sign-in`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error(`next start did not answer on ${base} in time (run \`npm run build\` first)`);
}

async function postSessions(cookie: string) {
  const latencies: number[] = [];
  const acknowledged: string[] = [];
  const statuses = new Map<number, number>();
  let next = 0;
  const worker = async () => {
    while (next < REQUESTS) {
      const i = next++;
      const body = {
        coilId: COIL_IDS[i % COIL_IDS.length],
        startedAt: localMinute(i + 60),
        supplyVoltageV: "24 V",
        supplyCurrentA: (1 + (i % 7) * 0.05).toFixed(2),
        durationS: "10 min",
        ambientTempC: 21,
        heatSinkEndC: 34,
        notes: `load bench ${i}`,
        samples: "0, 21\n300, 30\n600, 34",
      };
      const started = performance.now();
      const base = BASES[i % BASES.length]!;
      const response = await fetch(`${base}/api/sessions`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(body) });
      const answer = (await response.json()) as { ok: boolean; data?: { id: string } };
      latencies.push(performance.now() - started);
      statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
      if (response.status === 201 && answer.ok && answer.data) acknowledged.push(answer.data.id);
    }
  };
  const started = performance.now();
  await Promise.all(Array.from({ length: IN_FLIGHT }, worker));
  return { seconds: (performance.now() - started) / 1000, latencies: latencies.sort((a, b) => a - b), acknowledged, statuses };
}

export async function benchSessionLoad(): Promise<void> {
  const env: NodeJS.ProcessEnv = POSTGRES_URL
    ? { ...process.env, DATABASE_URL: POSTGRES_URL, NEXTAUTH_SECRET: randomBytes(32).toString("base64url"), NEXT_TELEMETRY_DISABLED: "1" }
    : { ...process.env, DATABASE_URL: `file:${DB_PATH}`, NEXTAUTH_URL: `http://localhost:${PORT}`, NEXT_TELEMETRY_DISABLED: "1", COILYARD_DATA_DIR: path.dirname(DB_PATH) };
  if (POSTGRES_URL) await freshPostgresDatabase(env);
  else freshDemoDatabase(env);
  const servers = BASES.map((base) =>
    spawn("npx", ["next", "start", "-p", new URL(base).port, "-H", "127.0.0.1"], { env: { ...env, NEXTAUTH_URL: base.replace("127.0.0.1", "localhost") }, stdio: "ignore", detached: true }),
  );
  try {
    for (const base of BASES) await waitForServer(base, Date.now() + 60_000);
    const cookie = await signInByHand(BASE, MEMBER.email, MEMBER.password);
    const { seconds, latencies, acknowledged, statuses } = await postSessions(cookie);
    const at = (q: number) => latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))]!;
    const serverErrors = [...statuses].filter(([status]) => status >= 500).reduce((n, [, count]) => n + count, 0);
    const found = await countStored(acknowledged);
    const where = POSTGRES_URL ? `two next start instances (${BASES.join(", ")}) on one PostgreSQL database` : `next start on ${BASE} (SQLite)`;
    console.log(`\nSession logging under load: ${REQUESTS} POST /api/sessions, ${IN_FLIGHT} in flight, ${where}`);
    console.log(`  throughput ${(REQUESTS / seconds).toFixed(0)} req/s   p50 ${at(0.5).toFixed(1)} ms   p99 ${at(0.99).toFixed(1)} ms   5xx ${serverErrors}   statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
    console.log(`  acknowledged ${acknowledged.length}, found in the database ${found}${found === acknowledged.length ? " (all)" : " — MISSING WRITES"}`);
    if (serverErrors > 0 || found !== acknowledged.length) process.exitCode = 1;
  } finally {
    for (const server of servers) if (server.pid) process.kill(-server.pid, "SIGTERM");
  }
}
