/**
 * PostgreSQL gets the same schema as the embedded SQLite file. prisma/schema.prisma is the one source; the copy in
 * prisma/postgresql/ differs only in its datasource provider and where its client is generated (a Prisma client is
 * built for one provider). `npm run db:postgres-schema` rewrites the copy; a test fails when the two drift apart.
 */
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const SQLITE_SCHEMA = fileURLToPath(new URL("../schema.prisma", import.meta.url));
export const POSTGRES_SCHEMA = fileURLToPath(new URL("./schema.prisma", import.meta.url));

const HEADER = "// GENERATED from prisma/schema.prisma by `npm run db:postgres-schema`: edit that file, not this one.\n";

function replaceOnce(text: string, pattern: RegExp, replacement: string, what: string): string {
  const matches = text.match(new RegExp(pattern.source, "gm"));
  if (matches?.length !== 1) throw new Error(`Expected exactly one ${what} in prisma/schema.prisma, found ${matches?.length ?? 0}.`);
  return text.replace(new RegExp(pattern.source, "m"), replacement);
}

export function derivePostgresSchema(sqliteSchema: string): string {
  let schema = replaceOnce(sqliteSchema, /^(\s*provider\s*=\s*)"sqlite"$/, '$1"postgresql"', 'provider = "sqlite" line');
  schema = replaceOnce(schema, /^(\s*output\s*=\s*)"\.\.\/lib\/db\/generated"$/, '$1"../../lib/db/generated-postgresql"', "client output line");
  return HEADER + schema;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  writeFileSync(POSTGRES_SCHEMA, derivePostgresSchema(readFileSync(SQLITE_SCHEMA, "utf8")));
  console.log(`Wrote ${path.relative(process.cwd(), POSTGRES_SCHEMA)}`);
}
