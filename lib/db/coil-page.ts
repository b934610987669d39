/**
 * Everything app/(app)/coils/[tag]/page.tsx reads, composed so nothing is read twice: the coil with its parts and
 * top loads once (the history and the timeline are handed them), the health window once (the timeline's newest
 * sessions are its tail, its sweeps the history's), and the current policy the page judges health by.
 * Thirteen small raw statements for a coil however long its logbook (bench: `npm run bench -- --large`).
 * Null for no such tag at the scope's site.
 */
import { getCoilByTag } from "./coils";
import { getCoilPageHistory } from "./coil-history";
import { getCoilTimeline } from "./coil-timeline";
import { getCurrentPolicy } from "./policy";
import { HEALTH_WINDOW } from "../analysis/health-window";
import type { SiteScope } from "./site-scope";
import type { TimelineFilter } from "../validation/timeline";

export async function readCoilPage(scope: SiteScope, tag: string, timelineLimit = 25, timelineFilter: TimelineFilter | null = null) {
  const coil = await getCoilByTag(scope, tag);
  if (!coil) return null;
  const [history, policy] = await Promise.all([getCoilPageHistory(scope, coil.id, coil), getCurrentPolicy(scope)]);
  if (!history) return null; // removed between the two reads
  const timeline = await getCoilTimeline(scope, coil.id, timelineLimit, {
    parts: coil.components,
    sweeps: history.sweeps,
    topLoads: history.topLoads,
    // The history holds the newest HEALTH_WINDOW.recentSessions sessions; a longer timeline reads its own.
    sessionsIncludingNewest: timelineLimit <= HEALTH_WINDOW.recentSessions ? history.sessions : undefined,
  }, timelineFilter);
  return { coil, history, timeline, policy };
}

export type CoilPageRecords = NonNullable<Awaited<ReturnType<typeof readCoilPage>>>;
