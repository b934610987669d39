/**
 * The few columns prediction quality needs, never sweep points or heat-sink samples: the coils' builds, their
 * top loads, each sweep's first series resonance and each session's running frequency. One coil's rows for the
 * coil page, or the whole fleet's for the prediction-quality page (four narrow queries, fine for 500 coils). The
 * fleet is the scope's site: no figure here learns from, or shows, another site's coils.
 */
import { prisma } from "./client";
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

/** Sessions that logged a running frequency (one coil's, or every coil's of the site), oldest first. */
export function readRunningFrequencies(scope: SiteScope, coilId?: string) {
  return prisma.runSession.findMany({
    where: { runningFrequencyHz: { not: null }, ...recordOfSite(scope), ...(coilId ? { coilId } : {}) },
    select: runningSelect,
    orderBy: [{ startedAt: "asc" }, { id: "asc" }],
  });
}

/** Everything the fleet's prediction-quality figures read, oldest first within each table. */
export async function readFleetPredictionInputs(scope: SiteScope) {
  const [coils, topLoads, sweeps, sessions] = await Promise.all([
    prisma.coil.findMany({ where: coilOfSite(scope), select: coilSelect, orderBy: { tag: "asc" } }),
    prisma.topLoad.findMany({ where: recordOfSite(scope), select: topLoadSelect, orderBy: [{ createdAt: "asc" }, { id: "asc" }] }),
    prisma.sweep.findMany({ where: { firstSeriesResonanceHz: { not: null }, ...recordOfSite(scope) }, select: sweepSelect, orderBy: [{ takenAt: "asc" }, { id: "asc" }] }),
    readRunningFrequencies(scope),
  ]);
  return { coils, topLoads, sweeps, sessions };
}

export type FleetPredictionInputs = Awaited<ReturnType<typeof readFleetPredictionInputs>>;

/** The site's sweeps' first resonances and sessions' running frequencies: what the running-offset fleet fallback learns from. */
export async function readFleetRunningInputs(scope: SiteScope) {
  const [sweeps, sessions] = await Promise.all([
    prisma.sweep.findMany({ where: { firstSeriesResonanceHz: { not: null }, ...recordOfSite(scope) }, select: sweepSelect, orderBy: [{ takenAt: "asc" }, { id: "asc" }] }),
    readRunningFrequencies(scope),
  ]);
  return { sweeps, sessions };
}

/**
 * The coil page's prediction table from its history: the coil's running frequencies read in full (the offset is
 * learnt from every earlier session), the site's fleet's only when the coil has too few of its own.
 */
export async function readCoilComparison(scope: SiteScope, history: NonNullable<Awaited<ReturnType<typeof getCoilPageHistory>>>): Promise<CoilComparison> {
  const runningSessions = await readRunningFrequencies(scope, history.coil.id);
  let fleetObservations: ReturnType<typeof pairFleetRunning> = [];
  if (needsFleetObservations(pairRunningWithSweeps(runningSessions, history.sweeps))) {
    const { sweeps, sessions } = await readFleetRunningInputs(scope);
    fleetObservations = pairFleetRunning(sweeps, sessions);
  }
  return compareCoil(history.coil, history.topLoads, history.sweeps, history.comparisonSessions, runningSessions, fleetObservations);
}
