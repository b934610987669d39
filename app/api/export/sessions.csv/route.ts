/**
 * GET /api/export/sessions.csv — every session of every coil of the current site, one CSV (any member). Streamed a
 * page at a time as it is read (lib/db/session-export.ts), so the server holds one page whatever the logbook's size.
 */
import { guardRoute } from "@/lib/auth/guard";
import { openSessionExport } from "@/lib/db/session-export";
import { csvStream } from "@/lib/export/csv-stream";
import { sessionCsvPage } from "@/lib/export/logbook-csv";

export async function GET() {
  return guardRoute("member", async (user) => {
    const { pages } = await openSessionExport(user.scope);
    return new Response(csvStream(pages, sessionCsvPage), {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="coilyard-sessions-${new Date().toISOString().slice(0, 10)}.csv"` },
    });
  });
}
