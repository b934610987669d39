/**
 * Decoding for the hot page reads that go through `$queryRaw` instead of Prisma's query API.
 *
 * Why raw there: Prisma 6.19's client engine compiles every query-API call into a plan on the main thread, each
 * time (plan caching arrived only in Prisma 7.4, prisma/orm#29038). Measured on the large-fleet fixture, reading a
 * coil's 60 latest sessions costs ~4.9 ms through `findMany` and ~1.0 ms as the same SQL through `$queryRaw`
 * (better-sqlite3 alone: 0.45 ms); a page of 15 such reads spent most of its time compiling. The statements stay
 * portable (quoted identifiers, no provider-only functions) and run on SQLite and PostgreSQL alike; the
 * integration test test/raw-reads.test.ts checks each raw reader against the query API's answer on both.
 *
 * What comes back through the driver adapters: a column read as itself arrives typed (DateTime as Date, Boolean
 * as boolean), but a computed value does not — `max("startedAt")` is the stored text on SQLite, and `count(*)` is a
 * bigint on both. These helpers turn such values into what the query API would have given.
 */

/** A DateTime from a raw row: a Date already, the stored ISO text (SQLite expressions) or epoch milliseconds. */
export function rawDate(value: unknown): Date {
  if (value instanceof Date) return value;
  if (typeof value === "string" || typeof value === "number") {
    const date = new Date(value);
    if (!Number.isNaN(date.getTime())) return date;
  }
  throw new TypeError(`Expected a date from the database, got ${JSON.stringify(value)}`);
}

export function rawDateOrNull(value: unknown): Date | null {
  return value === null || value === undefined ? null : rawDate(value);
}

/** A count or integer aggregate: bigint from both adapters, a number or null (no rows) otherwise. */
export function rawCount(value: unknown): number {
  if (typeof value === "bigint") return Number(value);
  if (typeof value === "number") return value;
  if (value === null || value === undefined) return 0;
  throw new TypeError(`Expected a count from the database, got ${JSON.stringify(value)}`);
}
