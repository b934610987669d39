/**
 * A coil's standing for the coil page's header band: its clearance state (lapse included, as the dashboard works it
 * out) and its loan out now, if any. Three small raw statements on (coilId, …) indexes (lib/db/raw-read.ts says why
 * raw); the parts are the ones the page has read already.
 */
import { prisma } from "./client";
import type { Clearance, Failure, Loan } from "./generated/client";
import { findPartReplacements } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { ComponentRecord } from "../analysis/records";

export interface CoilStanding {
  clearance: ClearanceState;
  activeLoan: { id: string; borrower: string; event: string; expectedBackAt: Date; overdue: boolean } | null;
}

export async function readCoilStanding(coilId: string, components: readonly ComponentRecord[], now: Date = new Date()): Promise<CoilStanding> {
  const [clearances, failures, loans] = await Promise.all([
    prisma.$queryRaw<Pick<Clearance, "id" | "coilId" | "verdict" | "decidedAt" | "validUntil">[]>`
      SELECT id, "coilId", verdict, "decidedAt", "validUntil" FROM "Clearance" WHERE "coilId" = ${coilId} ORDER BY "decidedAt" DESC, id DESC LIMIT 1`,
    prisma.$queryRaw<Pick<Failure, "occurredAt" | "mode">[]>`SELECT "occurredAt", mode FROM "Failure" WHERE "coilId" = ${coilId}`,
    prisma.$queryRaw<Pick<Loan, "id" | "borrower" | "event" | "expectedBackAt">[]>`
      SELECT id, borrower, event, "expectedBackAt" FROM "Loan" WHERE "coilId" = ${coilId} AND "returnedAt" IS NULL ORDER BY "outAt" DESC, id DESC LIMIT 1`,
  ]);
  const loan = loans[0];
  return {
    clearance: describeClearanceState(clearances[0] ?? null, failures, findPartReplacements(components), now),
    activeLoan: loan ? { ...loan, overdue: loan.expectedBackAt.getTime() < now.getTime() } : null,
  };
}
