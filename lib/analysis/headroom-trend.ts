/**
 * A coil's recent headrooms per margin, oldest first, with the policy's threshold for each: what the dashboard's and
 * the coil page's small trend pictures draw. Taken from the sessions the one coil judgement analysed (judgeCoil's
 * `analyzed`), so the pictures and the health verdict read the same figures; the per-coil summary stores it.
 */
import type { ClearancePolicyRules } from "../calc/clearance-policy";
import type { MarginKind } from "../calc/margin";
import { headroomsOf, type AnalyzedSession } from "./coil-health-input";
import type { SessionHeadrooms } from "../calc/session-headrooms";

/** How many sessions a trend picture shows: enough to see a drift, few enough to read at 100 px wide. */
export const HEADROOM_TREND_SESSIONS = 12;

export interface HeadroomSeries {
  /** Headroom (fraction of the limit) per session, oldest first; null where that session's margin is unknown. */
  headrooms: (number | null)[];
  /** The policy's minimum headroom for this margin (below it the margin is "thin"). */
  threshold: number;
}

export type HeadroomTrend = Record<MarginKind, HeadroomSeries>;

export function collectHeadroomTrend(analyzed: readonly AnalyzedSession[], policy: ClearancePolicyRules, sessions = HEADROOM_TREND_SESSIONS): HeadroomTrend {
  return collectHeadroomTrendOf(
    analyzed.slice(-sessions).map((a) => headroomsOf(a.analysis.margins)),
    policy,
    sessions,
  );
}

/** The same from the sessions' headrooms alone, oldest first (judgeCoilFigures' `headrooms`). */
export function collectHeadroomTrendOf(headrooms: readonly SessionHeadrooms[], policy: ClearancePolicyRules, sessions = HEADROOM_TREND_SESSIONS): HeadroomTrend {
  const recent = headrooms.slice(-sessions);
  const series = (kind: MarginKind, threshold: number): HeadroomSeries => ({ headrooms: recent.map((h) => h[kind]), threshold });
  return {
    voltage: series("voltage", policy.minVoltageHeadroom),
    current: series("current", policy.minCurrentHeadroom),
    thermal: series("thermal", policy.minThermalHeadroom),
  };
}
