/**
 * Loans: reads and writes. A coil goes out only with a clearance that stands now and only when it is not
 * already out; both are checked inside a serializable lending transaction, so two stewards lending it at the
 * same moment cannot both pass the check (test/concurrent-writers.test.ts).
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

export type LoanRefusalReason = Exclude<ClearanceStateKind, "valid"> | "already-out" | "no-coil" | "bad-date" | "planned";

export class LoanRefusedError extends Error {
  constructor(
    readonly reason: LoanRefusalReason | "not-found" | "already-returned" | "bad-session",
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

export async function listLoans(filter: { state?: "out" | "returned" | "overdue" | "all" } = {}, pageRequest: Partial<PageRequest> = {}, now: Date = new Date()) {
  const request = normalizePage(pageRequest);
  const where: Prisma.LoanWhereInput =
    filter.state === "out"
      ? { returnedAt: null }
      : filter.state === "overdue"
        ? { returnedAt: null, expectedBackAt: { lt: now } }
        : filter.state === "returned"
          ? { returnedAt: { not: null } }
          : {};
  const [rows, total] = await Promise.all([
    prisma.loan.findMany({
      where,
      orderBy: [{ outAt: "desc" }],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, lentBy: { select: { name: true } } },
    }),
    prisma.loan.count({ where }),
  ]);
  return toPage(rows, total, request);
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
export async function listLoansNeedingRecall(now: Date = new Date()): Promise<RecallNotice[]> {
  const out = await prisma.loan.findMany({
    where: { returnedAt: null },
    orderBy: [{ outAt: "asc" }, { id: "asc" }],
    select: { id: true, coilId: true, borrower: true, event: true, coil: { select: { tag: true } } },
  });
  if (out.length === 0) return [];
  const coilIds = [...new Set(out.map((l) => l.coilId))];
  const [clearances, failures, components] = await Promise.all([
    prisma.clearance.findMany({
      where: { coilId: { in: coilIds } },
      orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
      select: { id: true, coilId: true, decidedAt: true, validUntil: true, verdict: true },
    }),
    prisma.failure.findMany({ where: { coilId: { in: coilIds } }, select: { coilId: true, occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: { in: coilIds } }, select: { id: true, coilId: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
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

export function getLoan(id: string) {
  return prisma.loan.findUnique({
    where: { id },
    include: {
      coil: { select: { id: true, tag: true, name: true } },
      lentBy: { select: { name: true } },
      receivedBy: { select: { name: true } },
      sessions: { select: { id: true, startedAt: true, durationS: true } },
    },
  });
}

/** A loan with what its handover sheet prints: the coil, who lent it and the clearance it went out under. */
export function getLoanHandover(id: string) {
  return prisma.loan.findUnique({
    where: { id },
    include: {
      coil: { select: { tag: true, name: true } },
      lentBy: { select: { name: true } },
      clearance: { select: { decidedAt: true, validUntil: true, maxSupplyVoltageV: true, maxRunS: true, conditions: true, policy: { select: { version: true } } } },
    },
  });
}

/** Sessions of the loan's coil between going out and `until`, offered when it comes back. */
export function listSessionsInLoanWindow(loan: { coilId: string; outAt: Date }, until: Date) {
  return prisma.runSession.findMany({
    where: { coilId: loan.coilId, startedAt: { gte: loan.outAt, lte: until } },
    orderBy: { startedAt: "asc" },
    select: { id: true, startedAt: true, durationS: true, supplyVoltageV: true, outcome: true, loanId: true },
  });
}

export async function createLoan(actorId: string, input: LoanCreateInput, now: Date = new Date()) {
  if (input.expectedBackAt.getTime() <= now.getTime()) {
    throw new LoanRefusedError("bad-date", "Expected back: the date must be in the future.", "expectedBackAt");
  }
  return serializableTransaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: input.coilId }, select: { id: true, tag: true, status: true } });
    if (!coil) throw new LoanRefusedError("no-coil", "That coil does not exist.");
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
        event: input.event,
        outAt: now,
        expectedBackAt: input.expectedBackAt,
        lentById: actorId,
      },
    });
    await recordAudit(tx, { actorId, action: "create", entity: "Loan", entityId: loan.id, summary: `${coil.tag} lent to ${input.borrower} for ${input.event}`, detail: { clearanceId: latest.id } });
    return loan;
  });
}

export async function returnLoan(actorId: string, input: LoanReturnInput, now: Date = new Date()) {
  return serializableTransaction(async (tx) => {
    const loan = await tx.loan.findUnique({ where: { id: input.loanId }, include: { coil: { select: { tag: true } } } });
    if (!loan) throw new LoanRefusedError("not-found", "That loan does not exist.");
    if (loan.returnedAt) throw new LoanRefusedError("already-returned", `This loan was already returned on ${loan.returnedAt.toISOString().slice(0, 10)}.`);
    if (input.returnedAt.getTime() < loan.outAt.getTime()) throw new LoanRefusedError("bad-date", "Returned at: cannot be before the coil went out.", "returnedAt");
    if (input.returnedAt.getTime() > now.getTime() + 60_000) throw new LoanRefusedError("bad-date", "Returned at: cannot be in the future.", "returnedAt");
    if (input.sessionIds.length > 0) {
      const ok = await tx.runSession.count({
        where: { id: { in: input.sessionIds }, coilId: loan.coilId, startedAt: { gte: loan.outAt, lte: input.returnedAt } },
      });
      if (ok !== new Set(input.sessionIds).size) throw new LoanRefusedError("bad-session", "Sessions: only this coil's sessions run while it was away can be linked.", "sessionIds");
      await tx.runSession.updateMany({ where: { id: { in: input.sessionIds } }, data: { loanId: loan.id } });
      await markCoilChanged(tx, loan.coilId);
    }
    // Only while still out: a second steward receiving it at the same moment must not overwrite the first's record.
    const written = await tx.loan.updateMany({
      where: { id: loan.id, returnedAt: null },
      data: { returnedAt: input.returnedAt, returnCondition: input.returnCondition, returnNotes: input.returnNotes || null, receivedById: actorId },
    });
    if (written.count === 0) throw new LoanRefusedError("already-returned", "This loan was returned by someone else just now.");
    const updated = await tx.loan.findUniqueOrThrow({ where: { id: loan.id } });
    await recordAudit(tx, {
      actorId,
      action: "update",
      entity: "Loan",
      entityId: loan.id,
      summary: `${loan.coil.tag} returned by ${loan.borrower}`,
      detail: { returnCondition: input.returnCondition, sessions: input.sessionIds.length },
    });
    return updated;
  });
}
