/** Users: reads and writes. Password hashing happens in lib/auth before anything reaches here. */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import type { Role } from "../auth/roles";

export const publicUserSelect = {
  id: true,
  email: true,
  name: true,
  role: true,
  active: true,
  lastSignInAt: true,
  createdAt: true,
} as const;

export function findUserForSignIn(email: string) {
  return prisma.user.findUnique({
    where: { email: email.trim().toLowerCase() },
    select: { id: true, email: true, name: true, role: true, active: true, passwordHash: true },
  });
}

export function getUserById(id: string) {
  return prisma.user.findUnique({ where: { id }, select: publicUserSelect });
}

export function listUsers() {
  return prisma.user.findMany({ select: publicUserSelect, orderBy: [{ active: "desc" }, { name: "asc" }] });
}

export function countUsers() {
  return prisma.user.count();
}

export async function markSignedIn(userId: string): Promise<void> {
  await prisma.$transaction(async (tx) => {
    await tx.user.update({ where: { id: userId }, data: { lastSignInAt: new Date() } });
    await recordAudit(tx, { actorId: userId, action: "sign-in", entity: "User", entityId: userId, summary: "Signed in" });
  });
}

export class DuplicateEmailError extends Error {
  constructor(readonly email: string) {
    super(`An account with the e-mail ${email} already exists`);
  }
}

export async function createUser(
  actorId: string | null,
  input: { email: string; name: string; role: Role; passwordHash: string },
) {
  const email = input.email.trim().toLowerCase();
  return prisma.$transaction(async (tx) => {
    if (await tx.user.findUnique({ where: { email }, select: { id: true } })) throw new DuplicateEmailError(email);
    const user = await tx.user.create({
      data: { email, name: input.name.trim(), role: input.role, passwordHash: input.passwordHash },
      select: publicUserSelect,
    });
    await recordAudit(tx, {
      actorId,
      action: "create",
      entity: "User",
      entityId: user.id,
      summary: `Added ${user.name} <${user.email}> as ${user.role}`,
    });
    return user;
  });
}

export class LastAdminError extends Error {
  constructor() {
    super("Coilyard must keep at least one active admin");
  }
}

/**
 * Change a user's role and/or active flag; refuses to leave the installation without an active admin.
 * Serializable: two admins demoting each other at once would each still count the other (write skew).
 */
export async function updateUserAccess(actorId: string, userId: string, change: { role?: Role; active?: boolean }) {
  return serializableTransaction(async (tx) => {
    const before = await tx.user.findUniqueOrThrow({ where: { id: userId }, select: publicUserSelect });
    const after = await tx.user.update({ where: { id: userId }, data: change, select: publicUserSelect });
    const activeAdmins = await tx.user.count({ where: { role: "admin", active: true } });
    if (activeAdmins === 0) throw new LastAdminError();
    const changes: string[] = [];
    if (before.role !== after.role) changes.push(`role ${before.role} → ${after.role}`);
    if (before.active !== after.active) changes.push(after.active ? "reactivated" : "deactivated");
    if (changes.length > 0) {
      await recordAudit(tx, {
        actorId,
        action: "update",
        entity: "User",
        entityId: userId,
        summary: `${after.name}: ${changes.join(", ")}`,
        detail: { before: { role: before.role, active: before.active }, after: { role: after.role, active: after.active } },
      });
    }
    return after;
  });
}
