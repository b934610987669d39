/**
 * Restore the SQLite database from a backup file. Stop the app first.
 *   npm run db:restore -- path/to/backup.db
 * Checks the backup's integrity, keeps the current file as <name>.before-restore, then copies the
 * backup into place through SQLite's backup API (so the WAL files stay consistent).
 */
import Database from "better-sqlite3";
import { copyFileSync, existsSync, rmSync } from "node:fs";
import { databaseUrl, sqliteFilePath } from "../lib/config/database-url";

const backup = process.argv[2];
if (!backup || !existsSync(backup)) {
  console.error("Usage: npm run db:restore -- path/to/backup.db (the file must exist)");
  process.exit(2);
}
const source = new Database(backup, { readonly: true, fileMustExist: true });
const check = source.pragma("integrity_check", { simple: true });
if (check !== "ok") {
  console.error(`Refusing to restore: ${backup} fails its integrity check (${String(check)})`);
  process.exit(1);
}
const target = sqliteFilePath(databaseUrl());
if (existsSync(target)) {
  const current = new Database(target);
  current.pragma("wal_checkpoint(TRUNCATE)");
  current.close();
  copyFileSync(target, `${target}.before-restore`);
  for (const suffix of ["-wal", "-shm"]) rmSync(target + suffix, { force: true });
}
await source.backup(target);
source.close();
const restored = new Database(target);
restored.pragma("journal_mode = WAL");
restored.close();
console.log(`Restored ${target} from ${backup}. The previous file is kept as ${target}.before-restore.`);
