/**
 * How long a coil's health assessment stays true while nothing new is logged, so a stored verdict can be trusted
 * until then (lib/db/coil-summary.ts). The only part of lib/calc's assessment that moves with the clock is a
 * significant falling margin's projection, which runs from now (or the margin's last session, if later): its days
 * to the limit shrink by one a day, so
 *  - the status changes as they reach watchWithinDays, holdWithinDays and zero (the fitted line at the limit);
 *  - the sentence changes as "in about N days" (or "in about N sessions") rounds to the next figure, and as the
 *    range's earliest date, once the projection's start has overtaken it, turns over at UTC midnight.
 * Everything else (latest readings, level shifts, trends themselves) depends on the logbook alone.
 */
import type { CoilVerdict, MarginVerdict } from "../calc/coil-health";
import { DEFAULT_HEALTH_THRESHOLDS, type HealthThresholds } from "../calc/health-thresholds";

const MS_PER_DAY = 86_400_000;

/** The first UTC midnight strictly after `at` (ms). */
function nextUtcMidnight(atMs: number): number {
  return (Math.floor(atMs / MS_PER_DAY) + 1) * MS_PER_DAY;
}

/** The instant (ms) from which this margin's status or words would differ from what they are at `now`, or ∞. */
function marginChangesAt(margin: MarginVerdict, now: Date, sessionsPerDay: number | null, thresholds: Pick<HealthThresholds, "holdWithinDays" | "watchWithinDays">): number {
  const crossing = margin.crossing;
  if (!margin.falling || crossing === null || crossing.alreadyReached || margin.latest === null) return Number.POSITIVE_INFINITY;
  // The projection starts at the later of now and the last reading; before that instant nothing moves.
  const startMs = Math.max(now.getTime(), margin.latest.at.getTime());
  const daysAway = crossing.daysAway;
  // The status changes the moment daysAway reaches a stop still ahead of it…
  const statusStops = [0, thresholds.holdWithinDays, thresholds.watchWithinDays].filter((stop) => stop < daysAway);
  // …and the words once the rounded figure drops (Math.round keeps N down to N − 0.5 inclusive).
  const wordsStop =
    crossing.sessionsAway !== null && sessionsPerDay !== null && sessionsPerDay > 0
      ? (Math.round(daysAway * sessionsPerDay) - 0.5) / sessionsPerDay
      : Math.round(daysAway) - 0.5;
  const nextStop = Math.max(wordsStop, ...statusStops);
  const byCountdown = startMs + (daysAway - nextStop) * MS_PER_DAY;
  // The earliest date follows the projection's start once the start has passed it, so it turns over at midnight.
  const byEarliestDate = nextUtcMidnight(Math.max(startMs, crossing.earliest.getTime()));
  return Math.min(byCountdown, byEarliestDate);
}

/**
 * The earliest instant at which assessing the same logbook would give a different status or different reasons
 * than `health` (assessed at `now`), floored to the millisecond; null when time alone never changes it.
 * Valid while the clock reads strictly before it.
 */
export function computeHealthValidUntil(
  health: Pick<CoilVerdict, "margins" | "sessionsPerDay">,
  now: Date,
  thresholds: Pick<HealthThresholds, "holdWithinDays" | "watchWithinDays"> = DEFAULT_HEALTH_THRESHOLDS,
): Date | null {
  const changesAt = Math.min(...Object.values(health.margins).map((m) => marginChangesAt(m, now, health.sessionsPerDay, thresholds)));
  return Number.isFinite(changesAt) ? new Date(Math.floor(changesAt)) : null;
}
