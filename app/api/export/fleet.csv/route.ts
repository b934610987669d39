/** GET /api/export/fleet.csv — one summary row per coil (any member), counted in the database (lib/db/fleet-summary.ts). */
import { guardRoute } from "@/lib/auth/guard";
import { readFleetSummaryRows } from "@/lib/db/fleet-summary";
import { fleetSummaryRowsCsv } from "@/lib/export/logbook-csv";

export async function GET() {
  return guardRoute("member", async (user) => {
    const rows = await readFleetSummaryRows(user.scope);
    return new Response(fleetSummaryRowsCsv(rows), {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="coilyard-fleet-summary-${new Date().toISOString().slice(0, 10)}.csv"` },
    });
  });
}
