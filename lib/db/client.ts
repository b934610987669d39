/**
 * The one Prisma client. Only lib/db/* imports it (a lint rule enforces this).
 * DATABASE_URL chooses the database: a `file:` URL opens the embedded SQLite file through the better-sqlite3
 * driver adapter, a `postgresql://` URL a PostgreSQL server through the pg driver adapter. Both run Prisma's JS
 * engine, so no native Prisma engine is needed. Cached on globalThis so Next's dev reloads don't open a new
 * file handle or pool each time.
 */
import { PrismaBetterSQLite3 } from "@prisma/adapter-better-sqlite3";
import { createPostgresAdapter } from "./pg-adapter";
import { PrismaClient } from "./generated/client";
import { PrismaClient as PostgresPrismaClient } from "./generated-postgresql/client";
import { databaseProvider, databaseUrl, type DatabaseProvider } from "../config/database-url";

export type Db = PrismaClient;
/** The client inside an interactive transaction. */
export type Tx = Parameters<Parameters<PrismaClient["$transaction"]>[0]>[0];

const globalForPrisma = globalThis as unknown as { coilyardPrisma?: PrismaClient };

export function createPrismaClient(url: string = databaseUrl()): PrismaClient {
  if (databaseProvider(url) === "postgresql") {
    // Both clients are generated from the same schema (prisma/postgresql/derive-schema.ts), so they answer the same
    // queries with the same shapes; lib/db is typed against the SQLite one and stays provider-neutral.
    const adapter = createPostgresAdapter(url, postgresPoolSize());
    return new PostgresPrismaClient({ adapter }) as unknown as PrismaClient;
  }
  // timeout: how long a writer waits for SQLite's lock before giving up (ms).
  const adapter = new PrismaBetterSQLite3({ url, timeout: 10_000 });
  return new PrismaClient({ adapter });
}

/** Connections each app instance keeps open to PostgreSQL; instances × pool must stay under the server's max_connections. */
function postgresPoolSize(): number {
  const configured = Number(process.env.COILYARD_PG_POOL_SIZE);
  return Number.isInteger(configured) && configured > 0 ? configured : 10;
}

/** The database in use, for the few statements that must be written per dialect (see sweeps.ts, coil-history.ts). */
export const provider: DatabaseProvider = databaseProvider();

export const prisma: PrismaClient = globalForPrisma.coilyardPrisma ?? createPrismaClient();
if (process.env.NODE_ENV !== "production") globalForPrisma.coilyardPrisma = prisma;
