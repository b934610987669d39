/**
 * Prepared statements kept for reuse on the SQLite connection.
 *
 * Why: Prisma's better-sqlite3 adapter (6.19) prepares every statement again on every call
 * (`client.prepare(sql).bind(args)`), and SQLite's prepare (parsing and planning) costs as much as running a small
 * statement: on the session write it was ~0.23 ms of ~1.5 ms (`npm run bench -- --write`), and every page read pays
 * it too. better-sqlite3 statements can be run again with new arguments, but `bind` fixes a statement's arguments
 * for good, so the cache hands the adapter a light stand-in per call that runs the kept statement with that call's
 * arguments. The stand-in offers exactly what the adapter calls: `bind(args)`, `reader`, `columns()`, `raw()`,
 * `all()`, `run()`; test/sqlite-statement-cache.test.ts checks it against the plain statement, and every integration
 * test runs through it. A Prisma upgrade must recheck the adapter's calls (docs/prisma-lines.md).
 *
 * The stand-in also hands back the statement's column descriptions from the first call: the adapter asks for them on
 * every read, and better-sqlite3 builds a fresh object per column each time (~0.3 ms of a coil page's ~20 ms). They
 * depend only on the statement's text and the schema, and the schema does not change under a running app.
 *
 * Bounded (least recently used out): statements differ only in their text, and a multi-row insert has one text per
 * row count. better-sqlite3 runs each statement to completion synchronously (the adapter never iterates), so one
 * kept statement is never in use by two calls at once.
 */
import type Database from "better-sqlite3";

/** How many statements one connection keeps: the app sends well under this many distinct texts. */
export const STATEMENT_CACHE_SIZE = 500;

type Statement = Database.Statement<unknown[]>;

/** What the adapter uses of a prepared statement, with the call's arguments bound. */
interface BoundStatement {
  readonly reader: boolean;
  columns(): Database.ColumnDefinition[];
  raw(toggle?: boolean): BoundStatement;
  all(): unknown[];
  run(): Database.RunResult;
}

interface ReusableStatement extends Omit<BoundStatement, "raw"> {
  bind(args: unknown[]): BoundStatement;
}

/** A kept statement with its column descriptions, read once. */
interface Kept {
  statement: Statement;
  columns?: Database.ColumnDefinition[];
}

function columnsOf(kept: Kept): Database.ColumnDefinition[] {
  return (kept.columns ??= kept.statement.columns());
}

function bound(kept: Kept, args: unknown[]): BoundStatement {
  const { statement } = kept;
  let raw = false;
  const self: BoundStatement = {
    reader: statement.reader,
    columns: () => columnsOf(kept),
    raw(toggle = true) {
      raw = toggle;
      return self;
    },
    // The mode is set on every call: the kept statement is shared with other calls that may have set it otherwise.
    all: () => statement.raw(raw).all(args),
    run: () => statement.run(args),
  };
  return self;
}

function reusable(kept: Kept): ReusableStatement {
  const { statement } = kept;
  return {
    reader: statement.reader,
    bind: (args) => bound(kept, args),
    columns: () => columnsOf(kept),
    all: () => (statement.reader ? statement.raw(false).all() : []),
    run: () => statement.run(),
  };
}

/** Makes `db.prepare` reuse statements by their text. Returns how many statements it has prepared (for the tests). */
export function cacheStatements(db: Database.Database, size: number = STATEMENT_CACHE_SIZE): { prepared(): number } {
  const prepare = db.prepare.bind(db) as (sql: string) => Statement;
  const kept = new Map<string, Kept>();
  let prepared = 0;
  (db as unknown as { prepare: (sql: string) => ReusableStatement }).prepare = (sql: string) => {
    let entry = kept.get(sql);
    if (entry) {
      // Most recently used last, so the first key is the one to drop.
      kept.delete(sql);
      kept.set(sql, entry);
    } else {
      entry = { statement: prepare(sql) };
      prepared++;
      kept.set(sql, entry);
      if (kept.size > size) kept.delete(kept.keys().next().value!);
    }
    return reusable(entry);
  };
  return { prepared: () => prepared };
}
