/**
 * POST an imported sweep as JSON: the settings plus the readings the browser parsed and mapped
 * (lib/import/sweep-csv). A route rather than a server action because a 100 000-row sweep is a few
 * megabytes of JSON, past a server action's 1 MB body limit.
 */
import { revalidatePath } from "next/cache";
import { guardRoute } from "@/lib/auth/guard";
import { recordSweep, SweepRefusedError } from "@/lib/db/sweeps";
import { recordInputFromImport, sweepImportSchema } from "@/lib/validation/sweep";
import { fieldErrorsOf } from "@/lib/validation/action-result";

export async function POST(request: Request): Promise<Response> {
  return guardRoute("member", async (user) => {
    let body: unknown;
    try {
      body = await request.json();
    } catch {
      return Response.json({ ok: false, message: "The request body is not readable JSON.", fieldErrors: {} }, { status: 400 });
    }
    const parsed = sweepImportSchema.safeParse(body);
    if (!parsed.success) {
      const fieldErrors = fieldErrorsOf(parsed.error);
      const first = Object.values(fieldErrors)[0]?.[0] ?? "Some fields need attention.";
      return Response.json({ ok: false, message: `${first} Nothing was saved.`, fieldErrors }, { status: 422 });
    }
    try {
      const sweep = await recordSweep(user.scope, recordInputFromImport(parsed.data), "import");
      revalidatePath("/sweeps");
      return Response.json({ ok: true, data: { id: sweep.id } }, { status: 201 });
    } catch (error) {
      if (error instanceof SweepRefusedError) {
        const status = error.field === "coilId" ? 404 : 422;
        return Response.json({ ok: false, message: `${error.message} Nothing was saved.`, fieldErrors: { [error.field]: [error.message] } }, { status });
      }
      throw error;
    }
  });
}
