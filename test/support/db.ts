/**
 * Direct database access for integration tests only: resetting between tests and checking what was
 * (or was not) stored. Application code goes through lib/db's queries and mutations.
 */
import { prisma } from "../../lib/db/client";
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
