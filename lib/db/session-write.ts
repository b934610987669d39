/**
 * Transactions on the client's own driver adapter: the session write (createSession; sessions.ts insertSession
 * writes the four statements below) and the summary stores of a cold dashboard (coil-summary.ts storeCoilFigures and
 * the missing-row insert), the two writes hot enough for the query API's per-call compilation to matter.
 *
 * Why not the query API: Prisma 6.19 compiles every call, `$executeRaw` included, into a plan on the main thread
 * (~0.3–0.5 ms each here; lib/db/raw-read.ts), and the write took ten of them for ~0.2 ms of statements
 * (`npm run bench -- --write`). Here the statements go straight to the adapter the client is connected through
 * (lib/db/client.ts connectedAdapter: the same SQLite connection and transaction lock, or the same PostgreSQL pool),
 * with the client's own argument handling (dates stored as the query API stores them). The SQL is written once for
 * both databases; test/session-write.test.ts checks the stored rows and the returned session against the query API's
 * reading of them on SQLite and PostgreSQL.
 *
 * The statements, in one transaction:
 *  1. INSERT the session, its checks inside the statement: the coil is looked up at the scope's site (and, with a top
 *     load, only if the top load is that coil's), so a failed check leaves "coilId" null and the NOT NULL constraint
 *     refuses the row; the open loan is a scalar subquery. RETURNING gives the coil's tag. Writing first also means
 *     an SQLite transaction never holds a stale read when it asks for the write lock.
 *  2. INSERT the heat-sink samples, many rows a statement.
 *  3. The summary's revision bump (markCoilChanged, coil-summary.ts).
 *  4. INSERT the audit event.
 * The submission key needs no look-up first: RunSession.clientKey is unique, so a key already stored refuses the
 * INSERT, the transaction rolls back whole, and only then is the stored session looked up (replay or refusal).
 */
import { randomBytes } from "node:crypto";
import { adapterQuery } from "./adapter-read";
import { connectedAdapter, type AdapterTransaction } from "./client";
import type { Prisma } from "./generated/client";

/** Runs statements inside one adapter transaction. */
export interface StatementRunner {
  execute(statement: Prisma.Sql): Promise<number>;
  query<Row extends Record<string, unknown>>(statement: Prisma.Sql): Promise<Row[]>;
}

function runnerOf(tx: AdapterTransaction): StatementRunner {
  return {
    execute: (statement) => tx.executeRaw(adapterQuery(statement)),
    async query<Row extends Record<string, unknown>>(statement: Prisma.Sql) {
      const { columnNames, rows } = await tx.queryRaw(adapterQuery(statement));
      return rows.map((row) => Object.fromEntries(columnNames.map((name, i) => [name, row[i]])) as Row);
    },
  };
}

/** Runs `work` in one transaction on the client's adapter: COMMIT when it returns, ROLLBACK when it throws. */
export async function inAdapterTransaction<T>(work: (runner: StatementRunner) => Promise<T>): Promise<T> {
  const adapter = await connectedAdapter();
  const tx = await adapter.startTransaction();
  // The client's own protocol (Prisma 6.19's transaction manager): the statement, then the adapter's release.
  const end = async (sql: "COMMIT" | "ROLLBACK") => {
    if (!tx.options.usePhantomQuery) await tx.executeRaw({ sql, args: [], argTypes: [] });
    await (sql === "COMMIT" ? tx.commit() : tx.rollback());
  };
  let result: T;
  try {
    result = await work(runnerOf(tx));
  } catch (error) {
    await end("ROLLBACK").catch(() => undefined);
    throw error;
  }
  await end("COMMIT");
  return result;
}

/** What a driver adapter error says: its kind (UniqueConstraintViolation, NullConstraintViolation…) and the database's code. */
export function adapterErrorKind(error: unknown): { kind?: string; originalCode?: string } {
  if (!error || typeof error !== "object" || (error as { name?: unknown }).name !== "DriverAdapterError") return {};
  const cause = (error as { cause?: { kind?: unknown; originalCode?: unknown } }).cause;
  return { kind: typeof cause?.kind === "string" ? cause.kind : undefined, originalCode: typeof cause?.originalCode === "string" ? cause.originalCode : undefined };
}

/**
 * Another writer holds the database or got there first: SQLite busy (its lock, past the busy timeout), PostgreSQL's
 * serialization failure or deadlock. Run again, the write sees the winner's rows.
 */
export function isAdapterWriteConflict(error: unknown): boolean {
  const { kind, originalCode } = adapterErrorKind(error);
  return kind === "TransactionWriteConflict" || originalCode?.startsWith("SQLITE_BUSY") === true || originalCode === "40001" || originalCode === "40P01";
}

let idCounter = 0;
const PROCESS_MARK = randomBytes(2).toString("hex");

/**
 * A new row id shaped like the ones `@default(cuid())` makes (25 characters, "c" then the time in base 36), so ids
 * written here sort among the query API's by creation time as theirs do: time, a per-process counter, a per-process
 * mark and 8 random characters.
 */
export function newRecordId(): string {
  idCounter = (idCounter + 1) % 36 ** 4;
  const time = Date.now().toString(36).padStart(8, "0");
  const counter = idCounter.toString(36).padStart(4, "0");
  const mark = parseInt(PROCESS_MARK, 16).toString(36).padStart(4, "0").slice(-4);
  const random = BigInt(`0x${randomBytes(6).toString("hex")}`).toString(36).padStart(8, "0").slice(-8);
  return `c${time}${counter}${mark}${random}`;
}
