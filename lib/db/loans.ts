/**
 * Loans: reads and writes. A coil goes out only with a clearance that stands now and only when it is not
 * already out; both are checked inside a serializable lending transaction, so two stewards lending it at the
 * same moment cannot both pass the check (test/concurrent-writers.test.ts).
 *
 * Loans belong to the coil's site (the lending site): every read and write is narrowed to it. A coil may be lent to
 * another site's event (Loan.borrowerSiteId); that site then reads the loan's handover sheet and its list of loans
 * borrowed from other sites (listBorrowedLoans), and, through lib/db/clearances.ts getClearanceSheet, the clearance
 * the loan went out under. Nothing else of the lending site: its coil, sessions, failures stay not found.
 */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { serializableTransaction } from "./serializable";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";
import { describeClearanceState, describeLendingBlock, describeRecallNeed, type ClearanceState, type ClearanceStateKind } from "../analysis/clearance-state";
import { findPartReplacements } from "../analysis/clearance-facts";
import type { LoanCreateInput, LoanReturnInput } from "../validation/loan";
import { recordOfSite, type SiteScope } from "./site-scope";

export type LoanRefusalReason = Exclude<ClearanceStateKind, "valid"> | "already-out" | "no-coil" | "bad-date" | "planned" | "bad-site";

