/** GET /api/export/fleet.json — every coil's logbook in one file (any member). */
import { guardRoute } from "@/lib/auth/guard";
import { exportFleet } from "@/lib/db/export";

export async function GET() {
  return guardRoute("member", async (user) => {
    const doc = await exportFleet(user.scope);
    return new Response(JSON.stringify(doc), {
      headers: { "content-type": "application/json; charset=utf-8", "content-disposition": `attachment; filename="coilyard-fleet-${doc.exportedAt.slice(0, 10)}.json"` },
    });
  });
}
