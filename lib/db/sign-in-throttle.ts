/** Persistence for the sign-in throttle (policy in lib/auth/throttle-policy.ts). */
import { prisma } from "./client";
import { serializableTransaction } from "./serializable";
import type { ThrottleState } from "../auth/throttle-policy";

export async function getThrottle(key: string): Promise<ThrottleState | null> {
  const row = await prisma.signInThrottle.findUnique({ where: { key } });
  return row ? { failures: row.failures, lastFailureAt: row.lastFailureAt, lockedUntil: row.lockedUntil } : null;
}

/**
 * Applies one more failure to the key's stored state and saves it, read and write in one serializable
 * transaction: guesses fired in parallel each count, instead of all reading n failures and all writing n + 1.
 */
export async function recordThrottleFailure(key: string, next: (current: ThrottleState | null) => ThrottleState): Promise<ThrottleState> {
  return serializableTransaction(async (tx) => {
    const row = await tx.signInThrottle.findUnique({ where: { key } });
    const state = next(row ? { failures: row.failures, lastFailureAt: row.lastFailureAt, lockedUntil: row.lockedUntil } : null);
    await tx.signInThrottle.upsert({ where: { key }, create: { key, ...state }, update: state });
    return state;
  });
}

export async function clearThrottle(key: string): Promise<void> {
  await prisma.signInThrottle.deleteMany({ where: { key } });
}