export class LoanRefusedError extends Error {
  constructor(
    readonly reason: LoanRefusalReason | "not-found" | "already-returned" | "bad-session",
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

export type LoanStateFilter = "out" | "returned" | "overdue" | "all";

function loanStateWhere(state: LoanStateFilter | undefined, now: Date): Prisma.LoanWhereInput {
  return state === "out"
    ? { returnedAt: null }
    : state === "overdue"
      ? { returnedAt: null, expectedBackAt: { lt: now } }
      : state === "returned"
        ? { returnedAt: { not: null } }
        : {};
}

/** The scope's site's loans (its own coils lent out, to anyone), newest first. */
export async function listLoans(scope: SiteScope, filter: { state?: LoanStateFilter } = {}, pageRequest: Partial<PageRequest> = {}, now: Date = new Date()) {
  const request = normalizePage(pageRequest);
  const where: Prisma.LoanWhereInput = { ...loanStateWhere(filter.state, now), ...recordOfSite(scope) };
  const [rows, total] = await Promise.all([
    prisma.loan.findMany({
      where,
      orderBy: [{ outAt: "desc" }, { id: "desc" }],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, lentBy: { select: { name: true } }, borrowerSite: { select: { name: true } } },
    }),
    prisma.loan.count({ where }),
  ]);
  return toPage(rows, total, request);
}

/**
 * Loans of other sites' coils to the scope's site, newest first: what the loan's sheet shows and where the
 * clearance it went out under stands now (worked out from the lending coil's failures and part changes, as the
 * lending site sees it, so the borrowers know when to send it back). Only these columns leave the lending site.
 */
export async function listBorrowedLoans(scope: SiteScope, filter: { state?: LoanStateFilter } = {}, now: Date = new Date()) {
  const rows = await prisma.loan.findMany({
    where: { ...loanStateWhere(filter.state, now), borrowerSiteId: scope.siteId },
    orderBy: [{ outAt: "desc" }, { id: "desc" }],
    take: 100,
    select: {
      id: true,
      clearanceId: true,
      borrower: true,
      event: true,
      outAt: true,
      expectedBackAt: true,
      returnedAt: true,
      coilId: true,
      coil: { select: { tag: true, name: true, site: { select: { name: true } } } },
    },
  });
  if (rows.length === 0) return [];
  const coilIds = [...new Set(rows.map((r) => r.coilId))];
  const clearanceIds = [...new Set(rows.map((r) => r.clearanceId))];
  const [clearances, failures, components] = await Promise.all([
    prisma.clearance.findMany({ where: { id: { in: clearanceIds } }, select: { id: true, decidedAt: true, validUntil: true, verdict: true } }),
    prisma.failure.findMany({ where: { coilId: { in: coilIds } }, select: { coilId: true, occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: { in: coilIds } }, select: { id: true, coilId: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  return rows.map(({ coilId, coil, ...loan }) => {
    const state = describeClearanceState(
      clearances.find((c) => c.id === loan.clearanceId) ?? null,
      failures.filter((f) => f.coilId === coilId),
      findPartReplacements(components.filter((c) => c.coilId === coilId)),
      now,
    );
    return { ...loan, coil: { tag: coil.tag, name: coil.name }, lendingSite: coil.site.name, clearanceState: state };
  });
}

/** The sites a steward may lend to: every site but the scope's own, by name. */
export function listBorrowerSites(scope: SiteScope) {
  return prisma.site.findMany({ where: { id: { not: scope.siteId } }, orderBy: { name: "asc" }, select: { id: true, name: true } });
}

export interface RecallNotice {
  loanId: string;
  coilTag: string;
  borrower: string;
  event: string;
  state: ClearanceState;
  /** "Recall it: failure recorded (…) on … UTC; needs a new clearance before lending." */
  instruction: string;
}

/**
 * Coils out on loan whose clearance no longer stands now (a failure, a part change or expiry since it was
 * signed), judged from the coil's latest decision exactly as the dashboard judges it. The steward recalls them.
 */
export async function listLoansNeedingRecall(scope: SiteScope, now: Date = new Date()): Promise<RecallNotice[]> {
  const out = await prisma.loan.findMany({
    where: { returnedAt: null, ...recordOfSite(scope) },
    orderBy: [{ outAt: "asc" }, { id: "asc" }],
    select: { id: true, coilId: true, borrower: true, event: true, coil: { select: { tag: true } } },
  });
  if (out.length === 0) return [];
  const coilIds = [...new Set(out.map((l) => l.coilId))];
  const [clearances, failures, components] = await Promise.all([
    prisma.clearance.findMany({
      where: { coilId: { in: coilIds }, ...recordOfSite(scope) },
      orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
      select: { id: true, coilId: true, decidedAt: true, validUntil: true, verdict: true },
    }),
    prisma.failure.findMany({ where: { coilId: { in: coilIds }, ...recordOfSite(scope) }, select: { coilId: true, occurredAt: true, mode: true } }),
    prisma.component.findMany({
      where: { coilId: { in: coilIds }, ...recordOfSite(scope) },
      select: { id: true, coilId: true, kind: true, partNumber: true, installedAt: true, removedAt: true },
    }),
  ]);
  return out.flatMap((loan) => {
    const latest = clearances.find((c) => c.coilId === loan.coilId) ?? null;
    const state = describeClearanceState(
      latest,
      failures.filter((f) => f.coilId === loan.coilId),
      findPartReplacements(components.filter((c) => c.coilId === loan.coilId)),
      now,
    );
    const instruction = describeRecallNeed(state);
    return instruction === null ? [] : [{ loanId: loan.id, coilTag: loan.coil.tag, borrower: loan.borrower, event: loan.event, state, instruction }];
  });
}

/** A loan of the scope's site's coils (what the return page reads); null otherwise. */
export function getLoan(scope: SiteScope, id: string) {
  return prisma.loan.findUnique({
    where: { id, ...recordOfSite(scope) },
    include: {
      coil: { select: { id: true, tag: true, name: true } },
      lentBy: { select: { name: true } },
      receivedBy: { select: { name: true } },
      sessions: { select: { id: true, startedAt: true, durationS: true } },
    },
  });
}

/**
 * A loan with what its handover sheet prints: the coil, who lent it and the clearance it went out under. Read by
 * the lending site and by the site it was lent to (`viewer` says which); null for any other site.
 */
export async function getLoanHandover(scope: SiteScope, id: string) {
  const loan = await prisma.loan.findFirst({
    where: { id, OR: [recordOfSite(scope), { borrowerSiteId: scope.siteId }] },
    include: {
      coil: { select: { tag: true, name: true, siteId: true, site: { select: { name: true } } } },
      borrowerSite: { select: { name: true } },
      lentBy: { select: { name: true } },
      clearance: { select: { id: true, decidedAt: true, validUntil: true, maxSupplyVoltageV: true, maxRunS: true, conditions: true, policy: { select: { version: true } } } },
    },
  });
  if (!loan) return null;
  const viewer: "lending-site" | "borrowing-site" = loan.coil.siteId === scope.siteId ? "lending-site" : "borrowing-site";
  return { ...loan, viewer };
}

/** Sessions of the loan's coil between going out and `until`, offered when it comes back. */
export function listSessionsInLoanWindow(scope: SiteScope, loan: { coilId: string; outAt: Date }, until: Date) {
  return prisma.runSession.findMany({
    where: { coilId: loan.coilId, startedAt: { gte: loan.outAt, lte: until }, ...recordOfSite(scope) },
    orderBy: { startedAt: "asc" },
    select: { id: true, startedAt: true, durationS: true, supplyVoltageV: true, outcome: true, loanId: true },
  });
}

/**
 * Lends one of the scope's site's coils. With `borrowerSiteId`, to another site's event: that site must exist and not
 * be the lending site (a loan within the site is an ordinary loan).
 */
export async function createLoan(scope: SiteScope, input: LoanCreateInput, now: Date = new Date()) {
  if (input.expectedBackAt.getTime() <= now.getTime()) {
    throw new LoanRefusedError("bad-date", "Expected back: the date must be in the future.", "expectedBackAt");
  }
  const borrowerSiteId = input.borrowerSiteId ?? null;
  if (borrowerSiteId === scope.siteId) {
    throw new LoanRefusedError("bad-site", "Borrowing site: this is the coil's own site; leave it empty for a loan within the site.", "borrowerSiteId");
  }
  return serializableTransaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: input.coilId, siteId: scope.siteId }, select: { id: true, tag: true, status: true, siteId: true } });
    if (!coil) throw new LoanRefusedError("no-coil", "That coil does not exist.");
    const borrowerSite = borrowerSiteId ? await tx.site.findUnique({ where: { id: borrowerSiteId }, select: { name: true } }) : null;
    if (borrowerSiteId && !borrowerSite) throw new LoanRefusedError("bad-site", "Borrowing site: choose one of the sites listed.", "borrowerSiteId");
    // A planned coil is not yet in service: whatever its record says, it is not lent.
    if (coil.status === "planned") throw new LoanRefusedError("planned", `${coil.tag} is only planned; set it to active once it is built and cleared.`);
    const out = await tx.loan.findFirst({ where: { coilId: coil.id, returnedAt: null }, select: { borrower: true, expectedBackAt: true } });
    if (out) throw new LoanRefusedError("already-out", `${coil.tag} is already out on loan to ${out.borrower}; it must be returned first.`);
    const [latest, failures, components] = await Promise.all([
      tx.clearance.findFirst({ where: { coilId: coil.id }, orderBy: { decidedAt: "desc" }, select: { id: true, decidedAt: true, validUntil: true, verdict: true } }),
      tx.failure.findMany({ where: { coilId: coil.id }, select: { occurredAt: true, mode: true } }),
      tx.component.findMany({ where: { coilId: coil.id }, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
    ]);
    const state = describeClearanceState(latest, failures, findPartReplacements(components), now);
    const block = describeLendingBlock(state);
    if (block !== null || !latest) {
      throw new LoanRefusedError(state.kind === "valid" ? "none" : state.kind, block ?? "This coil has no valid clearance.");
    }
    if (state.validUntil && input.expectedBackAt.getTime() > state.validUntil.getTime()) {
      throw new LoanRefusedError("bad-date", `Expected back: the clearance runs out before then; pick a date on or before its end.`, "expectedBackAt");
    }
    const loan = await tx.loan.create({
      data: {
        coilId: coil.id,
        clearanceId: latest.id,
        borrower: input.borrower,
        borrowerContact: input.borrowerContact,
        borrowerSiteId,
        event: input.event,
        outAt: now,
        expectedBackAt: input.expectedBackAt,
        lentById: scope.actorId,
      },
    });
    await recordAudit(tx, {
      siteId: coil.siteId,
      actorId: scope.actorId,
      action: "create",
      entity: "Loan",
      entityId: loan.id,
      summary: `${coil.tag} lent to ${input.borrower}${borrowerSite ? ` (${borrowerSite.name})` : ""} for ${input.event}`,
      detail: { clearanceId: latest.id, ...(borrowerSiteId ? { borrowerSiteId } : {}) },
    });
    return loan;
  });
}

/** Takes back a loan of the scope's site's coils (the lending site receives it; a borrowing site cannot). */
export async function returnLoan(scope: SiteScope, input: LoanReturnInput, now: Date = new Date()) {
  return serializableTransaction(async (tx) => {
    const loan = await tx.loan.findUnique({ where: { id: input.loanId, ...recordOfSite(scope) }, include: { coil: { select: { tag: true, siteId: true } } } });
    if (!loan) throw new LoanRefusedError("not-found", "That loan does not exist.");
    if (loan.returnedAt) throw new LoanRefusedError("already-returned", `This loan was already returned on ${loan.returnedAt.toISOString().slice(0, 10)}.`);
    if (input.returnedAt.getTime() < loan.outAt.getTime()) throw new LoanRefusedError("bad-date", "Returned at: cannot be before the coil went out.", "returnedAt");
    if (input.returnedAt.getTime() > now.getTime() + 60_000) throw new LoanRefusedError("bad-date", "Returned at: cannot be in the future.", "returnedAt");
    if (input.sessionIds.length > 0) {
      const ok = await tx.runSession.count({
        where: { id: { in: input.sessionIds }, coilId: loan.coilId, startedAt: { gte: loan.outAt, lte: input.returnedAt }, ...recordOfSite(scope) },
      });
      if (ok !== new Set(input.sessionIds).size) throw new LoanRefusedError("bad-session", "Sessions: only this coil's sessions run while it was away can be linked.", "sessionIds");
      await tx.runSession.updateMany({ where: { id: { in: input.sessionIds } }, data: { loanId: loan.id } });
      await markCoilChanged(tx, loan.coilId);
    }
    // Only while still out: a second steward receiving it at the same moment must not overwrite the first's record.
    const written = await tx.loan.updateMany({
      where: { id: loan.id, returnedAt: null },
      data: { returnedAt: input.returnedAt, returnCondition: input.returnCondition, returnNotes: input.returnNotes || null, receivedById: scope.actorId },
    });
    if (written.count === 0) throw new LoanRefusedError("already-returned", "This loan was returned by someone else just now.");
    const updated = await tx.loan.findUniqueOrThrow({ where: { id: loan.id } });
    await recordAudit(tx, {
      siteId: loan.coil.siteId,
      actorId: scope.actorId,
      action: "update",
      entity: "Loan",
      entityId: loan.id,
      summary: `${loan.coil.tag} returned by ${loan.borrower}`,
      detail: { returnCondition: input.returnCondition, sessions: input.sessionIds.length },
    });
    return updated;
  });
}
