/**
 * POST /api/import/json[?asTag=NEW-TAG] — re-import a logbook file (stewards). The body is the file
 * itself. 400 unreadable JSON, 422 with the JSON path of every bad field, 409 when a tag is taken
 * (give asTag to import a one-coil file as a copy), 201 with what was imported.
 */
import { guardRoute } from "@/lib/auth/guard";
import { importLogbook, ImportConflictError } from "@/lib/db/import";
import { describeLogbookIssues, importOptionsSchema, logbookDocumentSchema } from "@/lib/validation/export";
import { fieldErrorsOf } from "@/lib/validation/action-result";

export async function POST(request: Request) {
  return guardRoute("steward", async (user) => {
    const options = importOptionsSchema.safeParse({ asTag: new URL(request.url).searchParams.get("asTag") });
    if (!options.success) return Response.json({ ok: false, message: "The new tag is not valid.", fieldErrors: fieldErrorsOf(options.error) }, { status: 422 });
    let body: unknown;
    try {
      body = await request.json();
    } catch {
      return Response.json({ ok: false, message: "The request body is not valid JSON.", fieldErrors: {} }, { status: 400 });
    }
    const parsed = logbookDocumentSchema.safeParse(body);
    if (!parsed.success) {
      return Response.json(
        { ok: false, message: `The file was not imported: ${describeLogbookIssues(parsed.error, 5).join("; ")}`, fieldErrors: fieldErrorsOf(parsed.error) },
        { status: 422 },
      );
    }
    try {
      const summary = await importLogbook(user.scope, parsed.data, { asTag: options.data.asTag });
      return Response.json({ ok: true, data: summary }, { status: 201 });
    } catch (error) {
      if (error instanceof ImportConflictError) return Response.json({ ok: false, message: error.message, fieldErrors: { asTag: [error.message] } }, { status: 409 });
      throw error;
    }
  });
}
