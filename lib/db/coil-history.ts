/**
 * Everything lib/analysis needs to judge one coil or the whole fleet, read in a few queries:
 * coils, every part ever fitted, every session (without heat-sink samples) and every sweep summary.
 */
import { prisma } from "./client";

const sessionSelect = {
  id: true,
  coilId: true,
  startedAt: true,
  supplyVoltageV: true,
  supplyCurrentA: true,
  durationS: true,
  ambientTempC: true,
  heatSinkStartC: true,
  heatSinkEndC: true,
  runningFrequencyHz: true,
  peakSwitchVoltageV: true,
  dutyCycle: true,
  outcome: true,
  topLoadId: true,
} as const;

const sweepSelect = { id: true, coilId: true, takenAt: true, topLoadId: true, firstSeriesResonanceHz: true } as const;

export async function getCoilHistory(coilId: string) {
  const [coil, components, sessions, sweeps, topLoads] = await Promise.all([
    prisma.coil.findUnique({ where: { id: coilId } }),
    prisma.component.findMany({ where: { coilId }, orderBy: { installedAt: "asc" } }),
    prisma.runSession.findMany({ where: { coilId }, select: sessionSelect, orderBy: { startedAt: "asc" } }),
    prisma.sweep.findMany({ where: { coilId }, select: sweepSelect, orderBy: { takenAt: "asc" } }),
    prisma.topLoad.findMany({ where: { coilId }, orderBy: { createdAt: "asc" } }),
  ]);
  return coil ? { coil, components, sessions, sweeps, topLoads } : null;
}

export type CoilHistory = NonNullable<Awaited<ReturnType<typeof getCoilHistory>>>;

/** The same for every coil, grouped by coil id (four queries in all). */
export async function getFleetHistory(): Promise<CoilHistory[]> {
  const [coils, components, sessions, sweeps, topLoads] = await Promise.all([
    prisma.coil.findMany({ orderBy: { tag: "asc" } }),
    prisma.component.findMany({ orderBy: { installedAt: "asc" } }),
    prisma.runSession.findMany({ select: sessionSelect, orderBy: { startedAt: "asc" } }),
    prisma.sweep.findMany({ select: sweepSelect, orderBy: { takenAt: "asc" } }),
    prisma.topLoad.findMany({ orderBy: { createdAt: "asc" } }),
  ]);
  const group = <T extends { coilId: string }>(rows: T[]) => {
    const map = new Map<string, T[]>();
    for (const row of rows) (map.get(row.coilId) ?? map.set(row.coilId, []).get(row.coilId)!).push(row);
    return map;
  };
  const c = group(components);
  const s = group(sessions);
  const w = group(sweeps);
  const t = group(topLoads);
  return coils.map((coil) => ({ coil, components: c.get(coil.id) ?? [], sessions: s.get(coil.id) ?? [], sweeps: w.get(coil.id) ?? [], topLoads: t.get(coil.id) ?? [] }));
}
