/**
 * A coil's standing for the coil page's header band: its clearance state (lapse included, as the dashboard works it
 * out) and its loan out now, if any. Three small raw statements on (coilId, …) indexes (lib/db/raw-read.ts says why
 * raw); the parts are the ones the page has read already. Each statement joins the coil at the scope's site, so a coil
 * of another site reads as one with nothing recorded, exactly as an id that does not exist.
 */
import { prisma } from "./client";
import type { SiteScope } from "./site-scope";
import type { Clearance, Failure, Loan } from "./generated/client";
import { findPartReplacements } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { ComponentRecord } from "../analysis/records";

export interface CoilStanding {
  clearance: ClearanceState;
  activeLoan: { id: string; borrower: string; event: string; expectedBackAt: Date; overdue: boolean } | null;
}

export async function readCoilStanding(scope: SiteScope, coilId: string, components: readonly ComponentRecord[], now: Date = new Date()): Promise<CoilStanding> {
  const [clearances, failures, loans] = await Promise.all([
    prisma.$queryRaw<Pick<Clearance, "id" | "coilId" | "verdict" | "decidedAt" | "validUntil">[]>`
      SELECT r.id, r."coilId", r.verdict, r."decidedAt", r."validUntil" FROM "Clearance" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId} ORDER BY r."decidedAt" DESC, r.id DESC LIMIT 1`,
    prisma.$queryRaw<Pick<Failure, "occurredAt" | "mode">[]>`
      SELECT r."occurredAt", r.mode FROM "Failure" r JOIN "Coil" ON "Coil".id = r."coilId" WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId}`,
    prisma.$queryRaw<Pick<Loan, "id" | "borrower" | "event" | "expectedBackAt">[]>`
      SELECT r.id, r.borrower, r.event, r."expectedBackAt" FROM "Loan" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId} AND r."returnedAt" IS NULL ORDER BY r."outAt" DESC, r.id DESC LIMIT 1`,
  ]);
  const loan = loans[0];
  return {
    clearance: describeClearanceState(clearances[0] ?? null, failures, findPartReplacements(components), now),
    activeLoan: loan ? { ...loan, overdue: loan.expectedBackAt.getTime() < now.getTime() } : null,
  };
}
