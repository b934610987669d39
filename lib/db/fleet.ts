/**
 * The fleet at a glance: one row per coil with its health (lib/analysis over each logbook's health window), latest
 * margins, running totals, clearance and loan state. Read with a handful of queries for the whole fleet
 * (not one query per coil), then filtered and sorted on the server from the query string.
 */
import { prisma } from "./client";
import { getFleetHealthHistory, getFleetHistory } from "./coil-history";
import { getCurrentPolicy } from "./policy";
import { analyzeSessions, assessCoil } from "../analysis/coil-health-input";
import { findPartReplacements } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import { CalcInputError } from "../calc/errors";
import type { HealthStatus } from "../calc/coil-health";
import type { SessionMargins } from "../calc/session-margins";
import type { FleetQuery } from "../validation/fleet-query";
import { collectPartKinds, computePartExposures } from "../analysis/part-hours";
import { partReliability } from "../calc/reliability";

export interface FleetRow {
  id: string;
  tag: string;
  name: string;
  status: string;
  health: HealthStatus;
  reasons: string[];
  latestMargins: SessionMargins | null;
  sessionCount: number;
  hoursRun: number;
  lastSessionAt: Date | null;
  lastSweepAt: Date | null;
  daysSinceSweep: number | null;
  openFailures: number;
  clearance: ClearanceState;
  activeLoan: { id: string; borrower: string; event: string; expectedBackAt: Date; overdue: boolean } | null;
}

const SEVERITY: Record<HealthStatus, number> = { hold: 0, watch: 1, "not enough data": 2, fine: 3 };

export async function getFleetOverview(now: Date = new Date()): Promise<FleetRow[]> {
  const [histories, policy, failures, clearances, loans] = await Promise.all([
    getFleetHealthHistory(),
    getCurrentPolicy(),
    prisma.failure.findMany({ select: { coilId: true, occurredAt: true, mode: true, status: true } }),
    prisma.clearance.findMany({ orderBy: { decidedAt: "desc" }, distinct: ["coilId"], select: { id: true, coilId: true, verdict: true, decidedAt: true, validUntil: true } }),
    prisma.loan.findMany({ where: { returnedAt: null }, select: { id: true, coilId: true, borrower: true, event: true, expectedBackAt: true } }),
  ]);
  const clearanceByCoil = new Map(clearances.map((c) => [c.coilId, c]));
  const loanByCoil = new Map(loans.map((l) => [l.coilId, l]));
  return histories.map(({ coil, components, sessions, sweeps, totals }) => {
    const coilFailures = failures.filter((f) => f.coilId === coil.id);
    const analyzed = analyzeSessions(coil, sessions, components);
    let health: HealthStatus = "not enough data";
    let reasons: string[] = [];
    try {
      const assessed = assessCoil(analyzed, sweeps, now, policy.rules);
      health = assessed.status;
      reasons = assessed.reasons;
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      reasons = [`The logbook could not be assessed: ${error.message}.`];
    }
    const lastSweepAt = sweeps.at(-1)?.takenAt ?? null;
    const loan = loanByCoil.get(coil.id);
    return {
      id: coil.id,
      tag: coil.tag,
      name: coil.name,
      status: coil.status,
      health,
      reasons,
      latestMargins: analyzed.at(-1)?.analysis.margins ?? null,
      sessionCount: totals.sessionCount,
      hoursRun: totals.totalDurationS / 3600,
      lastSessionAt: totals.lastSessionAt,
      lastSweepAt,
      daysSinceSweep: lastSweepAt ? Math.floor((now.getTime() - lastSweepAt.getTime()) / 86_400_000) : null,
      openFailures: coilFailures.filter((f) => f.status === "open").length,
      clearance: describeClearanceState(clearanceByCoil.get(coil.id) ?? null, coilFailures, findPartReplacements(components), now),
      activeLoan: loan ? { ...loan, overdue: loan.expectedBackAt.getTime() < now.getTime() } : null,
    };
  });
}

/** Applies the dashboard's filters and sort order. */
export function selectFleetRows(rows: readonly FleetRow[], query: FleetQuery): FleetRow[] {
  const kept = rows.filter((row) => {
    if (query.health !== "all" && row.health !== query.health) return false;
    const c = row.clearance.kind;
    if (query.clearance === "not-valid" && c === "valid") return false;
    if (query.clearance === "lapsed" && c !== "lapsed-failure" && c !== "lapsed-part") return false;
    if (["valid", "none", "expired", "refused"].includes(query.clearance) && c !== query.clearance) return false;
    if (query.loan === "out" && !row.activeLoan) return false;
    if (query.loan === "overdue" && !row.activeLoan?.overdue) return false;
    if (query.loan === "in" && row.activeLoan) return false;
    return true;
  });
  const byTag = (a: FleetRow, b: FleetRow) => a.tag.localeCompare(b.tag);
  const compare: Record<FleetQuery["sort"], (a: FleetRow, b: FleetRow) => number> = {
    severity: (a, b) => SEVERITY[a.health] - SEVERITY[b.health] || byTag(a, b),
    tag: byTag,
    hours: (a, b) => b.hoursRun - a.hoursRun || byTag(a, b),
    // Never swept counts as the oldest.
    "sweep-age": (a, b) => (b.daysSinceSweep ?? Infinity) - (a.daysSinceSweep ?? Infinity) || byTag(a, b),
  };
  return [...kept].sort(compare[query.sort]);
}

/** Reliability per part number across the fleet: hours while fitted and failures recorded against the part. */
export async function getPartReliability() {
  const [histories, failures] = await Promise.all([getFleetHistory(), prisma.failure.findMany({ select: { componentId: true } })]);
  const exposures = computePartExposures(histories, failures);
  const kinds = collectPartKinds(exposures);
  const shownNumber = new Map(exposures.map((e) => [e.partKey, e.partNumber]));
  const parts = partReliability(exposures).map((p) => ({ ...p, kinds: kinds.get(p.partKey) ?? [], partNumber: shownNumber.get(p.partKey) ?? p.partKey }));
  parts.sort((a, b) => b.failures - a.failures || b.operatingHours - a.operatingHours);
  return { parts, unattributedFailures: failures.filter((f) => !f.componentId).length };
}
