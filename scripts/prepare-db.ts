/**
 * Settings that belong to the SQLite file itself, applied after migrations: write-ahead logging
 * (readers never block the writer; persistent once set) and a check that foreign keys are enforced.
 */
import Database from "better-sqlite3";
import { databaseUrl, sqliteFilePath } from "../lib/config/database-url";

const url = databaseUrl();
if (!url.startsWith("file:")) {
  console.log("prepare-db: not an SQLite database, nothing to do");
} else {
  const db = new Database(sqliteFilePath(url));
  const mode = db.pragma("journal_mode = WAL", { simple: true });
  const fk = db.pragma("foreign_keys", { simple: true });
  db.close();
  if (mode !== "wal") throw new Error(`Could not switch ${url} to WAL mode (got ${String(mode)})`);
  if (fk !== 1) throw new Error("SQLite foreign keys are not enforced by this better-sqlite3 build");
  console.log(`prepare-db: ${sqliteFilePath(url)} in WAL mode, foreign keys on`);
}
