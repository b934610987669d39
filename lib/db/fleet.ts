/**
 * The fleet at a glance: one row per coil with its health (lib/analysis over each logbook's health window), latest
 * margins, running totals, clearance and loan state. The logbook-derived figures come from the per-coil summary
 * (coil-summary.ts: stored, recomputed only for coils written to since, under a new policy, or past their
 * validUntil); what moves with the clock alone and is cheap — days since the sweep, clearance lapse, overdue loans,
 * open failures — is worked out here at read time. Filtered and sorted on the server from the query string.
 * The fleet is the scope's site's: every statement joins the coil and filters on its site. A coil lent to another
 * site stays in its own site's fleet (with its loan) and never appears in the borrowing site's.
 */
import { prisma } from "./client";
import { readRows } from "./adapter-read";
import { Prisma, type Clearance, type Coil, type Component, type Failure, type Loan } from "./generated/client";
import { getCoilFigures } from "./coil-summary";
import { getCurrentPolicy } from "./policy";
import { findPartReplacements } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { HealthStatus } from "../calc/coil-health";
import type { SessionMarginsBrief } from "../analysis/margin-brief";
import type { HeadroomTrend } from "../analysis/headroom-trend";
import type { FleetQuery } from "../validation/fleet-query";
import { collectPartKinds, countFailureModesByPart, partExposuresFromSeconds } from "../analysis/part-hours";
import { readPartFittedSeconds } from "./part-hours";
import { partReliability } from "../calc/reliability";
import { recordOfSite, type SiteScope } from "./site-scope";

export interface FleetRow {
  id: string;
  tag: string;
  name: string;
  status: string;
  health: HealthStatus;
  reasons: string[];
  latestMargins: SessionMarginsBrief | null;
  headroomTrend: HeadroomTrend;
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

function groupByCoil<T extends { coilId: string }>(rows: readonly T[]): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const row of rows) (map.get(row.coilId) ?? map.set(row.coilId, []).get(row.coilId)!).push(row);
  return map;
}

/**
 * Each coil's latest clearance (the latest decision; ties on the instant broken by id), walking the
 * (coilId, decidedAt) index. Prisma's `distinct` would read every clearance ever signed and drop the rest in memory.
 */
export function readLatestClearances(scope: SiteScope) {
  return readRows<Pick<Clearance, "id" | "coilId" | "verdict" | "decidedAt" | "validUntil">>(Prisma.sql`
    SELECT c.id, c."coilId", c.verdict, c."decidedAt", c."validUntil" FROM "Clearance" c JOIN "Coil" ON "Coil".id = c."coilId"
    WHERE "Coil"."siteId" = ${scope.siteId}
      AND NOT EXISTS (SELECT 1 FROM "Clearance" d WHERE d."coilId" = c."coilId"
                        AND (d."decidedAt" > c."decidedAt" OR (d."decidedAt" = c."decidedAt" AND d.id > c.id)))`);
}

/**
 * The dashboard's rows. Its reads are raw statements (lib/db/raw-read.ts says why): seven small reads were most of
 * the warm dashboard's time when they went through Prisma's query API.
 */
