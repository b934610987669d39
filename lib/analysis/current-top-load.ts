/**
 * The one rule for "the top load the coil wears now", used by the coil page, the sweep page, the health
 * judgement and the clearance facts alike:
 * 1. the top load named by the coil's latest record that names one — a sweep always does (a sweep with none
 *    was of the bare coil), a session only when its top load was recorded;
 * 2. when the coil's top loads are known and that one is retired (or the latest record was bare while one is
 *    in service), the newest top load still in service.
 * Callers that do not hold the top-load list get step 1 alone.
 */
import type { SessionRecord, SweepRecord } from "./records";

type SweepUse = Pick<SweepRecord, "takenAt" | "topLoadId">;
type SessionUse = Pick<SessionRecord, "startedAt" | "topLoadId">;

/** The current top load's id by the rule above; null for a bare coil or a coil with no record naming one. */
export function findCurrentTopLoadId(
  sweeps: readonly SweepUse[],
  sessions: readonly SessionUse[],
  topLoads?: readonly { id: string; retiredAt: Date | null }[],
): string | null {
  let latestAt = Number.NEGATIVE_INFINITY;
  let latestId: string | null = null;
  for (const s of sweeps) {
    if (s.takenAt.getTime() >= latestAt) [latestAt, latestId] = [s.takenAt.getTime(), s.topLoadId];
  }
  for (const s of sessions) {
    if (s.topLoadId !== null && s.topLoadId !== undefined && s.startedAt.getTime() >= latestAt) [latestAt, latestId] = [s.startedAt.getTime(), s.topLoadId];
  }
  if (!topLoads) return latestId;
  const inService = topLoads.filter((t) => t.retiredAt === null);
  return (inService.find((t) => t.id === latestId) ?? inService.at(-1))?.id ?? null;
}

/** The current top load itself (topLoads oldest first), or null. */
export function findCurrentTopLoad<T extends { id: string; retiredAt: Date | null }>(topLoads: readonly T[], sweeps: readonly SweepUse[], sessions: readonly SessionUse[]): T | null {
  const id = findCurrentTopLoadId(sweeps, sessions, topLoads);
  return topLoads.find((t) => t.id === id) ?? null;
}

/** The latest sweep (sweeps chronological) taken with the current top load, or null. */
export function findLatestSweepWithCurrentTopLoad<W extends SweepUse>(
  sweeps: readonly W[],
  sessions: readonly SessionUse[],
  topLoads?: readonly { id: string; retiredAt: Date | null }[],
): W | null {
  const current = findCurrentTopLoadId(sweeps, sessions, topLoads);
  return sweeps.findLast((s) => (s.topLoadId ?? null) === current) ?? null;
}
