/**
 * Reads straight through the driver adapter the client is connected through, with `$queryRaw`'s answer.
 *
 * Why: Prisma 6.19 sends every `$queryRaw` through its request pipeline (serialising the arguments to JSON, the
 * query interpreter, tracing spans, the data loader, and the result serialised and parsed back): about 250 µs a
 * call on this machine, against about 40 µs for the adapter's own `queryRaw` on the same statement (a page's dozen
 * reads spent ~3 ms there). The hot page reads (lib/db/raw-read.ts says why they are raw) go through `readRows`
 * instead. It is the same connection (SQLite) or pool (PostgreSQL) the client uses, so it sees what the client sees.
 *
 * The answer is `$queryRaw`'s, value for value: the adapter's rows are decoded here by the column types the adapter
 * reports, as Prisma's client does (Int64 as bigint, DateTime as Date, Boolean as boolean, Json parsed, Numeric as
 * Decimal, Bytes as Uint8Array). test/adapter-read.test.ts compares `readRows` with `$queryRaw` for every column
 * type the schema stores and for every raw reader of lib/db, on SQLite and PostgreSQL.
 *
 * Not for a transaction's reads: those go through the transaction's own client (or, for the session write, the
 * adapter transaction in session-write.ts).
 */
import { connectedAdapter, provider, type AdapterQuery } from "./client";
import { Prisma } from "./generated/client";

/** One statement's text and values, as Prisma.sql writes them (`?` placeholders, `$n` on PostgreSQL). */
export function adapterQuery(statement: Prisma.Sql): AdapterQuery {
  return {
    sql: provider === "postgresql" ? statement.text : statement.sql,
    args: statement.values,
    // The argument types the client gives its adapters for these values: dates become the stored text (SQLite) or
    // timestamp literal (PostgreSQL); a list is an array parameter (PostgreSQL's `= ANY(…)`).
    argTypes: statement.values.map((value) => ({ scalarType: scalarTypeOf(Array.isArray(value) ? value[0] : value), arity: Array.isArray(value) ? ("list" as const) : ("scalar" as const) })),
  };
}

function scalarTypeOf(value: unknown): string {
  if (value instanceof Date) return "datetime";
  if (typeof value === "bigint") return "bigint";
  if (value instanceof Uint8Array) return "bytes";
  return "unknown";
}

/** The driver adapters' column types (@prisma/driver-adapter-utils ColumnTypeEnum), the ones decoded below. */
const COLUMN = {
  Int32: 0,
  Int64: 1,
  Numeric: 4,
  Boolean: 5,
  Date: 8,
  Time: 9,
  DateTime: 10,
  Json: 11,
  Bytes: 13,
  /** Array types are the scalar type + 64. */
  ArrayOffset: 64,
} as const;

/** One value as `$queryRaw` gives it for the adapter's column type (Prisma 6.19's client: serialise, then deserialise). */
function decodeValue(value: unknown, columnType: number): unknown {
  if (value === null || value === undefined) return null;
  if (columnType >= COLUMN.ArrayOffset && columnType < 128 && Array.isArray(value)) return value.map((item) => decodeValue(item, columnType - COLUMN.ArrayOffset));
  switch (columnType) {
    case COLUMN.Int32:
      return Math.trunc(Number(value));
    case COLUMN.Int64:
      return BigInt(typeof value === "number" ? Math.trunc(value) : (value as string | bigint));
    case COLUMN.Numeric:
      return new Prisma.Decimal(value as string | number);
    case COLUMN.Boolean:
      return typeof value === "boolean" ? value : typeof value === "string" ? value === "true" || value === "1" : value === 1;
    case COLUMN.Date:
    case COLUMN.DateTime:
      return new Date(value as string | number);
    case COLUMN.Time:
      return new Date(`1970-01-01T${String(value)}Z`);
    case COLUMN.Json:
      return typeof value === "string" ? JSON.parse(value) : value;
    case COLUMN.Bytes:
      return value instanceof Uint8Array ? value : new Uint8Array(value as number[]);
    default:
      return value;
  }
}

/** The rows of one read, as `prisma.$queryRaw(statement)` would give them. */
export async function readRows<Row>(statement: Prisma.Sql): Promise<Row[]> {
  const adapter = await connectedAdapter();
  const { columnNames, columnTypes, rows } = await adapter.queryRaw(adapterQuery(statement));
  const out: Row[] = new Array(rows.length);
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r]!;
    const record: Record<string, unknown> = {};
    for (let c = 0; c < columnNames.length; c++) record[columnNames[c]!] = decodeValue(row[c], columnTypes[c]!);
    out[r] = record as Row;
  }
  return out;
}
