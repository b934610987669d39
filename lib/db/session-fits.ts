/**
 * The warm-up fit stored with each session (RunSession's sinkFit… columns; lib/analysis/session-fit.ts computes it).
 * Sessions written before the columns existed are fitted by backfillSessionFits, which `npm run setup` runs
 * (scripts/backfill-session-fits.ts) after the migrations, for every site; it is idempotent and touches only rows not yet
 * fitted.
 */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { fitSessionSamples, type StoredSinkFit } from "../analysis/session-fit";
import type { SampleRecord } from "../analysis/records";
import { recordOfSite, type SiteScope } from "./site-scope";

/** The stored-fit columns of each listed session, from its samples (grouped by session id). */
export function fitsBySession(sessionIds: readonly string[], samples: readonly (SampleRecord & { sessionId: string })[]): Map<string, StoredSinkFit> {
  const grouped = new Map<string, SampleRecord[]>(sessionIds.map((id) => [id, []]));
  for (const s of samples) grouped.get(s.sessionId)?.push({ elapsedS: s.elapsedS, temperatureC: s.temperatureC });
  return new Map([...grouped].map(([id, rows]) => [id, fitSessionSamples(rows)]));
}

/**
 * Fits every session of the scope's site that has no stored fit yet, a batch per transaction (each with the coils'
 * summaries marked changed and one audit event of the site). Returns how many sessions were fitted.
 */
export async function backfillSessionFits(scope: SiteScope, batchSize = 200): Promise<number> {
  let done = 0;
  for (;;) {
    const batch = await prisma.runSession.findMany({ where: { sinkFitSampleCount: null, ...recordOfSite(scope) }, select: { id: true, coilId: true }, orderBy: { id: "asc" }, take: batchSize });
    if (batch.length === 0) return done;
    await prisma.$transaction(async (tx) => {
      const ids = batch.map((s) => s.id);
      const samples = await tx.heatSinkSample.findMany({ where: { sessionId: { in: ids } }, select: { sessionId: true, elapsedS: true, temperatureC: true } });
      for (const [id, fit] of fitsBySession(ids, samples)) await tx.runSession.update({ where: { id }, data: fit });
      for (const coilId of new Set(batch.map((s) => s.coilId))) await markCoilChanged(tx, coilId);
      await recordAudit(tx, {
        siteId: scope.siteId,
        actorId: scope.actorId,
        action: "update",
        entity: "RunSession",
        entityId: ids[0]!,
        summary: `Stored the heat-sink warm-up fit of ${ids.length} session${ids.length === 1 ? "" : "s"} logged before fits were kept with the session`,
        detail: { sessionIds: ids },
      });
    });
    done += batch.length;
  }
}

/**
 * The setup task: backfillSessionFits for every site on the server in turn, as the system (no acting user). A system
 * task rather than anyone's request, so it is the one place that lists every site; each site's sessions are still
 * read and written under that site's scope. Returns the sessions fitted per site id (sites with none included).
 */
export async function backfillSessionFitsEverySite(batchSize = 200): Promise<Map<string, number>> {
  const sites = await prisma.site.findMany({ select: { id: true }, orderBy: { id: "asc" } });
  const fitted = new Map<string, number>();
  for (const site of sites) fitted.set(site.id, await backfillSessionFits({ siteId: site.id, actorId: null }, batchSize));
  return fitted;
}
