/**
 * Everything app/(app)/coils/[tag]/page.tsx reads, composed so nothing is read twice: the coil with its parts and
 * top loads once (the history and the timeline are handed them), the health window once (the timeline's newest
 * sessions are its tail, its sweeps the history's), and the current policy the page judges health by.
 * Thirteen small raw statements for a coil however long its logbook (bench: `npm run bench -- --large`).
 */
import { getCoilByTag } from "./coils";
import { getCoilPageHistory } from "./coil-history";
import { getCoilTimeline } from "./coil-timeline";
import { getCurrentPolicy } from "./policy";
import { HEALTH_WINDOW } from "../analysis/health-window";
import type { TimelineFilter } from "../validation/timeline";

export async function readCoilPage(tag: string, timelineLimit = 25, timelineFilter: TimelineFilter | null = null) {
  const coil = await getCoilByTag(tag);
  if (!coil) return null;
  const [history, policy] = await Promise.all([getCoilPageHistory(coil.id, coil), getCurrentPolicy()]);
  if (!history) return null; // removed between the two reads
  const timeline = await getCoilTimeline(coil.id, timelineLimit, {
    parts: coil.components,
    sweeps: history.sweeps,
    topLoads: history.topLoads,
    // The history holds the newest HEALTH_WINDOW.recentSessions sessions; a longer timeline reads its own.
    sessionsIncludingNewest: timelineLimit <= HEALTH_WINDOW.recentSessions ? history.sessions : undefined,
  }, timelineFilter);
  return { coil, history, timeline, policy };
}

export type CoilPageRecords = NonNullable<Awaited<ReturnType<typeof readCoilPage>>>;
