/**
 * Role checks for server actions and JSON route handlers, so each one states its role in one line
 * and every refusal has the same shape: an ActionResult for actions, 401/403 JSON for routes.
 */
import { headers } from "next/headers";
import { AuthError, requireRole, type CurrentUser } from "./session";
import { checkSameOrigin } from "./same-origin";
import type { Role } from "./roles";
import { refused, type ActionResult } from "../validation/action-result";

export async function guardAction<T>(role: Role, run: (user: CurrentUser) => Promise<ActionResult<T>>): Promise<ActionResult<T>> {
  let user: CurrentUser;
  try {
    user = await requireRole(role);
  } catch (error) {
    if (error instanceof AuthError) return refused(error.message);
    throw error;
  }
  return run(user);
}

export async function guardRoute(role: Role, run: (user: CurrentUser) => Promise<Response>): Promise<Response> {
  // Cross-site requests are refused before the session is even read (rules in same-origin.ts).
  const sameOrigin = checkSameOrigin(await headers());
  if (!sameOrigin.ok) return Response.json({ ok: false, message: sameOrigin.message, fieldErrors: {} }, { status: 403 });
  let user: CurrentUser;
  try {
    user = await requireRole(role);
  } catch (error) {
    if (error instanceof AuthError) return Response.json({ ok: false, message: error.message, fieldErrors: {} }, { status: error.status });
    throw error;
  }
  return run(user);
}
