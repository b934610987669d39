/**
 * The list pages' search box: a case-insensitive substring match on both databases. SQLite's LIKE (behind Prisma's
 * `contains`) already ignores ASCII case; PostgreSQL's does not, so there it asks for Prisma's insensitive mode
 * (ILIKE). Prisma's SQLite types have no `mode`, hence the cast.
 */
import { provider } from "./client";
import type { Prisma } from "./generated/client";

export function textContains(query: string): Prisma.StringFilter {
  return (provider === "postgresql" ? { contains: query, mode: "insensitive" } : { contains: query }) as Prisma.StringFilter;
}
