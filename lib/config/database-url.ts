/**
 * The database URL, defaulting to the embedded SQLite file so a fresh clone works with no setup.
 * Shared by the Prisma CLI (prisma.config.ts), the app and the scripts; relative file: paths are
 * resolved against the project root so every tool opens the same file whatever its working directory.
 */
import path from "node:path";

export const DEFAULT_DATABASE_URL = "file:./data/coilyard.db";

export function databaseUrl(env: NodeJS.ProcessEnv = process.env): string {
  const raw = env.DATABASE_URL?.trim() || DEFAULT_DATABASE_URL;
  if (!raw.startsWith("file:")) return raw;
  const file = raw.slice("file:".length);
  return "file:" + (path.isAbsolute(file) ? file : path.resolve(/* turbopackIgnore: true */ process.cwd(), file));
}

export type DatabaseProvider = "sqlite" | "postgresql";

/**
 * Which database a URL names: `file:` is the embedded SQLite file, `postgresql://` (or `postgres://`) a PostgreSQL
 * server. Anything else is refused here, at start-up, rather than failing on the first query.
 */
export function databaseProvider(url: string = databaseUrl()): DatabaseProvider {
  if (url.startsWith("file:")) return "sqlite";
  if (/^postgres(ql)?:\/\//.test(url)) return "postgresql";
  throw new Error(`DATABASE_URL must be a file: URL (SQLite) or a postgresql:// URL; got "${url.replace(/\/\/[^@/]*@/, "//…@")}".`);
}

/** The filesystem path of an SQLite URL. */
export function sqliteFilePath(url: string = databaseUrl()): string {
  if (!url.startsWith("file:")) {
    throw new Error("This is for the embedded SQLite file, and DATABASE_URL names a PostgreSQL server: back that up and restore it with PostgreSQL's own tools (pg_dump / pg_restore), see the README.");
  }
  return url.slice("file:".length);
}
