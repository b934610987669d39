/**
 * POST one run session as JSON, for logging scripts and the load benchmark (bench/session-load.ts). The body is
 * the log form's fields by name ({ coilId, startedAt: "2026-12-02T14:05", supplyVoltageV: "24 V", …, samples:
 * "0, 21\n60, 27" }); numbers may be sent as JSON numbers. Same schema, role and mutation as the form's action.
 * An optional clientKey (a UUID) makes the submit idempotent: 201 stores it, a resend with the same key answers
 * 200 with the stored session and `replayed: true` (the offline queue, app/(app)/sessions/new/offline-queue.ts).
 */
import { revalidatePath } from "next/cache";
import { guardRoute } from "@/lib/auth/guard";
import { createSession } from "@/lib/db/sessions";
import { RecordRefusedError } from "@/lib/db/record-refused";
import { sessionSchema } from "@/lib/validation/session";
import { fieldErrorsOf } from "@/lib/validation/action-result";

/** The form sends text; a script may send numbers, which read the same as typed digits. */
function asFormValues(body: unknown): Record<string, unknown> | null {
  if (typeof body !== "object" || body === null || Array.isArray(body)) return null;
  return Object.fromEntries(Object.entries(body).map(([key, value]) => [key, typeof value === "number" ? String(value) : value]));
}

export async function POST(request: Request): Promise<Response> {
  return guardRoute("member", async (user) => {
    let body: unknown;
    try {
      body = await request.json();
    } catch {
      return Response.json({ ok: false, message: "The request body is not readable JSON.", fieldErrors: {} }, { status: 400 });
    }
    const values = asFormValues(body);
    if (!values) return Response.json({ ok: false, message: "The request body must be a JSON object of the session's fields.", fieldErrors: {} }, { status: 400 });
    const parsed = sessionSchema.safeParse(values);
    if (!parsed.success) {
      const fieldErrors = fieldErrorsOf(parsed.error);
      const first = Object.values(fieldErrors)[0]?.[0] ?? "Some fields need attention.";
      return Response.json({ ok: false, message: `${first} Nothing was saved.`, fieldErrors }, { status: 422 });
    }
    try {
      const session = await createSession(user.scope, parsed.data);
      revalidatePath("/sessions");
      revalidatePath(`/coils/${session.coilTag}`);
      // A replay of a stored submission (same clientKey) answers 200 with the stored session, not a second one.
      return Response.json({ ok: true, data: { id: session.id, coilTag: session.coilTag, replayed: session.replayed } }, { status: session.replayed ? 200 : 201 });
    } catch (error) {
      if (error instanceof RecordRefusedError) {
        const status = error.field === "coilId" ? 404 : 422;
        return Response.json({ ok: false, message: `${error.message} Nothing was saved.`, fieldErrors: { [error.field]: [error.message] } }, { status });
      }
      throw error;
    }
  });
}
