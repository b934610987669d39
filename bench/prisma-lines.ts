/**
 * `PRISMA7_DIR=<a scratch copy> npm run bench -- --prisma-lines`: the Prisma line in package.json (6.19) against a newer
 * one (7.x, whose client caches query plans) on the same workload, in one process, alternating, each against raw
 * better-sqlite3 running the same statements. With PRISMA_LINES_POSTGRES_URL (an expendable PostgreSQL database: its
 * schema is dropped and rebuilt) the same again through the pg adapters against node-postgres.
 *
 * The newer line cannot be installed beside the app's own (one `prisma` and one `@prisma/client` per node_modules),
 * so it lives in a scratch copy of the repository with its own node_modules; docs/prisma-lines.md says how to
 * make one. Its generated clients (lib/db/generated*, from the same schema) and its adapters are imported from there,
 * so each line runs its own runtime. The database schema comes from this repository's migrations (the 6.19 CLI).
 *
 * Workloads, as the app runs them:
 *   - findUnique: one coil by id (what every page's look-ups cost per call);
 *   - $queryRaw: one coil by id as tagged SQL (lib/db/raw-read.ts's path);
 *   - the session write: lib/db/sessions.ts createSession with a submission key (the log form and POST /api/sessions
 *     always send one): Serializable transaction, key look-up, coil, top load, open loan, the session with its samples,
 *     the summary's revision upsert, the audit event. The raw floor runs the statements the 6.19 client sends (printed
 *     first, from its query log) through prepared statements in one transaction.
 */
import { existsSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import Database from "better-sqlite3";
import pg from "pg";
// eslint-disable-next-line no-restricted-imports -- comparing Prisma lines means building each line's client here, not through lib/db
import { PrismaBetterSQLite3 } from "@prisma/adapter-better-sqlite3";
// eslint-disable-next-line no-restricted-imports -- as above
import { PrismaPg } from "@prisma/adapter-pg";
// eslint-disable-next-line no-restricted-imports -- as above
import { PrismaClient } from "../lib/db/generated/client";
// eslint-disable-next-line no-restricted-imports -- as above
import { PrismaClient as PostgresPrismaClient } from "../lib/db/generated-postgresql/client";
import { DEFAULT_SITE_ID } from "../lib/db/site-scope";
import { alternateBatches, type Contender } from "./large-fleet-timing";
import {
  freshSessionWritePostgres,
  freshSessionWriteSqlite,
  nextSession,
  postgresSessionWriteFloor,
  SESSION_FIT as FIT,
  SESSION_SAMPLES as SAMPLES,
  SESSION_WRITE_IDS as IDS,
  sqliteSessionWriteFloor,
} from "./session-write";

const DB_PATH = path.resolve("data/bench/prisma-lines.db");
const ROUNDS = Number(process.env.PRISMA_LINES_ROUNDS ?? 15);

type Client = PrismaClient;
interface Line {
  name: string;
  client: Client;
}

// ───────────────────────── the workload, through the query API (identical on both lines) ─────────────────────────

const findCoil = (db: Client) => db.coil.findUnique({ where: { id: IDS.coil } });
const rawCoil = (db: Client) => db.$queryRaw`SELECT id, tag, name FROM "Coil" WHERE id = ${IDS.coil}`;


/** lib/db/sessions.ts createSession's transaction (clientKey path), statement for statement. */
async function logSession(db: Client): Promise<string> {
  const { clientKey, startedAt, notes } = nextSession();
  return db.$transaction(
    async (tx) => {
      const existing = await tx.runSession.findUnique({ where: { clientKey }, include: { coil: { select: { tag: true } } } });
      if (existing) return existing.id;
      const coil = await tx.coil.findUnique({ where: { id: IDS.coil }, select: { id: true, tag: true } });
      if (!coil) throw new Error("fixture coil missing");
      const topLoad = await tx.topLoad.findUnique({ where: { id: IDS.topLoad }, select: { coilId: true } });
      if (!topLoad || topLoad.coilId !== coil.id) throw new Error("fixture top load missing");
      const loan = await tx.loan.findFirst({
        where: { coilId: coil.id, outAt: { lte: startedAt }, OR: [{ returnedAt: null }, { returnedAt: { gt: startedAt } }] },
        select: { id: true },
      });
      const fields = { coilId: coil.id, topLoadId: IDS.topLoad, startedAt, supplyVoltageV: 24, supplyCurrentA: 1.2, durationS: 600, ambientTempC: 21, heatSinkEndC: 34, notes, clientKey };
      const session = await tx.runSession.create({
        data: { ...fields, loggedById: IDS.user, loanId: loan?.id ?? null, ...FIT, samples: { create: SAMPLES } },
      });
      await tx.coilSummary.upsert({ where: { coilId: coil.id }, create: { coilId: coil.id, revision: 1 }, update: { revision: { increment: 1 } } });
      await tx.auditEvent.create({
        data: {
          siteId: DEFAULT_SITE_ID,
          actorId: IDS.user,
          action: "create",
          entity: "RunSession",
          entityId: session.id,
          summary: `Logged a 10 min session on ${coil.tag} at 24 V with ${SAMPLES.length} heat-sink samples`,
          detailJson: JSON.stringify({ ...fields, sampleCount: SAMPLES.length }),
        },
      });
      return session.id;
    },
    { isolationLevel: "Serializable" },
  );
}

/** The newer line's generated client and adapters, from the scratch copy's own lib/db/generated* and node_modules. */
async function loadNewerLine(dir: string) {
  const load = (file: string) => import(pathToFileURL(path.join(dir, file)).href) as Promise<Record<string, unknown>>;
  const sqliteAdapter = await load("node_modules/@prisma/adapter-better-sqlite3/dist/index.mjs");
  const pgAdapter = await load("node_modules/@prisma/adapter-pg/dist/index.mjs");
  const version = (await load("node_modules/@prisma/client/package.json").catch(() => ({ default: { version: "?" } }))) as { default: { version: string } };
  return {
    version: version.default.version,
    // 7.x renamed the SQLite adapter's class (PrismaBetterSQLite3 → PrismaBetterSqlite3).
    SqliteAdapter: (sqliteAdapter.PrismaBetterSqlite3 ?? sqliteAdapter.PrismaBetterSQLite3) as new (options: { url: string; timeout?: number }) => unknown,
    PgAdapter: pgAdapter.PrismaPg as new (options: { connectionString: string; max?: number }) => unknown,
    SqliteClient: (await load("lib/db/generated/client.ts")).PrismaClient as new (options: { adapter: unknown; log?: unknown; queryPlanCacheMaxSize?: number }) => Client,
    PostgresClient: (await load("lib/db/generated-postgresql/client.ts")).PrismaClient as new (options: { adapter: unknown; log?: unknown }) => Client,
  };
}

/** The statements a line's client sends for one session write, from its query log. */
async function statementsOf(make: (log: unknown) => Client): Promise<string[]> {
  const client = make([{ emit: "event", level: "query" }]);
  const statements: string[] = [];
  (client as unknown as { $on(event: "query", listener: (e: { query: string }) => void): void }).$on("query", (e) => statements.push(e.query));
  await logSession(client);
  statements.length = 0;
  await logSession(client);
  await client.$disconnect();
  return statements;
}

/** "SELECT RunSession", "INSERT HeatSinkSample", "COMMIT": a statement's verb and first table. */
function brief(statement: string): string {
  const verb = statement.trim().split(/\s+/)[0]!.toUpperCase();
  const table = /(?:FROM|INTO|UPDATE)\s+(?:[`"]?\w+[`"]?\.)?[`"]?(\w+)/i.exec(statement)?.[1];
  return table ? `${verb} ${table}` : verb;
}

// ───────────────────────── timing ─────────────────────────

async function compare(database: string, lines: Line[], floor: ReturnType<typeof sqliteSessionWriteFloor>, floorName: string) {
  const workloads: [string, (db: Client) => Promise<unknown>, () => Promise<unknown>, number][] = [
    ["findUnique (one coil by id)", findCoil, floor.findUnique, 100],
    ["$queryRaw (one coil by id)", rawCoil, floor.queryRaw, 100],
    ["session write (createSession's transaction)", logSession, floor.sessionWrite, 20],
  ];
  console.log(`\n  ${database}: per call, median of ${ROUNDS} alternating rounds; ratio = median per-round ratio to ${floorName}`);
  for (const [name, work, raw, batch] of workloads) {
    const contenders: Contender[] = [...lines.map((line) => ({ name: line.name, call: () => work(line.client) })), { name: floorName, call: raw }];
    const results = await alternateBatches(contenders, { batch, rounds: ROUNDS });
    const cells = results.map((r, i) => `${r.name} ${r.ms.toFixed(3)} ms${i < results.length - 1 ? ` ×${r.ratio.toFixed(1)}` : ""}`);
    console.log(`    ${name.padEnd(44)} ${cells.join("   ")}`);
  }
}

export async function benchPrismaLines(): Promise<void> {
  const dir = process.env.PRISMA7_DIR;
  if (!dir || !existsSync(path.join(dir, "lib/db/generated/client.ts"))) {
    console.log("\nPrisma lines: set PRISMA7_DIR to a scratch copy with the newer line installed and its clients generated (docs/prisma-lines.md)");
    return;
  }
  const newer = await loadNewerLine(dir);
  const sqliteUrl = `file:${DB_PATH}`;
  freshSessionWriteSqlite(DB_PATH);
  const current = new PrismaClient({ adapter: new PrismaBetterSQLite3({ url: sqliteUrl, timeout: 10_000 }) });
  const next = new newer.SqliteClient({ adapter: new newer.SqliteAdapter({ url: sqliteUrl, timeout: 10_000 }) });
  // The same line with its query-plan cache turned off: how much of the difference the cache is.
  const nextUncached = new newer.SqliteClient({ adapter: new newer.SqliteAdapter({ url: sqliteUrl, timeout: 10_000 }), queryPlanCacheMaxSize: 0 });
  const lines: Line[] = [
    { name: "6.19", client: current },
    { name: newer.version, client: next },
    { name: `${newer.version} uncached`, client: nextUncached },
  ];
  console.log(`\nPrisma lines: 6.19.3 (package.json) against ${newer.version} (${dir}), both with driver adapters, no native engine`);
  for (const [line, make] of [
    ["6.19", (log: unknown) => new PrismaClient({ adapter: new PrismaBetterSQLite3({ url: sqliteUrl }), log: log as never })],
    [newer.version, (log: unknown) => new newer.SqliteClient({ adapter: new newer.SqliteAdapter({ url: sqliteUrl }), log })],
  ] as const) {
    const statements = await statementsOf(make);
    console.log(`  SQLite, ${line}: one session write sends ${statements.length} statements: ${statements.map(brief).join(", ")}`);
  }
  const raw = new Database(DB_PATH);
  await compare("SQLite", lines, sqliteSessionWriteFloor(raw), "better-sqlite3");
  raw.close();
  await Promise.all(lines.map((line) => line.client.$disconnect()));

  const postgresUrl = process.env.PRISMA_LINES_POSTGRES_URL;
  if (!postgresUrl) {
    console.log("  (PostgreSQL: set PRISMA_LINES_POSTGRES_URL to an expendable database to compare the pg adapters too)");
    return;
  }
  await freshSessionWritePostgres(postgresUrl);
  const currentPg = new PostgresPrismaClient({ adapter: new PrismaPg({ connectionString: postgresUrl, max: 2 }) }) as unknown as Client;
  const nextPg = new newer.PostgresClient({ adapter: new newer.PgAdapter({ connectionString: postgresUrl, max: 2 }) });
  const rawPg = new pg.Client({ connectionString: postgresUrl });
  await rawPg.connect();
  await compare(
    "PostgreSQL",
    [
      { name: "6.19", client: currentPg },
      { name: newer.version, client: nextPg },
    ],
    postgresSessionWriteFloor(rawPg) as unknown as ReturnType<typeof sqliteSessionWriteFloor>,
    "node-postgres",
  );
  await rawPg.end();
  await currentPg.$disconnect();
  await nextPg.$disconnect();
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  benchPrismaLines().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
