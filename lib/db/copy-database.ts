/**
 * Copies a whole Coilyard database into another, empty one, table by table, with every id, timestamp and password
 * hash as stored, then proves the copy: each table's row count and an order-independent digest of its rows must
 * match on both sides. This is how a club moves from the embedded SQLite file to PostgreSQL (or back); the logbook
 * export (export.ts) is per coil and leaves out accounts and the audit trail, so it cannot serve.
 *
 * Written against Prisma's model API, not SQL, so either side may be either database. All writes to the target
 * happen in one transaction: a refusal or a crash part-way leaves the target as empty as it was.
 */
import { createHash } from "node:crypto";
import type { PrismaClient, Prisma } from "./generated/client";
import { createPrismaClient } from "./client";
import { databaseProvider } from "../config/database-url";
import { DEFAULT_SITE_ID } from "./site-scope";

type Row = Record<string, unknown>;
type AnyDelegate = {
  findMany(args: { where?: Row; orderBy: Row[]; take: number; select?: Row }): Promise<Row[]>;
  createMany(args: { data: Row[] }): Promise<{ count: number }>;
  count(args?: { where: Row }): Promise<number>;
  update(args: { where: Row; data: Row }): Promise<Row>;
};

/**
 * Every table, parents before children. `key`: the primary key's columns when not `id`. `deferred` columns point at
 * rows of the same table (a part's replacement), so they are written as null first and filled in once every row
 * exists. `intId`: an autoincrement key, whose PostgreSQL sequence must be moved past the copied ids.
 * Sites come first: coils, memberships, lending policies, audit events and cross-site loans name their site, so
 * each record keeps its owner in the copy.
 */
export const COPY_ORDER: { model: Prisma.ModelName; key?: string[]; intId?: true; deferred?: string[] }[] = [
  { model: "Site" },
  { model: "User" },
  { model: "SiteMembership", key: ["userId", "siteId"] },
  { model: "SignInThrottle", key: ["key"] },
  { model: "ClearancePolicy" },
  { model: "Coil" },
  // A cache of each coil's health (coil-summary.ts), copied too so the new database starts warm.
  { model: "CoilSummary", key: ["coilId"] },
  { model: "TopLoad" },
  { model: "Component", deferred: ["replacedById"] },
  { model: "Sweep" },
  { model: "SweepPoint", intId: true },
  { model: "SweepResonance" },
  { model: "Clearance" },
  { model: "Loan" },
  { model: "RunSession" },
  { model: "HeatSinkSample", intId: true },
  { model: "Failure" },
  { model: "AuditEvent", intId: true },
];

const BATCH = 5_000;

function delegate(client: PrismaClient | Prisma.TransactionClient, model: string): AnyDelegate {
  return (client as unknown as Record<string, AnyDelegate>)[model.charAt(0).toLowerCase() + model.slice(1)]!;
}

function keyOf(model: string): string[] {
  return COPY_ORDER.find((t) => t.model === model)?.key ?? ["id"];
}

/** `where` for the rows after `last` in the order of `key` (a composite key compares column by column). */
function rowsAfter(key: readonly string[], last: Row): Row {
  return {
    OR: key.map((column, i) => ({ ...Object.fromEntries(key.slice(0, i).map((equal) => [equal, last[equal]])), [column]: { gt: last[column] } })),
  };
}

/** Reads a table in key order, a batch at a time (keyset pagination: no OFFSET scans on large tables). */
async function* readTable(client: PrismaClient | Prisma.TransactionClient, model: string): AsyncGenerator<Row[]> {
  const key = keyOf(model);
  let last: Row | undefined = undefined;
  for (;;) {
    const rows = await delegate(client, model).findMany({ ...(last === undefined ? {} : { where: rowsAfter(key, last) }), orderBy: key.map((column) => ({ [column]: "asc" })), take: BATCH });
    if (rows.length === 0) return;
    yield rows;
    last = rows.at(-1)!;
    if (rows.length < BATCH) return;
  }
}

/**
 * A freshly migrated database is not quite empty: the sites migration creates the default site. The copy counts that
 * one row as empty (nothing else can refer to it while every other table is empty) and replaces it with the
 * source's sites, so the default site keeps the source's name and the copy stays row for row the same.
 */
const FRESH_DATABASE_ROWS: Partial<Record<Prisma.ModelName, Row>> = { Site: { id: DEFAULT_SITE_ID } };

/** A row as canonical text: keys sorted, Dates as ISO instants, so the same stored values give the same text on both databases. */
function canonicalRow(row: Row): string {
  return JSON.stringify(Object.keys(row).sort().map((k) => [k, row[k] instanceof Date ? (row[k] as Date).toISOString() : typeof row[k] === "bigint" ? String(row[k]) : row[k]]));
}

