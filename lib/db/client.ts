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

/**
 * The driver adapter the client is connected through: one SQLite connection or one PostgreSQL pool. The session write
 * (session-write.ts) runs its statements on it directly, skipping the client's per-call query compilation; it is the
 * same connection (and, on SQLite, the same transaction lock) the client's own transactions use.
 */
export interface ConnectedAdapter {
  startTransaction(isolationLevel?: string): Promise<AdapterTransaction>;
  /** A read outside any transaction (adapter-read.ts). */
  queryRaw(query: AdapterQuery): Promise<AdapterResultSet>;
}
/** A read's answer: column names, the driver's column types (@prisma/driver-adapter-utils ColumnTypeEnum) and the rows. */
export interface AdapterResultSet {
  columnNames: string[];
  columnTypes: number[];
  rows: unknown[][];
}
export interface AdapterQuery {
  sql: string;
  args: unknown[];
  argTypes: { scalarType: string; arity: "scalar" | "list" }[];
}
export interface AdapterTransaction {
  readonly options: { usePhantomQuery: boolean };
  queryRaw(query: AdapterQuery): Promise<AdapterResultSet>;
  executeRaw(query: AdapterQuery): Promise<number>;
  commit(): Promise<void>;
  rollback(): Promise<void>;
}

const globalForPrisma = globalThis as unknown as { coilyardPrisma?: PrismaClient; coilyardAdapters?: WeakMap<PrismaClient, ConnectedAdapter> };
// Kept on globalThis beside the cached client (a dev reload keeps the client, so it must keep its adapter too), per
// client: tests load lib/db several times over, each copy with a client of its own.
const adapters = (globalForPrisma.coilyardAdapters ??= new WeakMap());

type AdapterFactory = { connect(): Promise<unknown> };

/** Keeps the adapter the client connects through (and forgets it when the client disconnects), for connectedAdapter. */
function rememberConnection<F>(factory: F, remember: (adapter: ConnectedAdapter | null) => void): F {
  const target = factory as unknown as AdapterFactory;
  const connect = target.connect.bind(target);
  target.connect = async () => {
    const adapter = (await connect()) as ConnectedAdapter & { dispose(): Promise<void> };
    const dispose = adapter.dispose.bind(adapter);
    adapter.dispose = async () => {
      remember(null);
      await dispose();
    };
    remember(adapter);
    return adapter;
  };
  return factory;
}

export function createPrismaClient(url: string = databaseUrl(), onConnect: (adapter: ConnectedAdapter | null) => void = () => undefined): PrismaClient {
  if (databaseProvider(url) === "postgresql") {
    // Both clients are generated from the same schema (prisma/postgresql/derive-schema.ts), so they answer the same
    // queries with the same shapes; lib/db is typed against the SQLite one and stays provider-neutral.
    const adapter = rememberConnection(createPostgresAdapter(url, postgresPoolSize()), onConnect);
    return new PostgresPrismaClient({ adapter }) as unknown as PrismaClient;
  }
  // timeout: how long a writer waits for SQLite's lock before giving up (ms).
  const adapter = rememberConnection(new PrismaBetterSQLite3({ url, timeout: 10_000 }), onConnect);
  return new PrismaClient({ adapter });
}

/** Connections each app instance keeps open to PostgreSQL; instances × pool must stay under the server's max_connections. */
function postgresPoolSize(): number {
  const configured = Number(process.env.COILYARD_PG_POOL_SIZE);
  return Number.isInteger(configured) && configured > 0 ? configured : 10;
}

/** The database in use, for the few statements that must be written per dialect (see sweeps.ts, coil-history.ts). */
export const provider: DatabaseProvider = databaseProvider();

export const prisma: PrismaClient =
  globalForPrisma.coilyardPrisma ??
  createPrismaClient(databaseUrl(), (adapter) => {
    if (adapter) adapters.set(prisma, adapter);
    else adapters.delete(prisma);
  });
if (process.env.NODE_ENV !== "production") globalForPrisma.coilyardPrisma = prisma;

/** The adapter `prisma` is connected through, connecting it first when it is not yet (or no longer). */
export async function connectedAdapter(): Promise<ConnectedAdapter> {
  if (!adapters.has(prisma)) await prisma.$connect();
  const adapter = adapters.get(prisma);
  if (!adapter) throw new Error("The database client connected without its driver adapter.");
  return adapter;
}
