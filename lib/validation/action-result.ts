/**
 * The one result contract of every server action and JSON route:
 * `{ ok: true, data } | { ok: false, message, fieldErrors }`. Forms show fieldErrors under each
 * field (aria-describedby) and message in a live region.
 */
import type { z } from "zod";

export type FieldErrors = Record<string, string[]>;

/** `values` echoes what was submitted (never passwords) so a refused form can show it again. */
export type ActionFailure = { ok: false; message: string; fieldErrors: FieldErrors; values?: Record<string, string> };
export type ActionResult<T = unknown> = { ok: true; data: T; message?: string } | ActionFailure;

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.map(String).join(".") : "_form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function invalid(error: z.ZodError, message = "Some fields need attention.", values?: Record<string, string>): ActionFailure {
  return { ok: false, message, fieldErrors: fieldErrorsOf(error), values };
}

/** The text fields of a submitted form, minus the ones that must never be echoed back (passwords). */
export function echoForm(form: FormData, omit: readonly string[] = ["password"]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of form) if (typeof value === "string" && !omit.includes(key) && !key.startsWith("$ACTION")) out[key] = value;
  return out;
}

export function refused(message: string, fieldErrors: FieldErrors = {}, values?: Record<string, string>): ActionFailure {
  return { ok: false, message, fieldErrors, values };
}
