/**
 * Direct database access for integration tests only: resetting between tests and checking what was
 * (or was not) stored. Application code goes through lib/db's queries and mutations.
 */
import { prisma } from "../../lib/db/client";
import { hashPassword } from "../../lib/auth/password";

export const testDb = prisma;

/** Empties every table, children first, so each test starts from nothing. */
export async function resetDatabase(): Promise<void> {
  await prisma.$transaction([
    prisma.auditEvent.deleteMany(),
    prisma.runSession.updateMany({ data: { loanId: null } }),
    prisma.loan.deleteMany(),
    prisma.clearance.deleteMany(),
    prisma.clearancePolicy.deleteMany(),
    prisma.failure.deleteMany(),
    prisma.heatSinkSample.deleteMany(),
    prisma.runSession.deleteMany(),
    prisma.sweepResonance.deleteMany(),
    prisma.sweepPoint.deleteMany(),
    prisma.sweep.deleteMany(),
    prisma.component.updateMany({ data: { replacedById: null } }),
    prisma.component.deleteMany(),
    prisma.topLoad.deleteMany(),
    prisma.coil.deleteMany(),
    prisma.signInThrottle.deleteMany(),
    prisma.user.deleteMany(),
  ]);
}

// One hash reused by every test user: bcrypt at cost 12 takes ~0.25 s a hash.
let cachedHash: Promise<string> | undefined;
export const TEST_PASSWORD = "bench-test-pass-1";

export async function makeUser(email: string, role: "member" | "steward" | "admin", name = email.split("@")[0]!) {
  cachedHash ??= hashPassword(TEST_PASSWORD);
  return prisma.user.create({ data: { email, name, role, passwordHash: await cachedHash } });
}