export async function getFleetOverview(scope: SiteScope, now: Date = new Date()): Promise<FleetRow[]> {
  const site = scope.siteId;
  const [coils, policy, failures, clearances, loans, components] = await Promise.all([
    readRows<Pick<Coil, "id" | "tag" | "name" | "status">>(Prisma.sql`SELECT id, tag, name, status FROM "Coil" WHERE "siteId" = ${site} ORDER BY tag`),
    getCurrentPolicy(scope),
    readRows<Pick<Failure, "coilId" | "occurredAt" | "mode" | "status">>(Prisma.sql`
      SELECT f."coilId", f."occurredAt", f.mode, f.status FROM "Failure" f JOIN "Coil" ON "Coil".id = f."coilId" WHERE "Coil"."siteId" = ${site}`),
    readLatestClearances(scope),
    readRows<Pick<Loan, "id" | "coilId" | "borrower" | "event" | "expectedBackAt">>(Prisma.sql`
      SELECT l.id, l."coilId", l.borrower, l.event, l."expectedBackAt" FROM "Loan" l JOIN "Coil" ON "Coil".id = l."coilId"
      WHERE "Coil"."siteId" = ${site} AND l."returnedAt" IS NULL`),
    // Parts only for the clearance lapse check (a part fitted since signing), so only for coils that have a
    // clearance: a coil never cleared shows "none" whatever its parts.
    readRows<Pick<Component, "id" | "coilId" | "kind" | "partNumber" | "installedAt" | "removedAt">>(Prisma.sql`
      SELECT p.id, p."coilId", p.kind, p."partNumber", p."installedAt", p."removedAt" FROM "Component" p JOIN "Coil" ON "Coil".id = p."coilId"
      WHERE "Coil"."siteId" = ${site} AND p."coilId" IN (SELECT "coilId" FROM "Clearance") ORDER BY p."installedAt", p.id`),
  ]);
  const figuresByCoil = await getCoilFigures(
    scope,
    coils.map((c) => c.id),
    policy,
    now,
  );
  const clearanceByCoil = new Map(clearances.map((c) => [c.coilId, c]));
  const loanByCoil = new Map(loans.map((l) => [l.coilId, l]));
  const failuresByCoil = groupByCoil(failures);
  const componentsByCoil = groupByCoil(components);
  return coils.flatMap((coil) => {
    const figures = figuresByCoil.get(coil.id);
    if (!figures) return []; // removed while the page was being read
    const coilFailures = failuresByCoil.get(coil.id) ?? [];
    const { lastSweepAt } = figures;
    const loan = loanByCoil.get(coil.id);
    return [
      {
        id: coil.id,
        tag: coil.tag,
        name: coil.name,
        status: coil.status,
        health: figures.health,
        reasons: figures.reasons,
        latestMargins: figures.latestMargins,
        headroomTrend: figures.headroomTrend,
        sessionCount: figures.sessionCount,
        hoursRun: figures.totalRunS / 3600,
        lastSessionAt: figures.lastSessionAt,
        lastSweepAt,
        daysSinceSweep: lastSweepAt ? Math.floor((now.getTime() - lastSweepAt.getTime()) / 86_400_000) : null,
        openFailures: coilFailures.filter((f) => f.status === "open").length,
        clearance: describeClearanceState(clearanceByCoil.get(coil.id) ?? null, coilFailures, findPartReplacements(componentsByCoil.get(coil.id) ?? []), now),
        activeLoan: loan ? { ...loan, overdue: loan.expectedBackAt.getTime() < now.getTime() } : null,
      },
    ];
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

/**
 * Reliability per part number across the site's fleet: hours while fitted (summed in the database, lib/db/part-hours.ts)
 * and failures recorded against the part. Parts come coil by coil in tag order, each coil's by installation, as the
 * fleet history used to give them: the part number shown for a key is the last one's.
 */
export async function getPartReliability(scope: SiteScope) {
  const [components, fittedSeconds, failures] = await Promise.all([
    prisma.component.findMany({ where: recordOfSite(scope), select: { id: true, kind: true, partNumber: true }, orderBy: [{ coil: { tag: "asc" } }, { installedAt: "asc" }, { id: "asc" }] }),
    readPartFittedSeconds(scope),
    prisma.failure.findMany({ where: recordOfSite(scope), select: { componentId: true, mode: true } }),
  ]);
  const exposures = partExposuresFromSeconds(components, fittedSeconds, failures);
  const kinds = collectPartKinds(exposures);
  const modes = countFailureModesByPart(exposures, failures);
  const shownNumber = new Map(exposures.map((e) => [e.partKey, e.partNumber]));
  const parts = partReliability(exposures).map((p) => ({ ...p, kinds: kinds.get(p.partKey) ?? [], failureModes: modes.get(p.partKey) ?? [], partNumber: shownNumber.get(p.partKey) ?? p.partKey }));
  parts.sort((a, b) => b.failures - a.failures || b.operatingHours - a.operatingHours);
  return { parts, unattributedFailures: failures.filter((f) => !f.componentId).length };
}
