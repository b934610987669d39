/**
 * Online backup of the SQLite database while the app keeps running (SQLite's backup API, which
 * copies a consistent snapshot page by page), then an integrity check of the copy.
 *   npm run db:backup [-- path/to/backup.db]
 */
import Database from "better-sqlite3";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { databaseUrl, sqliteFilePath } from "../lib/config/database-url";

const source = sqliteFilePath(databaseUrl());
const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\..*/, "").replace("T", "-");
const target = path.resolve(process.argv[2] ?? path.join(path.dirname(source), "backups", `coilyard-${stamp}.db`));
mkdirSync(path.dirname(target), { recursive: true });

const db = new Database(source, { readonly: true, fileMustExist: true });
// All pages in one step, so in one read transaction: a consistent snapshot that writers in WAL mode never wait
// for. better-sqlite3's default copies 100 pages per step, and SQLite restarts a backup whose source another
// connection wrote to between steps, so under a steady stream of writes it could start over indefinitely.
await db.backup(target, { progress: () => 0x7fffffff });
db.close();

const copy = new Database(target, { readonly: true });
const check = copy.pragma("integrity_check", { simple: true });
copy.close();
if (check !== "ok") {
  console.error(`Backup written to ${target} but its integrity check says: ${String(check)}`);
  process.exit(1);
}
console.log(`Backup of ${source} written to ${target} (integrity check ok)`);
