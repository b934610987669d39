/**
 * The lib/db calls the newer benchmark sections make, in one place, so that when issue 12 (sites) gives every lib/db
 * function a `scope: SiteScope` first parameter only this file changes. Each call marked "ISSUE 12 SLOT" shows the
 * call it becomes. Imported only after DATABASE_URL names the section's database (lib/db opens its client on import).
 *
 * Older sections call lib/db directly and carry the same mark at each call: bench/coil-page-work.ts (readCoilPage,
 * readCoilComparison), bench/large-fleet-pages.ts (getFleetOverview, listSessions), bench/sweep-import-memory.ts
 * (recordSweep).
 */
import { createSession } from "../lib/db/sessions";
import { DEFAULT_SITE_ID, type SiteScope } from "../lib/db/site-scope";
import type { SessionInput } from "../lib/validation/session";

/** The scope the benchmarks act in: the single-club install's site. */
export const benchScope = (actorId: string): SiteScope => ({ siteId: DEFAULT_SITE_ID, actorId });

/** lib/db/sessions.ts createSession, as the log form's action and POST /api/sessions call it. */
export function logSessionThroughApp(actorId: string, input: SessionInput) {
  // ISSUE 12 SLOT: becomes createSession(benchScope(actorId), input).
  return createSession(actorId, input);
}
