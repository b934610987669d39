/**
 * The fleet at a glance: one row per coil with its running totals, computed with a handful of
 * grouped queries (not one query per coil) so the dashboard stays fast as the logbook grows.
 */
import { prisma } from "./client";

export interface FleetRow {
  id: string;
  tag: string;
  name: string;
  status: string;
  sessionCount: number;
  hoursRun: number;
  lastSessionAt: Date | null;
  lastSweepAt: Date | null;
  openFailures: number;
  latestClearance: { verdict: string; decidedAt: Date; validUntil: Date; lapsedAt: Date | null } | null;
  activeLoan: { borrower: string; event: string; expectedBackAt: Date } | null;
}

export async function getFleetOverview(): Promise<FleetRow[]> {
  const [coils, sessionAgg, sweepAgg, openFailures, clearances, loans] = await Promise.all([
    prisma.coil.findMany({ select: { id: true, tag: true, name: true, status: true }, orderBy: { tag: "asc" } }),
    prisma.runSession.groupBy({ by: ["coilId"], _count: { _all: true }, _sum: { durationS: true }, _max: { startedAt: true } }),
    prisma.sweep.groupBy({ by: ["coilId"], _max: { takenAt: true } }),
    prisma.failure.groupBy({ by: ["coilId"], where: { status: "open" }, _count: { _all: true } }),
    prisma.clearance.findMany({
      orderBy: { decidedAt: "desc" },
      distinct: ["coilId"],
      select: { coilId: true, verdict: true, decidedAt: true, validUntil: true, lapsedAt: true },
    }),
    prisma.loan.findMany({ where: { returnedAt: null }, select: { coilId: true, borrower: true, event: true, expectedBackAt: true } }),
  ]);
  const sessions = new Map(sessionAgg.map((s) => [s.coilId, s]));
  const sweeps = new Map(sweepAgg.map((s) => [s.coilId, s._max.takenAt]));
  const failures = new Map(openFailures.map((f) => [f.coilId, f._count._all]));
  const clearanceByCoil = new Map(clearances.map((c) => [c.coilId, c]));
  const loanByCoil = new Map(loans.map((l) => [l.coilId, l]));
  return coils.map((coil) => {
    const s = sessions.get(coil.id);
    const c = clearanceByCoil.get(coil.id);
    const l = loanByCoil.get(coil.id);
    return {
      ...coil,
      sessionCount: s?._count._all ?? 0,
      hoursRun: (s?._sum.durationS ?? 0) / 3600,
      lastSessionAt: s?._max.startedAt ?? null,
      lastSweepAt: sweeps.get(coil.id) ?? null,
      openFailures: failures.get(coil.id) ?? 0,
      latestClearance: c ? { verdict: c.verdict, decidedAt: c.decidedAt, validUntil: c.validUntil, lapsedAt: c.lapsedAt } : null,
      activeLoan: l ? { borrower: l.borrower, event: l.event, expectedBackAt: l.expectedBackAt } : null,
    };
  });
}
