/**
 * `npm run bench -- --load` (after `npm run build`): a small, bounded load generator for session logging and pages.
 * Starts the built app (`next start`) on loopback against a fresh demo database, signs in as the demo member,
 * POSTs a fixed number of sessions to /api/sessions with a few requests in flight, and prints throughput,
 * p50/p99 latency and the count of 5xx answers; then checks every acknowledged session is in the database.
 * Node's own fetch is the client (no load-testing package is installed).
 *
 * Each figure is measured against the floor issue 13 sets for it: a trivial route handler (app/api/bench-floor,
 * enabled only by COILYARD_BENCH_FLOOR=1, which this benchmark sets) under the same load, in alternating blocks
 * (floor, work, floor, work…) so the machine's other work weighs on both alike. The figure compared is the server's
 * CPU time per request: the user + system time of the server's whole process group (/proc/<pid>/stat) over a block,
 * divided by its requests, so the load generator's own work (in this process) is not counted. Then the dashboard
 * and a coil page of the demo club the same way.
 *
 * With BENCH_POSTGRES_URL (an expendable PostgreSQL database: its schema is dropped and rebuilt) the same load
 * goes to two app instances sharing that database, alternating request by request, as a load balancer with
 * nothing sticky would send it; the acknowledged writes are then looked up in PostgreSQL.
 */
import { execFileSync, spawn } from "node:child_process";
import { mkdirSync, readdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { randomBytes, randomUUID } from "node:crypto";
import Database from "better-sqlite3";
import pg from "pg";
import { localMinute, signInByHand } from "../e2e/support/http-client";
import { recordFigure } from "./figures";

const PORT = Number(process.env.BENCH_PORT ?? 3106);
const BASE = `http://127.0.0.1:${PORT}`;
const POSTGRES_URL = process.env.BENCH_POSTGRES_URL;
/** One instance on SQLite; two sharing the database on PostgreSQL. */
const BASES = POSTGRES_URL ? [BASE, `http://127.0.0.1:${PORT + 1}`] : [BASE];
const REQUESTS = Number(process.env.BENCH_SESSION_POSTS ?? 500);
const IN_FLIGHT = 8;
/** Requests per block: the POSTs go in BLOCKS blocks, each after a block of the trivial route. */
const BLOCKS = 5;
// 100 a block: the server's CPU is counted in 10 ms ticks, so a block of the trivial route must take a good many of them.
const PAGE_REQUESTS = Number(process.env.BENCH_PAGE_REQUESTS ?? 400);
const FLOOR_PATH = "/api/bench-floor";
/** The page floor: an empty page in the signed-in layout (app/(app)/bench-floor/page.tsx), under the same flag. */
const PAGE_FLOOR_PATH = "/bench-floor";
/** Page requests over which sign-in checks and token decodes are counted. */
const AUTH_COUNT_REQUESTS = 40;
/** A demo coil with sessions, sweeps, parts and a top load (prisma/demo). */
const PAGE_COIL = "KM-01";
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

/** Clock ticks per second of /proc's CPU times (USER_HZ: 100 on Linux builds). */
const TICKS_PER_SECOND = 100; // getconf CLK_TCK

/** User + system CPU ms so far of every process in the given process groups (the `next start` trees). */
export function groupCpuMs(groups: number[]): number {
  let ticks = 0;
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    let stat: string;
    try {
      stat = readFileSync(`/proc/${entry}/stat`, "utf8");
    } catch {
      continue; // ended meanwhile
    }
    // Fields after the command name (which may hold spaces, inside parentheses): state ppid pgrp … utime(14) stime(15).
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    if (groups.includes(Number(fields[2]))) ticks += Number(fields[11]) + Number(fields[12]);
  }
  return (ticks * 1000) / TICKS_PER_SECOND;
}

interface Block {
  requests: number;
  seconds: number;
  latencies: number[];
  statuses: Map<number, number>;
  /** Server CPU ms per request over the block. */
  cpuMs: number;
}

