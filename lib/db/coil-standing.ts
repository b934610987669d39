/**
 * A coil's standing for the coil page's header band: its clearance state (lapse included, as the dashboard works it
 * out) and its loan out now, if any. Up to three small raw statements on (coilId, …) indexes (lib/db/raw-read.ts says
 * why raw), none when the caller has read the records already (the page's timeline has); the parts are the ones the
 * page has read already. Each statement joins the coil at the scope's site, so a coil of another site reads as one
 * with nothing recorded, exactly as an id that does not exist.
 */
import { readRows } from "./adapter-read";
import type { SiteScope } from "./site-scope";
import { Prisma, type Clearance, type Failure, type Loan } from "./generated/client";
import { findPartReplacements } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { ComponentRecord } from "../analysis/records";

export interface CoilStanding {
  clearance: ClearanceState;
  activeLoan: { id: string; borrower: string; event: string; expectedBackAt: Date; overdue: boolean } | null;
}

/**
 * What the caller has read already (the coil page's timeline has), newest first with how many of each exist: each
 * part of the standing is taken from it when it is sure to hold the answer, and read otherwise.
 */
export interface KnownStandingRecords {
  clearancesNewestFirst: readonly Pick<Clearance, "id" | "coilId" | "verdict" | "decidedAt" | "validUntil">[];
  clearanceCount: number;
  failures: readonly Pick<Failure, "occurredAt" | "mode">[];
  failureCount: number;
  loansNewestFirst: readonly Pick<Loan, "id" | "borrower" | "event" | "expectedBackAt" | "returnedAt">[];
  loanCount: number;
}

type LatestClearance = Pick<Clearance, "id" | "coilId" | "verdict" | "decidedAt" | "validUntil">;
type OpenLoan = Pick<Loan, "id" | "borrower" | "event" | "expectedBackAt">;

/** The latest clearance: the first read newest first (same order as the statement below), or none when the coil has none. */
function knownLatestClearance(known: KnownStandingRecords | undefined): LatestClearance[] | undefined {
  if (!known) return undefined;
  const [latest] = known.clearancesNewestFirst;
  if (latest) return [{ id: latest.id, coilId: latest.coilId, verdict: latest.verdict, decidedAt: latest.decidedAt, validUntil: latest.validUntil }];
  return known.clearanceCount === 0 ? [] : undefined;
}

/** Every failure, when all of them were read. */
function knownFailures(known: KnownStandingRecords | undefined): Pick<Failure, "occurredAt" | "mode">[] | undefined {
  if (!known || known.failures.length !== known.failureCount) return undefined;
  return known.failures.map(({ occurredAt, mode }) => ({ occurredAt, mode }));
}

/**
 * The newest loan not returned: the first such among loans read newest first (the statement below's order), or none
 * when every loan was read and none is out.
 */
function knownOpenLoan(known: KnownStandingRecords | undefined): OpenLoan[] | undefined {
  if (!known) return undefined;
  const open = known.loansNewestFirst.find((loan) => loan.returnedAt === null);
  if (open) return [{ id: open.id, borrower: open.borrower, event: open.event, expectedBackAt: open.expectedBackAt }];
  return known.loansNewestFirst.length === known.loanCount ? [] : undefined;
}

export async function readCoilStanding(
  scope: SiteScope,
  coilId: string,
  components: readonly ComponentRecord[],
  now: Date = new Date(),
  known?: KnownStandingRecords,
): Promise<CoilStanding> {
  const [clearances, failures, loans] = await Promise.all([
    knownLatestClearance(known) ??
      readRows<LatestClearance>(Prisma.sql`
      SELECT r.id, r."coilId", r.verdict, r."decidedAt", r."validUntil" FROM "Clearance" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId} ORDER BY r."decidedAt" DESC, r.id DESC LIMIT 1`),
    knownFailures(known) ??
      readRows<Pick<Failure, "occurredAt" | "mode">>(Prisma.sql`
      SELECT r."occurredAt", r.mode FROM "Failure" r JOIN "Coil" ON "Coil".id = r."coilId" WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId}`),
    knownOpenLoan(known) ??
      readRows<OpenLoan>(Prisma.sql`
      SELECT r.id, r.borrower, r.event, r."expectedBackAt" FROM "Loan" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${scope.siteId} AND r."returnedAt" IS NULL ORDER BY r."outAt" DESC, r.id DESC LIMIT 1`),
  ]);
  const loan = loans[0];
  return {
    clearance: describeClearanceState(clearances[0] ?? null, failures, findPartReplacements(components), now),
    activeLoan: loan ? { ...loan, overdue: loan.expectedBackAt.getTime() < now.getTime() } : null,
  };
}
