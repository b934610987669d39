/**
 * GET /api/bench-floor: the benchmark's floor for one request (bench/session-load.ts): Next's routing and a small JSON
 * answer, with no sign-in check, no database and no rendering, measured under the same load as the routes and pages
 * it is compared with. It answers 404 unless the server process was started with COILYARD_BENCH_FLOOR=1, which only
 * the benchmark does, so a deployment exposes nothing here; it reads no data and writes none either way.
 * `?authCounts` answers the process's sign-in checks and token decodes so far (lib/auth/auth-counters.ts, counted only
 * under the same flag), which the benchmark reads around a block of page requests.
 */
import { readAuthCounts } from "@/lib/auth/auth-counters";

export const dynamic = "force-dynamic";

export function GET(request: Request): Response {
  if (process.env.COILYARD_BENCH_FLOOR !== "1") return Response.json({ ok: false, message: "Not found." }, { status: 404 });
  if (new URL(request.url).searchParams.has("authCounts")) return Response.json({ ok: true, data: readAuthCounts() });
  return Response.json({ ok: true });
}
