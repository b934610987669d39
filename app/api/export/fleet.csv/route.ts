/** GET /api/export/fleet.csv — one summary row per coil (any member). */
import { guardRoute } from "@/lib/auth/guard";
import { exportFleet } from "@/lib/db/export";
import { fleetSummaryCsv } from "@/lib/export/logbook-csv";

export async function GET() {
  return guardRoute("member", async (user) => {
    const doc = await exportFleet(user.scope);
    return new Response(fleetSummaryCsv(doc), {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="coilyard-fleet-summary-${doc.exportedAt.slice(0, 10)}.csv"` },
    });
  });
}
