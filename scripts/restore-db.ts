/**
 * Restore the SQLite database from a backup file. Stop the app first.
 *   npm run db:restore -- path/to/backup.db
 * Checks the backup's integrity, refuses while anything else has the database open (a running app would keep
 * writing into, and reading from, a file whose log this script replaces), keeps the current file as
 * <name>.before-restore, then copies the backup into place through SQLite's backup API.
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
if (existsSync(target) && inUseByAnotherProcess(target)) {
  source.close();
  console.error(`Refusing to restore: ${target} is open in another process (is Coilyard running?). Stop the app, then restore again.`);
  process.exit(3);
}
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

/**
 * True when another connection has the file open. A connection to a WAL database keeps a shared lock from its first
 * read until it closes (the running app's does), so an exclusive lock taken without waiting fails exactly then.
 */
function inUseByAnotherProcess(file: string): boolean {
  const probe = new Database(file, { timeout: 0 });
  try {
    probe.pragma("locking_mode = EXCLUSIVE");
    probe.exec("BEGIN EXCLUSIVE");
    probe.exec("ROLLBACK");
    return false;
  } catch (error) {
    if ((error as { code?: string }).code?.startsWith("SQLITE_BUSY")) return true;
    throw error;
  } finally {
    probe.close();
  }
}