export interface TableDigest {
  rows: number;
  /** Sum of the rows' SHA-256 (first 128 bits) mod 2^128: independent of row order, which collations may change. */
  digest: string;
}

export async function digestTable(client: PrismaClient | Prisma.TransactionClient, model: string): Promise<TableDigest> {
  let rows = 0;
  let sum = 0n;
  const mask = (1n << 128n) - 1n;
  for await (const batch of readTable(client, model)) {
    for (const row of batch) {
      sum = (sum + BigInt("0x" + createHash("sha256").update(canonicalRow(row)).digest("hex").slice(0, 32))) & mask;
      rows++;
    }
  }
  return { rows, digest: sum.toString(16).padStart(32, "0") };
}

export class CopyRefusedError extends Error {}

export interface CopyReport {
  tables: { model: string; rows: number; digest: string }[];
  totalRows: number;
}

/**
 * Copy source into target (which must be migrated to the same version and hold no rows), then verify.
 * `onProgress` hears each table as it is copied.
 */
export async function copyDatabase(
  source: PrismaClient,
  target: PrismaClient,
  targetUrl: string,
  onProgress: (model: string, rows: number) => void = () => {},
): Promise<CopyReport> {
  for (const { model } of COPY_ORDER) {
    const fresh = FRESH_DATABASE_ROWS[model];
    const present = await delegate(target, model).count(fresh ? { where: { NOT: fresh } } : undefined);
    if (present > 0) throw new CopyRefusedError(`The target database is not empty: ${model} has ${present} row(s). Copy into a freshly migrated, empty database.`);
  }
  await target.$transaction(
    async (tx) => {
      for (const [model, fresh] of Object.entries(FRESH_DATABASE_ROWS)) await (delegate(tx, model) as unknown as { deleteMany(args: { where: Row }): Promise<unknown> }).deleteMany({ where: fresh });
      for (const { model, intId, deferred = [] } of COPY_ORDER) {
        let copied = 0;
        const later: Row[] = [];
        for await (const batch of readTable(source, model)) {
          const data = batch.map((row) => {
            if (deferred.length === 0) return row;
            const copy = { ...row };
            if (deferred.some((column) => row[column] != null)) later.push(row);
            for (const column of deferred) copy[column] = null;
            return copy;
          });
          copied += (await delegate(tx, model).createMany({ data })).count;
        }
        for (const row of later) {
          await delegate(tx, model).update({ where: { id: row.id }, data: Object.fromEntries(deferred.map((c) => [c, row[c]])) });
        }
        if (intId && databaseProvider(targetUrl) === "postgresql") {
          // Explicit ids do not advance PostgreSQL's sequence; without this the next insert would collide.
          await tx.$executeRawUnsafe(`SELECT setval(pg_get_serial_sequence('"${model}"', 'id'), (SELECT COALESCE(MAX("id"), 0) + 1 FROM "${model}"), false)`);
        }
        onProgress(model, copied);
      }
    },
    { timeout: 60 * 60_000, maxWait: 60_000 },
  );
  return verifyCopy(source, target);
}

/** Every table's count and digest on both sides; throws naming each table that differs. */
export async function verifyCopy(source: PrismaClient, target: PrismaClient): Promise<CopyReport> {
  const tables: CopyReport["tables"] = [];
  const differences: string[] = [];
  for (const { model } of COPY_ORDER) {
    const [from, to] = [await digestTable(source, model), await digestTable(target, model)];
    if (from.rows !== to.rows || from.digest !== to.digest) differences.push(`${model}: ${from.rows} row(s) in the source, ${to.rows} in the copy${from.rows === to.rows ? ", contents differ" : ""}`);
    tables.push({ model, rows: to.rows, digest: to.digest });
  }
  if (differences.length > 0) throw new CopyRefusedError(`The copy does not match its source:\n  ${differences.join("\n  ")}`);
  return { tables, totalRows: tables.reduce((n, t) => n + t.rows, 0) };
}

/** copyDatabase between two URLs, opening and closing both connections. */
export async function copyDatabaseByUrl(fromUrl: string, toUrl: string, onProgress?: (model: string, rows: number) => void): Promise<CopyReport> {
  const source = createPrismaClient(fromUrl);
  const target = createPrismaClient(toUrl);
  try {
    return await copyDatabase(source, target, toUrl, onProgress);
  } finally {
    await Promise.all([source.$disconnect(), target.$disconnect()]);
  }
}
