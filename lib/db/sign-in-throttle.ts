/** Persistence for the sign-in throttle (policy in lib/auth/throttle-policy.ts). */
import { prisma } from "./client";
import type { ThrottleState } from "../auth/throttle-policy";

export async function getThrottle(key: string): Promise<ThrottleState | null> {
  const row = await prisma.signInThrottle.findUnique({ where: { key } });
  return row ? { failures: row.failures, lastFailureAt: row.lastFailureAt, lockedUntil: row.lockedUntil } : null;
}

export async function saveThrottle(key: string, state: ThrottleState): Promise<void> {
  await prisma.signInThrottle.upsert({
    where: { key },
    create: { key, ...state },
    update: state,
  });
}

export async function clearThrottle(key: string): Promise<void> {
  await prisma.signInThrottle.deleteMany({ where: { key } });
}