/** `count` requests, IN_FLIGHT at a time; `send(i)` makes the i-th and returns its response. */
export async function runBlock(count: number, groups: number[], send: (i: number) => Promise<Response>, onAnswer?: (response: Response, i: number) => Promise<void>): Promise<Block> {
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  let next = 0;
  const worker = async () => {
    while (next < count) {
      const i = next++;
      const started = performance.now();
      const response = await send(i);
      if (onAnswer) await onAnswer(response, i);
      else await response.arrayBuffer();
      latencies.push(performance.now() - started);
      statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
    }
  };
  const cpuBefore = groupCpuMs(groups);
  const started = performance.now();
  await Promise.all(Array.from({ length: IN_FLIGHT }, worker));
  const seconds = (performance.now() - started) / 1000;
  return { requests: count, seconds, latencies: latencies.sort((a, b) => a - b), statuses, cpuMs: (groupCpuMs(groups) - cpuBefore) / count };
}

interface AuthCounts {
  signInChecks: number;
  tokenDecodes: number;
}

/**
 * The server's sign-in checks and token decodes so far (app/api/bench-floor `?authCounts`), summed over the instances;
 * null from a build that does not count them.
 */
async function readAuthCounts(): Promise<AuthCounts | null> {
  const total: AuthCounts = { signInChecks: 0, tokenDecodes: 0 };
  for (const base of BASES) {
    const answer = (await (await fetch(`${base}${FLOOR_PATH}?authCounts`)).json()) as { data?: AuthCounts };
    if (!answer.data) return null;
    total.signInChecks += answer.data.signInChecks;
    total.tokenDecodes += answer.data.tokenDecodes;
  }
  return total;
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;

/** Work and floor blocks in alternation (floor first); each figure is the median over the pairs. */
export async function alternateWithFloor(pairs: number, work: () => Promise<Block>, floor: () => Promise<Block>) {
  const works: Block[] = [];
  const floors: Block[] = [];
  for (let i = 0; i < pairs; i++) {
    floors.push(await floor());
    works.push(await work());
  }
  const all = (blocks: Block[]) => blocks.flatMap((b) => b.latencies).sort((a, b) => a - b);
  const statuses = new Map<number, number>();
  for (const b of works) for (const [status, n] of b.statuses) statuses.set(status, (statuses.get(status) ?? 0) + n);
  return {
    cpuMs: median(works.map((b) => b.cpuMs)),
    floorCpuMs: median(floors.map((b) => b.cpuMs)),
    cpuRatio: median(works.map((b, i) => b.cpuMs / floors[i]!.cpuMs)),
    throughput: works.reduce((n, b) => n + b.requests, 0) / works.reduce((s, b) => s + b.seconds, 0),
    floorThroughput: floors.reduce((n, b) => n + b.requests, 0) / floors.reduce((s, b) => s + b.seconds, 0),
    p50: quantile(all(works), 0.5),
    p99: quantile(all(works), 0.99),
    floorP50: quantile(all(floors), 0.5),
    statuses,
  };
}

interface Series {
  /** Server CPU ms per request, one per round. */
  cpuMs: number[];
  throughput: number;
  p50: number;
  statuses: Map<number, number>;
}

/** Several kinds of block, one of each per round in the listed order, for `rounds` rounds. */
export async function alternateBlocks(rounds: number, kinds: (() => Promise<Block>)[]): Promise<Series[]> {
  const blocks: Block[][] = kinds.map(() => []);
  for (let round = 0; round < rounds; round++) for (const [i, kind] of kinds.entries()) blocks[i]!.push(await kind());
  return blocks.map((series) => {
    const statuses = new Map<number, number>();
    for (const b of series) for (const [status, n] of b.statuses) statuses.set(status, (statuses.get(status) ?? 0) + n);
    return {
      cpuMs: series.map((b) => b.cpuMs),
      throughput: series.reduce((n, b) => n + b.requests, 0) / series.reduce((sum, b) => sum + b.seconds, 0),
      p50: quantile(series.flatMap((b) => b.latencies).sort((a, b) => a - b), 0.5),
      statuses,
    };
  });
}

/** Elements in a page's HTML (its inline payload escapes "<", so only real tags count). */
export function countElements(html: string): number {
  return html.match(/<[a-zA-Z]/g)?.length ?? 0;
}

/** The median over rounds of one series' CPU against another's in the same round. */
const roundRatio = (work: Series, floor: Series) => median(work.cpuMs.map((cpu, round) => cpu / floor.cpuMs[round]!));

function sessionBody(i: number) {
  return {
    coilId: COIL_IDS[i % COIL_IDS.length],
    startedAt: localMinute(i + 60),
    supplyVoltageV: "24 V",
    supplyCurrentA: (1 + (i % 7) * 0.05).toFixed(2),
    durationS: "10 min",
    ambientTempC: 21,
    heatSinkEndC: 34,
    notes: `load bench ${i}`,
    samples: "0, 21\n300, 30\n600, 34",
    // The log form and the offline queue always send a submission key (app/(app)/sessions/new/offline-queue.ts).
    clientKey: randomUUID(),
  };
}

export async function benchSessionLoad(): Promise<void> {
  const env: NodeJS.ProcessEnv = POSTGRES_URL
    ? { ...process.env, DATABASE_URL: POSTGRES_URL, NEXTAUTH_SECRET: randomBytes(32).toString("base64url"), NEXT_TELEMETRY_DISABLED: "1", COILYARD_BENCH_FLOOR: "1" }
    : { ...process.env, DATABASE_URL: `file:${DB_PATH}`, COILYARD_BENCH_FLOOR: "1", NEXTAUTH_URL: `http://localhost:${PORT}`, NEXT_TELEMETRY_DISABLED: "1", COILYARD_DATA_DIR: path.dirname(DB_PATH) };
  if (POSTGRES_URL) await freshPostgresDatabase(env);
  else freshDemoDatabase(env);
  const servers = BASES.map((base) =>
    spawn("npx", ["next", "start", "-p", new URL(base).port, "-H", "127.0.0.1"], { env: { ...env, NEXTAUTH_URL: base.replace("127.0.0.1", "localhost") }, stdio: "ignore", detached: true }),
  );
  try {
    for (const base of BASES) await waitForServer(base, Date.now() + 60_000);
    const cookie = await signInByHand(BASE, MEMBER.email, MEMBER.password);
    const groups = servers.map((server) => server.pid!).filter(Boolean);
    const base = (i: number) => BASES[i % BASES.length]!;
    const floorBlock = (count: number) => () => runBlock(count, groups, (i) => fetch(`${base(i)}${FLOOR_PATH}`));
    if ((await fetch(`${BASE}${FLOOR_PATH}`)).status !== 200) throw new Error(`${FLOOR_PATH} did not answer 200: was the build made from this code?`);

    const acknowledged: string[] = [];
    let offset = 0;
    const postBlock = async () => {
      const first = offset;
      offset += REQUESTS / BLOCKS;
      return runBlock(
        REQUESTS / BLOCKS,
        groups,
        (i) => fetch(`${base(first + i)}/api/sessions`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(sessionBody(first + i)) }),
        async (response) => {
          // A 5xx may come back as an HTML error page: it acknowledges nothing either way.
          const answer = (await response.json().catch(() => ({ ok: false }))) as { ok: boolean; data?: { id: string } };
          if (response.status === 201 && answer.ok && answer.data) acknowledged.push(answer.data.id);
        },
      );
    };
    const posts = await alternateWithFloor(BLOCKS, postBlock, floorBlock(REQUESTS / BLOCKS));
    const serverErrors = [...posts.statuses].filter(([status]) => status >= 500).reduce((n, [, count]) => n + count, 0);
    const found = await countStored(acknowledged);
    const where = POSTGRES_URL ? `two next start instances (${BASES.join(", ")}) on one PostgreSQL database` : `next start on ${BASE} (SQLite)`;
    console.log(`\nSession logging under load: ${REQUESTS} POST /api/sessions, ${IN_FLIGHT} in flight, ${where}, in ${BLOCKS} blocks alternating with ${FLOOR_PATH}`);
    console.log(`  throughput ${posts.throughput.toFixed(0)} req/s   p50 ${posts.p50.toFixed(1)} ms   p99 ${posts.p99.toFixed(1)} ms   5xx ${serverErrors}   statuses ${JSON.stringify(Object.fromEntries(posts.statuses))}`);
    console.log(`  server CPU ${posts.cpuMs.toFixed(2)} ms/request; trivial route ${posts.floorCpuMs.toFixed(2)} ms/request (${posts.floorThroughput.toFixed(0)} req/s, p50 ${posts.floorP50.toFixed(1)} ms)   ×${posts.cpuRatio.toFixed(1)}`);
    console.log(`  acknowledged ${acknowledged.length}, found in the database ${found}${found === acknowledged.length ? " (all)" : " — MISSING WRITES"}`);
    const writes = `${serverErrors} × 5xx, ${found}/${acknowledged.length} acknowledged writes found`;
    recordFigure({ key: "postSessionsCpu", value: posts.cpuMs, floor: posts.floorCpuMs, ratio: posts.cpuRatio, note: writes });
    recordFigure({ key: "postSessionsLatency", value: posts.p50, floor: posts.floorP50, note: `p99 ${posts.p99.toFixed(0)} ms` });
    if (serverErrors > 0 || found !== acknowledged.length) process.exitCode = 1;

    // Every page block is measured beside two floors, all in one alternation (trivial route, empty page, dashboard,
    // coil page, round after round): the trivial route issue 13 names, and an empty signed-in page (app/(app)/bench-floor)
    // that pays what Next and React spend on any page, so a page's own part shows apart from the framework's.
    const pageRounds = 4;
    const perBlock = PAGE_REQUESTS / pageRounds;
    // The third floor: the empty page with as many plain elements as the dashboard's markup has (counted now, so it
    // follows the dashboard as it changes): what rendering a page of that size costs, whatever it shows.
    const elementCount = async (pagePath: string) => countElements(await (await fetch(`${BASE}${pagePath}`, { headers: { cookie } })).text());
    const dashboardElements = await elementCount("/");
    const coilPageElements = await elementCount(`/coils/${PAGE_COIL}`);
    const emptyPageElements = await elementCount(PAGE_FLOOR_PATH);
    console.log(`  page sizes: dashboard ${dashboardElements} elements, coil page ${PAGE_COIL} ${coilPageElements}, empty signed-in page ${emptyPageElements} (the layout's)`);
    const pages = [
      { key: "emptyPageCpu", name: "empty signed-in page", pagePath: PAGE_FLOOR_PATH },
      { key: "plainPageCpu", name: `signed-in page of ${dashboardElements} plain elements`, pagePath: `${PAGE_FLOOR_PATH}?elements=${dashboardElements - emptyPageElements}` },
      { key: "dashboardCpu", name: "dashboard", pagePath: "/" },
      { key: "coilPageCpu", name: `coil page ${PAGE_COIL}`, pagePath: `/coils/${PAGE_COIL}` },
    ] as const;
    const pageBlock = (pagePath: string) => () => runBlock(perBlock, groups, (i) => fetch(`${base(i)}${pagePath}`, { headers: { cookie }, redirect: "manual" }));
    const authCounts: { name: string; checksPerRequest: number; decodesPerRequest: number }[] = [];
    for (const { name, pagePath } of pages.slice(2)) {
      // Sign-in checks and token decodes per page request, counted by the server over a block of its own.
      const countsBefore = await readAuthCounts();
      await runBlock(AUTH_COUNT_REQUESTS, groups, (i) => fetch(`${base(i)}${pagePath}`, { headers: { cookie }, redirect: "manual" }));
      const countsAfter = await readAuthCounts();
      if (countsBefore && countsAfter) {
        const checksPerRequest = (countsAfter.signInChecks - countsBefore.signInChecks) / AUTH_COUNT_REQUESTS;
        const decodesPerRequest = (countsAfter.tokenDecodes - countsBefore.tokenDecodes) / AUTH_COUNT_REQUESTS;
        authCounts.push({ name, checksPerRequest, decodesPerRequest });
      }
    }
    const measured = await alternateBlocks(pageRounds, [floorBlock(perBlock), ...pages.map(({ pagePath }) => pageBlock(pagePath))]);
    const [floor, emptyPage, plainPage] = measured;
    for (const [index, { key, name, pagePath }] of pages.entries()) {
      const page = measured[index + 1]!;
      const notOk = [...page.statuses].filter(([status]) => status !== 200).reduce((n, [, count]) => n + count, 0);
      const ratio = roundRatio(page, floor!);
      const isPage = key === "dashboardCpu" || key === "coilPageCpu";
      const againstEmpty = key === "emptyPageCpu" ? "" : `; empty signed-in page ${median(emptyPage!.cpuMs).toFixed(2)} ms   ×${roundRatio(page, emptyPage!).toFixed(1)}`;
      const againstPlain = isPage ? `; ${dashboardElements} plain elements ${median(plainPage!.cpuMs).toFixed(2)} ms   ×${roundRatio(page, plainPage!).toFixed(1)}` : "";
      console.log(
        `  ${name} (GET ${pagePath}, ${PAGE_REQUESTS} requests, ${IN_FLIGHT} in flight): ${page.throughput.toFixed(0)} req/s, p50 ${page.p50.toFixed(1)} ms, server CPU ${median(page.cpuMs).toFixed(2)} ms/request; trivial route ${median(floor!.cpuMs).toFixed(2)} ms   ×${ratio.toFixed(1)}${againstEmpty}${againstPlain}${notOk ? `   ${notOk} answers not 200: ${JSON.stringify(Object.fromEntries(page.statuses))}` : ""}`,
      );
      const note =
        key === "emptyPageCpu"
          ? "what any signed-in page costs"
          : key === "plainPageCpu"
            ? `×${roundRatio(page, emptyPage!).toFixed(1)} the empty page: rendering a page of the dashboard's size`
            : `×${roundRatio(page, emptyPage!).toFixed(1)} the empty signed-in page, ×${roundRatio(page, plainPage!).toFixed(1)} a page of ${dashboardElements} plain elements`;
      recordFigure({ key, value: median(page.cpuMs), floor: median(floor!.cpuMs), ratio, note: `${note}; ${page.throughput.toFixed(0)} req/s` });
      if (notOk) process.exitCode = 1;
    }
    for (const counted of authCounts) console.log(`  ${counted.name}: ${counted.checksPerRequest} sign-in checks and ${counted.decodesPerRequest} token decodes per request (${AUTH_COUNT_REQUESTS} requests; the proxy's decode included)`);
    if (authCounts.length === 0) console.log("  sign-in checks per request: not counted by this build (app/api/bench-floor ?authCounts)");
    else
      recordFigure({
        key: "signInChecks",
        value: Math.max(...authCounts.map((c) => c.checksPerRequest)),
        floor: 1,
        note: authCounts.map((c) => `${c.name}: ${c.checksPerRequest} check, ${c.decodesPerRequest} decodes (proxy + page)`).join("; "),
      });
  } finally {
    for (const server of servers) if (server.pid) process.kill(-server.pid, "SIGTERM");
  }
}
