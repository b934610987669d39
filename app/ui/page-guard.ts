/**
 * Role checks for pages: anonymous → sign-in page, wrong role → the 403 page (app/forbidden.tsx).
 * Server actions and route handlers use lib/auth/session.ts directly and answer with a result or a status.
 */
import { forbidden, redirect } from "next/navigation";
import { AuthError, requireRole, type CurrentUser } from "@/lib/auth/session";
import type { Role } from "@/lib/auth/roles";

export async function pageUser(role: Role = "member"): Promise<CurrentUser> {
  try {
    return await requireRole(role);
  } catch (error) {
    if (error instanceof AuthError) {
      if (error.status === 401) redirect("/sign-in");
      forbidden();
    }
    throw error;
  }
}
