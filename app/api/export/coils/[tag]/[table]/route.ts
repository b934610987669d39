/**
 * GET /api/export/coils/<tag>/<sessions|sweep-points|parts>.csv — one table of one coil (any member). The sessions
 * table streams page by page (lib/db/session-export.ts) instead of building the coil's whole logbook file first.
 */
import { guardRoute } from "@/lib/auth/guard";
import { exportCoil } from "@/lib/db/export";
import { openSessionExport } from "@/lib/db/session-export";
import { csvStream } from "@/lib/export/csv-stream";
import { COIL_CSV_TABLES, coilTableCsv, sessionCsvPage, type CoilCsvTable } from "@/lib/export/logbook-csv";

export async function GET(_request: Request, { params }: { params: Promise<{ tag: string; table: string }> }) {
  return guardRoute("member", async (user) => {
    const { tag: rawTag, table: file } = await params;
    const table = file.replace(/\.csv$/, "") as CoilCsvTable;
    if (!file.endsWith(".csv") || !COIL_CSV_TABLES.includes(table)) {
      return Response.json({ ok: false, message: `Ask for one of ${COIL_CSV_TABLES.map((t) => `${t}.csv`).join(", ")}.`, fieldErrors: {} }, { status: 404 });
    }
    const tag = decodeURIComponent(rawTag).toUpperCase();
    const headers = { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="coilyard-${tag}-${table}.csv"` };
    if (table === "sessions") {
      const { coilCount, pages } = await openSessionExport(user.scope, { tag });
      if (coilCount === 0) return Response.json({ ok: false, message: `No coil tagged ${tag}.`, fieldErrors: {} }, { status: 404 });
      return new Response(csvStream(pages, sessionCsvPage), { headers });
    }
    const doc = await exportCoil(user.scope, tag);
    const coil = doc?.coils[0];
    if (!coil) return Response.json({ ok: false, message: `No coil tagged ${tag}.`, fieldErrors: {} }, { status: 404 });
    return new Response(coilTableCsv(coil, table), { headers });
  });
}
