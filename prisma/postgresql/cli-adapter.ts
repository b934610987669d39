/**
 * The pg driver adapter for the Prisma CLI (migrate deploy/diff/status, db push) on PostgreSQL.
 *
 * Prisma 6.19's schema engine reads PostgreSQL's catalogs, whose names come back as the `name` type (oid 19), and
 * @prisma/adapter-pg 6.19 has no mapping for it, so every migrate command fails with "Column type 'name' could not
 * be deserialized" (prisma/orm issue #27403, open as of this writing). `name` is text to every client, so the
 * pool this adapter uses reports it as `text` (oid 25) before the adapter looks. The app's own client does not need
 * this (lib/db/client.ts): it never selects catalog columns. Remove when the adapter maps `name` itself.
 */
import pg from "pg";
import { PrismaPg } from "@prisma/adapter-pg";

const NAME_OID = 19;
const TEXT_OID = 25;

type QueryResultLike = { fields?: { dataTypeID: number }[] } | undefined;

function reportNameAsText(result: QueryResultLike): void {
  for (const field of result?.fields ?? []) if (field.dataTypeID === NAME_OID) field.dataTypeID = TEXT_OID;
}

function patchClient(client: pg.PoolClient): void {
  const query = client.query.bind(client) as (...args: unknown[]) => unknown;
  // pg's query has a promise form (the adapter's) and a callback form (Pool.query's); patch both.
  (client as unknown as { query: (...args: unknown[]) => unknown }).query = (...args: unknown[]) => {
    const last = args.at(-1);
    if (typeof last === "function") {
      return query(...args.slice(0, -1), (error: unknown, result: QueryResultLike) => {
        reportNameAsText(result);
        (last as (e: unknown, r: unknown) => void)(error, result);
      });
    }
    const pending = query(...args);
    if (pending instanceof Promise) return pending.then((result: QueryResultLike) => (reportNameAsText(result), result));
    return pending;
  };
}

export function createCliPostgresAdapter(connectionString: string): PrismaPg {
  const pool = new pg.Pool({ connectionString });
  pool.on("connect", patchClient);
  return new PrismaPg(pool, { disposeExternalPool: true });
}
