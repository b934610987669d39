/**
 * The one result contract of every server action and JSON route:
 * `{ ok: true, data } | { ok: false, message, fieldErrors }`. Forms show fieldErrors under each
 * field (aria-describedby) and message in a live region.
 */
import type { z } from "zod";

export type FieldErrors = Record<string, string[]>;

export type ActionFailure = { ok: false; message: string; fieldErrors: FieldErrors };
export type ActionResult<T = unknown> = { ok: true; data: T; message?: string } | ActionFailure;

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.map(String).join(".") : "_form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function invalid(error: z.ZodError, message = "Some fields need attention."): ActionFailure {
  return { ok: false, message, fieldErrors: fieldErrorsOf(error) };
}

export function refused(message: string, fieldErrors: FieldErrors = {}): ActionFailure {
  return { ok: false, message, fieldErrors };
}
