/**
 * Prisma's P2002: an insert or update hit a unique index. Where two requests race to take the same next number or
 * name, PostgreSQL (read committed) lets both read "free" and the index refuses the second write; SQLite serializes
 * writers, so there the race cannot happen. Callers that can settle the race (read again, or retry with the next
 * number) catch this instead of answering a 500.
 */
export function isUniqueViolation(error: unknown): boolean {
  return typeof error === "object" && error !== null && (error as { code?: unknown }).code === "P2002";
}
