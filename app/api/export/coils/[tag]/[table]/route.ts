/** GET /api/export/coils/<tag>/<sessions|sweep-points|parts>.csv — one table of one coil (any member). */
import { guardRoute } from "@/lib/auth/guard";
import { exportCoil } from "@/lib/db/export";
import { COIL_CSV_TABLES, coilTableCsv, type CoilCsvTable } from "@/lib/export/logbook-csv";

export async function GET(_request: Request, { params }: { params: Promise<{ tag: string; table: string }> }) {
  return guardRoute("member", async (user) => {
    const { tag: rawTag, table: file } = await params;
    const table = file.replace(/\.csv$/, "") as CoilCsvTable;
    if (!file.endsWith(".csv") || !COIL_CSV_TABLES.includes(table)) {
      return Response.json({ ok: false, message: `Ask for one of ${COIL_CSV_TABLES.map((t) => `${t}.csv`).join(", ")}.`, fieldErrors: {} }, { status: 404 });
    }
    const tag = decodeURIComponent(rawTag).toUpperCase();
    const doc = await exportCoil(user.scope, tag);
    const coil = doc?.coils[0];
    if (!coil) return Response.json({ ok: false, message: `No coil tagged ${tag}.`, fieldErrors: {} }, { status: 404 });
    return new Response(coilTableCsv(coil, table), {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="coilyard-${tag}-${table}.csv"` },
    });
  });
}
