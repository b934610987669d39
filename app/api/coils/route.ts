/**
 * GET /api/coils — the coil list as JSON (any member).
 * POST /api/coils — add a coil from SI JSON (stewards). 422 with field errors on bad input.
 */
import { guardRoute } from "@/lib/auth/guard";
import { createCoil, DuplicateTagError, listCoils } from "@/lib/db/coils";
import { coilSchema } from "@/lib/validation/coil";
import { fieldErrorsOf } from "@/lib/validation/action-result";

export async function GET(request: Request) {
  return guardRoute("member", async (user) => {
    const url = new URL(request.url);
    const page = Number(url.searchParams.get("page") ?? "1") || 1;
    const result = await listCoils(user.scope, { q: url.searchParams.get("q") ?? undefined }, { page, pageSize: 100 });
    return Response.json({ ok: true, data: result });
  });
}

export async function POST(request: Request) {
  return guardRoute("steward", async (user) => {
    let body: unknown;
    try {
      body = await request.json();
    } catch {
      return Response.json({ ok: false, message: "The request body is not valid JSON.", fieldErrors: {} }, { status: 400 });
    }
    const parsed = coilSchema.safeParse(body);
    if (!parsed.success) {
      return Response.json({ ok: false, message: "Some fields need attention.", fieldErrors: fieldErrorsOf(parsed.error) }, { status: 422 });
    }
    try {
      const coil = await createCoil(user.scope, parsed.data);
      return Response.json({ ok: true, data: coil }, { status: 201 });
    } catch (error) {
      if (error instanceof DuplicateTagError) {
        return Response.json({ ok: false, message: error.message, fieldErrors: { tag: [error.message] } }, { status: 409 });
      }
      throw error;
    }
  });
}
