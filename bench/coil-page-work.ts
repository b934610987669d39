/** The server work of app/(app)/coils/[tag]/page.tsx, without the rendering, for the large-fleet benchmark. */
import { getCoilByTag } from "../lib/db/coils";
import { getCoilPageHistory } from "../lib/db/coil-history";
import { getCoilTimeline } from "../lib/db/coil-timeline";
import { analyzeSessions, assessCoil } from "../lib/analysis/coil-health-input";
import { compareCoil } from "../lib/analysis/coil-comparison";
import { selectHealthWindow } from "../lib/analysis/health-window";

export async function loadCoilPage(tag: string) {
  const coil = await getCoilByTag(tag);
  if (!coil) throw new Error(`No coil ${tag} in the fixture`);
  const [history, timeline] = await Promise.all([getCoilPageHistory(coil.id, coil), getCoilTimeline(coil.id, 25, coil.components)]);
  if (!history) throw new Error(`No history for ${tag}`);
  const comparison = compareCoil(history.coil, history.topLoads, history.sweeps, history.comparisonSessions);
  const analyzed = analyzeSessions(history.coil, selectHealthWindow(history.sessions), history.components);
  return { coil, timeline, comparison, health: assessCoil(analyzed, history.sweeps, new Date()) };
}
