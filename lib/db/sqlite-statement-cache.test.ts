/**
 * The statement cache's stand-ins answer exactly as freshly prepared better-sqlite3 statements do, used the way
 * Prisma's better-sqlite3 adapter uses them (prepare(sql).bind(args), then reader/columns()/raw().all() or run()),
 * and a kept statement never carries one call's arguments into the next.
 */
import Database from "better-sqlite3";
import { beforeEach, describe, expect, it } from "vitest";
import { cacheStatements } from "./sqlite-statement-cache";

function openDatabase(): Database.Database {
  const db = new Database(":memory:");
  db.defaultSafeIntegers(true); // as the adapter opens it
  db.exec(`CREATE TABLE "Reading" (id INTEGER PRIMARY KEY, coil TEXT NOT NULL, volts REAL, at TEXT)`);
  return db;
}

/** The adapter's read: a reader gives its columns and raw rows, anything else runs. */
function adapterRead(db: Database.Database, sql: string, args: unknown[]) {
  const statement = db.prepare(sql).bind(args);
  if (!statement.reader) return { changes: statement.run().changes };
  return { columns: statement.columns().map((c) => [c.name, c.type]), rows: statement.raw().all() };
}

describe("cacheStatements", () => {
  let plain: Database.Database;
  let cached: Database.Database;
  let counter: { prepared(): number };
  beforeEach(() => {
    plain = openDatabase();
    cached = openDatabase();
    counter = cacheStatements(cached);
  });

  it("answers every read and write as a freshly prepared statement does", () => {
    const steps: [string, unknown[]][] = [
      [`INSERT INTO "Reading" (coil, volts, at) VALUES (?, ?, ?), (?, ?, ?)`, ["KM-01", 24, "2026-01-01T10:00:00.000+00:00", "KM-02", null, null]],
      [`INSERT INTO "Reading" (coil, volts, at) VALUES (?, ?, ?) RETURNING id, coil`, ["KM-01", 30.5, "2026-01-02T10:00:00.000+00:00"]],
      [`SELECT id, coil, volts, at FROM "Reading" WHERE coil = ? ORDER BY id`, ["KM-01"]],
      [`SELECT count(*) AS n, max(volts) AS top FROM "Reading"`, []],
      [`UPDATE "Reading" SET volts = volts + ? WHERE coil = ?`, [1, "KM-01"]],
      [`SELECT id, coil, volts, at FROM "Reading" WHERE coil = ? ORDER BY id`, ["KM-01"]],
      [`SELECT id, coil, volts, at FROM "Reading" WHERE coil = ? ORDER BY id`, ["KM-02"]],
      [`DELETE FROM "Reading" WHERE coil = ?`, ["KM-02"]],
      [`SELECT count(*) AS n, max(volts) AS top FROM "Reading"`, []],
    ];
    for (const [sql, args] of steps) expect(adapterRead(cached, sql, args), sql).toEqual(adapterRead(plain, sql, args));
    // Nine steps, six distinct texts.
    expect(counter.prepared()).toBe(6);
  });

  it("never carries one call's arguments into the next use of the same statement", () => {
    cached.prepare(`INSERT INTO "Reading" (coil, volts) VALUES (?, ?)`).bind(["A", 1]).run();
    cached.prepare(`INSERT INTO "Reading" (coil, volts) VALUES (?, ?)`).bind(["B", 2]).run();
    const read = (coil: string) => cached.prepare(`SELECT coil, volts FROM "Reading" WHERE coil = ?`).bind([coil]).raw().all();
    expect(read("A")).toEqual([["A", 1]]);
    expect(read("B")).toEqual([["B", 2]]);
    expect(read("C")).toEqual([]);
    expect(counter.prepared()).toBe(2);
  });

  it("gives objects, not arrays, to a caller that does not ask for raw rows after another did", () => {
    const sql = `SELECT coil FROM "Reading" WHERE coil = ?`;
    cached.prepare(`INSERT INTO "Reading" (coil) VALUES (?)`).bind(["A"]).run();
    expect(cached.prepare(sql).bind(["A"]).raw().all()).toEqual([["A"]]);
    expect(cached.prepare(sql).bind(["A"]).all()).toEqual([{ coil: "A" }]);
  });

  it("describes a kept statement's columns once, as a fresh statement describes them, whatever the call's arguments", () => {
    const sql = `SELECT id, coil AS tag, volts * 2 AS doubled FROM "Reading" WHERE coil = ?`;
    const first = cached.prepare(sql).bind(["A"]).columns();
    const again = cached.prepare(sql).bind(["B"]).columns();
    expect(again).toBe(first);
    expect(first).toEqual(plain.prepare(sql).columns());
    expect(first.map((c) => [c.name, c.type])).toEqual([
      ["id", "INTEGER"],
      ["tag", "TEXT"],
      ["doubled", null],
    ]);
  });

  it("runs statements without arguments (the adapter's BEGIN) and keeps no more statements than its bound", () => {
    const small = openDatabase();
    const smallCounter = cacheStatements(small, 2);
    small.prepare("BEGIN").run();
    small.prepare(`INSERT INTO "Reading" (coil) VALUES (?)`).bind(["A"]).run();
    small.prepare("COMMIT").run();
    expect(smallCounter.prepared()).toBe(3);
    // BEGIN was the least recently used and was dropped; COMMIT and the insert are still kept.
    small.prepare(`INSERT INTO "Reading" (coil) VALUES (?)`).bind(["B"]).run();
    expect(smallCounter.prepared()).toBe(3);
    small.prepare("BEGIN").run();
    expect(smallCounter.prepared()).toBe(4);
    small.prepare("ROLLBACK").run();
    expect(small.prepare(`SELECT count(*) AS n FROM "Reading"`).bind([]).raw().all()).toEqual([[2n]]);
  });
});
