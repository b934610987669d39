/**
 * The one Prisma client. Only lib/db/* imports it (a lint rule enforces this).
 * Built on the better-sqlite3 driver adapter with Prisma's JS engine, so no native Prisma
 * engine is needed. Cached on globalThis so Next's dev reloads don't open a new file handle each time.
 */
import { PrismaBetterSQLite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaClient } from "./generated/client";
import { databaseUrl } from "../config/database-url";

export type Db = PrismaClient;
/** The client inside an interactive transaction. */
export type Tx = Parameters<Parameters<PrismaClient["$transaction"]>[0]>[0];

const globalForPrisma = globalThis as unknown as { coilyardPrisma?: PrismaClient };

export function createPrismaClient(url: string = databaseUrl()): PrismaClient {
  // timeout: how long a writer waits for SQLite's lock before giving up (ms).
  const adapter = new PrismaBetterSQLite3({ url, timeout: 10_000 });
  return new PrismaClient({ adapter });
}

export const prisma: PrismaClient = globalForPrisma.coilyardPrisma ?? createPrismaClient();
if (process.env.NODE_ENV !== "production") globalForPrisma.coilyardPrisma = prisma;
