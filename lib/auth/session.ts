/**
 * Who is asking, checked where the work happens. Server components, server actions and route
 * handlers call these; the proxy only redirects anonymous visitors and protects nothing by itself.
 */
import { getServerSession } from "next-auth";
import { authOptions } from "./options";
import { getUserById } from "../db/users";
import { hasRole, isRole, type Role } from "./roles";

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  role: Role;
}

export class AuthError extends Error {
  constructor(
    readonly status: 401 | 403,
    message: string,
  ) {
    super(message);
  }
}

/** The signed-in, active user, or null. Reads the database so role changes apply immediately. */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const session = await getServerSession(authOptions());
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  const user = await getUserById(id);
  if (!user || !user.active || !isRole(user.role)) return null;
  return { id: user.id, email: user.email, name: user.name, role: user.role };
}

/** The current user with at least `role`; throws AuthError (401 anonymous, 403 not allowed). */
export async function requireRole(role: Role): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw new AuthError(401, "Sign in to continue.");
  if (!hasRole(user.role, role)) throw new AuthError(403, `This needs the ${role} role; you are signed in as a ${user.role}.`);
  return user;
}

export function requireUser(): Promise<CurrentUser> {
  return requireRole("member");
}
