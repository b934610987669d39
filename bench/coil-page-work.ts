/** The server work of app/(app)/coils/[tag]/page.tsx, without the rendering, for the large-fleet benchmark. */
import { readCoilPage, type CoilPageRecords } from "../lib/db/coil-page";
import { judgeCoilFigures } from "../lib/analysis/coil-health-input";
import { compareCoil } from "../lib/analysis/coil-comparison";
import { readCoilComparison } from "../lib/db/prediction-history";
import type { ClearancePolicyRules } from "../lib/calc/clearance-policy";
import { benchScope } from "./bench-scope";

/** What the page works out from what it read: the prediction table and the health judged by the current policy (as the page does, judgeCoilFigures). */
export function computeCoilPageFigures(history: CoilPageRecords["history"], rules: ClearancePolicyRules) {
  const comparison = compareCoil(history.coil, history.topLoads, history.sweeps, history.comparisonSessions);
  return { comparison, health: judgeCoilFigures(history, rules, new Date()).health };
}

export async function readBusyCoilPage(tag: string) {
  const records = await readCoilPage(benchScope(null), tag);
  if (!records) throw new Error(`No coil ${tag} in the fixture`);
  return records;
}

export async function loadCoilPage(tag: string) {
  const { coil, history, timeline, policy } = await readBusyCoilPage(tag);
  // As the page does: the prediction table reads the coil's running frequencies (and the fleet's when it has few).
  return { coil, timeline, comparison: await readCoilComparison(benchScope(null), history), health: judgeCoilFigures(history, policy.rules, new Date()).health };
}
