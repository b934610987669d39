/**
 * The sessions a health assessment reads: the first few (the baseline lib/calc compares against) and the most
 * recent run of them (the trends and the latest margins). Older sessions in between say nothing the recent window
 * and the baseline do not, and analysing every session of a long logbook on every page view does not scale
 * (a 500-session coil took ~90 ms to assess in full; the window keeps it near-constant).
 * A logbook no longer than the two together is read whole, so small logbooks are judged exactly as before.
 */
export const HEALTH_WINDOW = {
  /** lib/calc's default baseline size (coil-logbook.ts, baseline.sessionCount). */
  baselineSessions: 3,
  /** Enough for Theil–Sen trends over weeks of regular use at several sessions a day. */
  recentSessions: 60,
} as const;

/** `sessions` in time order → the baseline and the recent window, still in time order. */
export function selectHealthWindow<T>(sessions: readonly T[], window: { baselineSessions: number; recentSessions: number } = HEALTH_WINDOW): T[] {
  if (sessions.length <= window.baselineSessions + window.recentSessions) return [...sessions];
  return [...sessions.slice(0, window.baselineSessions), ...sessions.slice(sessions.length - window.recentSessions)];
}
