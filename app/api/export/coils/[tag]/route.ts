/** GET /api/export/coils/<tag>.json — one coil's logbook file (any member). */
import { guardRoute } from "@/lib/auth/guard";
import { exportCoil } from "@/lib/db/export";

export async function GET(_request: Request, { params }: { params: Promise<{ tag: string }> }) {
  return guardRoute("member", async (user) => {
    const file = decodeURIComponent((await params).tag);
    if (!file.endsWith(".json")) return Response.json({ ok: false, message: "Ask for <tag>.json, or <tag>/sessions.csv, sweep-points.csv or parts.csv.", fieldErrors: {} }, { status: 404 });
    const tag = file.slice(0, -".json".length).toUpperCase();
    const doc = await exportCoil(user.scope, tag);
    if (!doc) return Response.json({ ok: false, message: `No coil tagged ${tag}.`, fieldErrors: {} }, { status: 404 });
    return new Response(JSON.stringify(doc, null, 2), {
      headers: { "content-type": "application/json; charset=utf-8", "content-disposition": `attachment; filename="coilyard-${tag}.json"` },
    });
  });
}
