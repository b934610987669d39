/**
 * Read-check-write transactions that stay right when two people write the same coil at once.
 *
 * A check like "this coil is not already out" is only as good as the isolation it runs under. SQLite has one
 * writer at a time, but PostgreSQL's default (READ COMMITTED) lets two transactions both read "not out" and
 * both lend. Under SERIALIZABLE the database refuses one of them instead (PostgreSQL: SQLSTATE 40001, which
 * Prisma reports as P2034; SQLite with a second connection: SQLITE_BUSY when a transaction that has read tries
 * to write past a newer commit). The refused one is run again from the start, so it re-reads and now sees
 * the other's write. The retry is bounded: past it the error reaches the caller as any database error would.
 */
import { prisma, type Db, type Tx } from "./client";

const ATTEMPTS = 6;
/** First back-off; doubled each retry with jitter, so two retrying writers do not collide again in step. */
const FIRST_BACKOFF_MS = 5;

export interface SerializableOptions {
  timeout?: number;
  maxWait?: number;
  /** The client to run on (tests open several connections to make the writers truly concurrent). */
  db?: Db;
}

export async function serializableTransaction<T>(run: (tx: Tx) => Promise<T>, options: SerializableOptions = {}): Promise<T> {
  const { db = prisma, ...limits } = options;
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.$transaction(run, { isolationLevel: "Serializable", ...limits });
    } catch (error) {
      if (attempt >= ATTEMPTS || !isWriteConflict(error)) throw error;
      const backoff = FIRST_BACKOFF_MS * 2 ** (attempt - 1);
      await new Promise((resolve) => setTimeout(resolve, backoff / 2 + Math.random() * backoff));
    }
  }
}

/**
 * True for the errors that mean "another writer got there first; run me again": Prisma's P2034 (PostgreSQL's
 * serialization failure or deadlock; the pg adapter's TransactionWriteConflict when it comes at COMMIT), SQLite's busy family, which the better-sqlite3 adapter passes on
 * either mapped (plain SQLITE_BUSY → P1008 "Operation has timed out") or raw (SQLITE_BUSY_SNAPSHOT), and P2002:
 * a unique index refusing the row another writer just committed (PostgreSQL may report a check-then-insert race
 * that way rather than as a serialization failure). Run again, the transaction's own check sees the winner's row
 * and answers as it would have (the existing policy version, "tag already used"); a true duplicate still fails
 * after the bounded retries, with the same error.
 */
export function isWriteConflict(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && typeof e === "object" && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, kind, meta } = e as { code?: unknown; kind?: unknown; meta?: { driverAdapterError?: { cause?: { originalCode?: unknown } } } };
    if (code === "P2034" || code === "P2002") return true;
    // PostgreSQL's serialization failure raised at COMMIT reaches us unmapped, as the pg adapter's own error.
    if (kind === "TransactionWriteConflict") return true;
    if (typeof code === "string" && code.startsWith("SQLITE_BUSY")) return true;
    const original = meta?.driverAdapterError?.cause?.originalCode;
    if (typeof original === "string" && original.startsWith("SQLITE_BUSY")) return true;
  }
  return false;
}
