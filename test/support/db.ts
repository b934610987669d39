/**
 * Direct database access for integration tests only: resetting between tests and checking what was
 * (or was not) stored. Application code goes through lib/db's queries and mutations.
 */
import { createPrismaClient, prisma } from "../../lib/db/client";
import { Prisma } from "../../lib/db/generated/client";
import { hashPassword } from "../../lib/auth/password";
import { emptyDatabase } from "../../lib/db/demo-loader";

export const testDb = prisma;

/** Empties every table so each test starts from nothing (the same routine the demo reset uses). */
export const resetDatabase = emptyDatabase;

// One hash reused by every test user: bcrypt at cost 12 takes ~0.25 s a hash.
let cachedHash: Promise<string> | undefined;
export const TEST_PASSWORD = "bench-test-pass-1";

export async function makeUser(email: string, role: "member" | "steward" | "admin", name = email.split("@")[0]!) {
  cachedHash ??= hashPassword(TEST_PASSWORD);
  return prisma.user.create({ data: { email, name, role, passwordHash: await cachedHash } });
}

/**
 * Every table's row count (one table a Prisma model), so a refusal can be shown to have stored nothing anywhere,
 * audit log included. Works on SQLite and PostgreSQL alike.
 */
export async function countAllRows(): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of MODEL_NAMES) {
    const [row] = await prisma.$queryRawUnsafe<{ n: bigint | number }[]>(`SELECT COUNT(*) AS n FROM "${table}"`);
    counts[table] = Number(row!.n);
  }
  return counts;
}

/** A second connection, to another database, for tests that move data between two. */
export const openDatabase = createPrismaClient;

/** Every model (table) of the schema. */
export const MODEL_NAMES: readonly string[] = Object.values(Prisma.ModelName);
