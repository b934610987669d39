/**
 * The few columns prediction quality needs, never sweep points or heat-sink samples: the coils' builds, their
 * top loads, each sweep's first series resonance and each session's running frequency. One coil's rows for the
 * coil page, or the fleet's for the prediction-quality page and the running-offset fallback. The fleet is the
 * scope's site: no figure here learns from, or shows, another site's coils. Fleet-wide reads take the site's latest
 * FLEET_PREDICTION_WINDOW sweeps and sessions, so their cost stays bounded however long the logbook grows; a session
 * whose sweep before it falls outside the window is left out, as one with no sweep before it always was.
 */
import { prisma } from "./client";
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
import { rawDate } from "./raw-read";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import { compareCoil, type CoilComparison } from "../analysis/coil-comparison";
import { needsFleetObservations, pairFleetRunning, pairRunningWithSweeps } from "../analysis/running-offset";
import type { getCoilPageHistory } from "./coil-history";

const coilSelect = {
  id: true,
  tag: true,
  topology: true,
  formDiameterM: true,
  windingLengthM: true,
  turns: true,
  wireDiameterM: true,
  wireMaterial: true,
  environmentCapacitanceF: true,
  measuredInductanceH: true,
} as const;
const topLoadSelect = { id: true, coilId: true, name: true, shape: true, diameterM: true, tubeDiameterM: true, heightM: true, measuredCapacitanceF: true, retiredAt: true } as const;
const sweepSelect = { id: true, coilId: true, takenAt: true, topLoadId: true, firstSeriesResonanceHz: true } as const;
const runningSelect = { id: true, coilId: true, startedAt: true, topLoadId: true, runningFrequencyHz: true } as const;

/** How many of the site's latest sweeps, and of its latest sessions, the fleet-wide figures look at. */
export const FLEET_PREDICTION_WINDOW = 2_000;

type RunningRow = { id: string; coilId: string; startedAt: Date; topLoadId: string | null; runningFrequencyHz: number | null };

/**
 * A coil's sessions that logged a running frequency, oldest first (what its own offset is learnt from). Raw and one
 * statement on the (coilId, startedAt) index: the coil page asks on every view (lib/db/raw-read.ts says why raw;
 * test/raw-reads.test.ts checks it against the query API's answer on both databases).
 */
export async function readRunningFrequencies(scope: SiteScope, coilId: string): Promise<RunningRow[]> {
  const rows = await readRows<(Omit<RunningRow, "startedAt"> & { startedAt: Date | string })>(Prisma.sql`
    SELECT s.id, s."coilId", s."startedAt", s."topLoadId", s."runningFrequencyHz" FROM "RunSession" s JOIN "Coil" ON "Coil".id = s."coilId"
    WHERE s."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId} AND s."runningFrequencyHz" IS NOT NULL
    ORDER BY s."startedAt", s.id`);
  return rows.map((row) => ({ ...row, startedAt: rawDate(row.startedAt) }));
}

/** The site's latest sessions that logged a running frequency, oldest first. */
async function readFleetRunningWindow(scope: SiteScope, window: number) {
  const newestFirst = await prisma.runSession.findMany({
    where: { runningFrequencyHz: { not: null }, ...recordOfSite(scope) },
    select: runningSelect,
    orderBy: [{ startedAt: "desc" }, { id: "desc" }],
    take: window,
  });
  return newestFirst.reverse();
}

/** The site's latest sweeps with a first series resonance, oldest first. */
async function readFleetSweepWindow(scope: SiteScope, window: number) {
  const newestFirst = await prisma.sweep.findMany({
    where: { firstSeriesResonanceHz: { not: null }, ...recordOfSite(scope) },
    select: sweepSelect,
    orderBy: [{ takenAt: "desc" }, { id: "desc" }],
    take: window,
  });
  return newestFirst.reverse();
}

/** Everything the fleet's prediction-quality figures read (the site's coils and top loads, the windows of sweeps and sessions), oldest first within each table. */
export async function readFleetPredictionInputs(scope: SiteScope, window = FLEET_PREDICTION_WINDOW) {
  const [coils, topLoads, sweeps, sessions] = await Promise.all([
    prisma.coil.findMany({ where: coilOfSite(scope), select: coilSelect, orderBy: { tag: "asc" } }),
    prisma.topLoad.findMany({ where: recordOfSite(scope), select: topLoadSelect, orderBy: [{ createdAt: "asc" }, { id: "asc" }] }),
    readFleetSweepWindow(scope, window),
    readFleetRunningWindow(scope, window),
  ]);
  return { coils, topLoads, sweeps, sessions };
}

export type FleetPredictionInputs = Awaited<ReturnType<typeof readFleetPredictionInputs>>;

/** The windows of the site's sweeps' first resonances and sessions' running frequencies: what the running-offset fleet fallback learns from. */
export async function readFleetRunningInputs(scope: SiteScope, window = FLEET_PREDICTION_WINDOW) {
  const [sweeps, sessions] = await Promise.all([readFleetSweepWindow(scope, window), readFleetRunningWindow(scope, window)]);
  return { sweeps, sessions };
}

/**
 * The coil page's prediction table from its history: the coil's running frequencies read in full (the offset is
 * learnt from every earlier session), the site's fleet's only when the coil has too few of its own. When the caller
 * knows the coil's session count and the history's sessions are all of them (a logbook no longer than the health
 * window, as every demo coil's is), the running frequencies are taken from the history instead of read again.
 */
export async function readCoilComparison(
  scope: SiteScope,
  history: NonNullable<Awaited<ReturnType<typeof getCoilPageHistory>>>,
  knownSessionCount?: number,
): Promise<CoilComparison> {
  const runningSessions =
    knownSessionCount === history.sessions.length
      ? history.sessions
          .filter((s) => s.runningFrequencyHz !== null)
          .map(({ id, coilId, startedAt, topLoadId, runningFrequencyHz }) => ({ id, coilId, startedAt, topLoadId, runningFrequencyHz }))
      : await readRunningFrequencies(scope, history.coil.id);
  let fleetObservations: ReturnType<typeof pairFleetRunning> = [];
  if (needsFleetObservations(pairRunningWithSweeps(runningSessions, history.sweeps))) {
    const { sweeps, sessions } = await readFleetRunningInputs(scope);
    fleetObservations = pairFleetRunning(sweeps, sessions);
  }
  return compareCoil(history.coil, history.topLoads, history.sweeps, history.comparisonSessions, runningSessions, fleetObservations);
}
