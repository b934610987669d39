/**
 * Clearance decisions. A decision is written once, with every rule result as evaluated on the server at
 * signing, the policy version and the checklist answers. There is deliberately no edit: a changed mind is a
 * new decision. The only later write is the lapse record (lapsedAt/lapseReason), made once: by the failure or part
 * change that causes it, in that write's transaction, or (for an expiry) when the decision page first sees it.
 * No view depends on that record: each works the state out on read (describeClearanceState).
 *
 * Every read is narrowed to the scope's site through the coil; a decision of another site is not found. The one
 * exception is the clearance sheet (getClearanceSheet): a site that borrowed the coil (Loan.borrowerSiteId) may read
 * the sheet of the clearance the loan went out under, and nothing else of the lending site.
 */
import { prisma, type Tx } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import { getCurrentPolicy } from "./policy";
import { computeClearanceExpiry, evaluateClearance, type ClearanceEvaluation, type ClearanceRuleResult } from "../calc/clearance-policy";
import { buildClearanceFacts, findPartReplacements, type ClearanceHistory } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceDecisionRecord, type ClearanceState } from "../analysis/clearance-state";
import type { ClearanceDecisionInput } from "../validation/clearance";
import type { HealthStatus } from "../calc/coil-health";
import { getCoilFigures } from "./coil-summary";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";

export class ClearanceRefusedError extends Error {
  constructor(
    message: string,
    readonly failedRules: ClearanceRuleResult[] = [],
  ) {
    super(message);
  }

  /** The checklist items left unticked (their rule ids are "checklist:<item id>"), for marking at the boxes. */
  get uncheckedItemIds(): string[] {
    return this.failedRules.filter((r) => r.id.startsWith("checklist:")).map((r) => r.id.slice("checklist:".length));
  }

  /** The recorded checks that failed, apart from the checklist: only these make a refusal the fitting decision. */
  get failedChecks(): ClearanceRuleResult[] {
    return this.failedRules.filter((r) => !r.id.startsWith("checklist:"));
  }
}

/**
 * One short summary of why "cleared" was refused. Unticked boxes alone are the steward's to tick, so no refusal
 * is suggested then; a refusal is offered only when a recorded check fails.
 */
export function describeClearRefusal(failed: readonly ClearanceRuleResult[]): string {
  const unticked = failed.filter((r) => r.id.startsWith("checklist:")).length;
  const checks = failed.length - unticked;
  const boxes = `${unticked} checklist item${unticked === 1 ? " is" : "s are"} not ticked`;
  if (checks === 0) return `Not signed: ${boxes}. Tick the marked items to clear the coil.`;
  const failing = `${checks} recorded check${checks === 1 ? " fails" : "s fail"}`;
  return `Not signed: ${failing}${unticked > 0 ? ` and ${boxes}` : ""}, so the coil cannot be cleared; record a refusal instead.`;
}

/** The coil's full history as buildClearanceFacts reads it; null for no such coil at the scope's site. */
export async function loadClearanceHistory(scope: SiteScope, coilId: string): Promise<ClearanceHistory | null> {
  const ofCoil = { coilId, ...recordOfSite(scope) };
  const [coil, components, sessions, sweeps, failures] = await Promise.all([
    prisma.coil.findUnique({ where: { id: coilId, ...coilOfSite(scope) } }),
    prisma.component.findMany({ where: ofCoil, orderBy: { installedAt: "asc" } }),
    prisma.runSession.findMany({ where: ofCoil, orderBy: { startedAt: "asc" }, omit: { notes: true, createdAt: true } }),
    prisma.sweep.findMany({ where: ofCoil, orderBy: { takenAt: "asc" }, select: { id: true, takenAt: true, topLoadId: true, firstSeriesResonanceHz: true } }),
    prisma.failure.findMany({ where: ofCoil, select: { occurredAt: true, status: true, mode: true } }),
  ]);
  if (!coil) return null;
  const latest = sessions.at(-1);
  const latestSessionSamples = latest
    ? await prisma.heatSinkSample.findMany({ where: { sessionId: latest.id, session: recordOfSite(scope) }, orderBy: { elapsedS: "asc" }, select: { elapsedS: true, temperatureC: true } })
    : [];
  return { coil, components, sessions, sweeps, failures, latestSessionSamples };
}

/** The site's effective policy, the facts and the evaluation for the signing page (or for the server's re-check). */
export async function evaluateCoilForClearance(scope: SiteScope, coilId: string, checklist: Readonly<Record<string, boolean>>, now: Date) {
  const [policy, history] = await Promise.all([getCurrentPolicy(scope), loadClearanceHistory(scope, coilId)]);
  if (!history) return null;
  const built = buildClearanceFacts(history, checklist, policy.rules);
  const evaluation: ClearanceEvaluation = evaluateClearance({ policy: policy.rules, facts: built.facts, now });
  return { policy, history, ...built, evaluation };
}

/**
 * Signs a decision. The rules are evaluated here again from the stored history and the submitted
 * checklist; "cleared" is refused while any rule fails. A refusal may always be recorded, with its reasons.
 */
export async function signClearance(scope: SiteScope, input: ClearanceDecisionInput, now: Date = new Date()) {
  const evaluated = await evaluateCoilForClearance(scope, input.coilId, input.checklist, now);
  if (!evaluated) throw new ClearanceRefusedError("That coil does not exist.");
  const { policy, evaluation } = evaluated;
  // A planned coil is not yet in service: it is never cleared, whatever its records say.
  if (input.verdict === "cleared" && (await prisma.coil.findUnique({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { status: true } }))?.status === "planned") {
    throw new ClearanceRefusedError("Cannot clear: the coil is only planned. Set it to active once it is built; a refusal may still be recorded.");
  }
  if (input.verdict === "cleared" && evaluation.verdict !== "pass") {
    const failed = evaluation.rules.filter((r) => !r.pass);
    throw new ClearanceRefusedError(describeClearRefusal(failed), failed);
  }
  const checklistRecord = policy.rules.requiredChecklist.map((item) => ({ ...item, answer: input.checklist[item.id] === true }));
  return prisma.$transaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { tag: true, siteId: true } });
    if (!coil) throw new ClearanceRefusedError("That coil does not exist.");
    const clearance = await tx.clearance.create({
      data: {
        coilId: input.coilId,
        // The row carrying the effective version (lib/db/policy.ts says why one number identifies it).
        policyId: policy.id,
        decidedById: scope.actorId,
        decidedAt: now,
        validUntil: computeClearanceExpiry(now, policy.rules),
        verdict: input.verdict,
        ruleResultsJson: JSON.stringify(evaluation.rules),
        checklistJson: JSON.stringify(checklistRecord),
        maxSupplyVoltageV: input.maxSupplyVoltageV ?? null,
        maxRunS: input.maxRunS ?? null,
        conditions: input.conditions,
      },
    });
    await recordAudit(tx, {
      siteId: coil.siteId,
      actorId: scope.actorId,
      action: "create",
      entity: "Clearance",
      entityId: clearance.id,
      summary: `${coil.tag}: ${input.verdict === "cleared" ? "cleared for lending" : "clearance refused"} under policy v${policy.version}`,
      detail: { failedRuleIds: evaluation.failedRuleIds },
    });
    return clearance;
  });
}

export interface StoredChecklistAnswer {
  id: string;
  text: string;
  source: string;
  answer: boolean;
}

const clearanceInclude = {
  coil: { select: { id: true, siteId: true, tag: true, name: true, builderName: true, topology: true, site: { select: { name: true } } } },
  decidedBy: { select: { name: true } },
  policy: { select: { version: true } },
} as const;

/** A decision of the scope's site's coils; null otherwise. */
export async function getClearance(scope: SiteScope, id: string) {
  const row = await prisma.clearance.findUnique({ where: { id, ...recordOfSite(scope) }, include: clearanceInclude });
  if (!row) return null;
  return {
    ...row,
    rules: JSON.parse(row.ruleResultsJson) as ClearanceRuleResult[],
    checklist: JSON.parse(row.checklistJson) as StoredChecklistAnswer[],
  };
}

export function listClearances(scope: SiteScope, filter: { coilId?: string } = {}, take = 100) {
  return prisma.clearance.findMany({
    where: { coilId: filter.coilId, ...recordOfSite(scope) },
    orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
    take,
    include: { coil: { select: { tag: true, name: true } }, decidedBy: { select: { name: true } }, policy: { select: { version: true } } },
  });
}

/** Where a coil stands for lending now: its latest decision read against failures and part replacements since. */
export async function getCoilClearanceState(scope: SiteScope, coilId: string, now: Date = new Date()): Promise<ClearanceState> {
  const ofCoil = { coilId, ...recordOfSite(scope) };
  const [latest, failures, components] = await Promise.all([
    prisma.clearance.findFirst({ where: ofCoil, orderBy: [{ decidedAt: "desc" }, { id: "desc" }], select: { id: true, decidedAt: true, validUntil: true, verdict: true } }),
    prisma.failure.findMany({ where: ofCoil, select: { occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: ofCoil, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  return describeClearanceState(latest, failures, findPartReplacements(components), now);
}

/** The state of one given clearance of the scope's site (which may not be the coil's latest). */
export async function getClearanceStateById(scope: SiteScope, clearanceId: string, now: Date = new Date()): Promise<ClearanceState | null> {
  const c = await prisma.clearance.findUnique({ where: { id: clearanceId, ...recordOfSite(scope) }, select: { id: true, coilId: true, decidedAt: true, validUntil: true, verdict: true } });
  return c ? describeStateOf(c, now) : null;
}

/** A decision's state from its coil's failures and part changes (the caller has found the decision in its reach). */
async function describeStateOf(c: ClearanceDecisionRecord & { coilId: string }, now: Date): Promise<ClearanceState> {
  const [failures, components] = await Promise.all([
    prisma.failure.findMany({ where: { coilId: c.coilId }, select: { occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: c.coilId }, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  return describeClearanceState(c, failures, findPartReplacements(components), now);
}

/**
 * The clearance sheet: the decision, where it stands now and the coil's health verdict, for the site that owns the
 * coil or a site that borrowed it under this very decision (a loan with borrowerSiteId = the scope's site and this
 * clearance). `viewer` says which; null for any other site. The borrowing site reads only what the sheet prints.
 */
export async function getClearanceSheet(scope: SiteScope, id: string, now: Date = new Date()) {
  const row = await prisma.clearance.findFirst({
    where: { id, OR: [recordOfSite(scope), { loans: { some: { borrowerSiteId: scope.siteId } } }] },
    include: clearanceInclude,
  });
  if (!row) return null;
  const viewer: "lending-site" | "borrowing-site" = row.coil.siteId === scope.siteId ? "lending-site" : "borrowing-site";
  // The coil is judged as its own site judges it, under that site's policy.
  const lending: SiteScope = { siteId: row.coil.siteId, actorId: scope.actorId };
  const [state, health] = await Promise.all([describeStateOf(row, now), getCoilHealthForClearance(lending, row.coilId, now)]);
  return {
    ...row,
    rules: JSON.parse(row.ruleResultsJson) as ClearanceRuleResult[],
    checklist: JSON.parse(row.checklistJson) as StoredChecklistAnswer[],
    state,
    health,
    viewer,
  };
}

/**
 * Records a detected lapse once (lapsedAt/lapseReason) with an audit entry, in one transaction. The
 * conditional update makes a second detection a no-op, so the first record is never overwritten.
 */
export async function recordClearanceLapse(scope: SiteScope, clearanceId: string, state: ClearanceState): Promise<boolean> {
  if (!isLapse(state)) return false;
  // No actor: the lapse happened (a failure, a part, the date); whoever opened the page only noticed it.
  return serializableTransaction((tx) => writeLapse(tx, { siteId: scope.siteId, actorId: null }, clearanceId, state));
}

/**
 * Records, inside the write that causes it (a failure, a part fitted or replaced), the lapse it brings to the
 * coil's latest clearance, so no view waits for someone to open the decision page before the lapse is stored.
 * An expiry moves with the clock alone: every view works it out on read (describeClearanceState).
 */
export async function recordLapseCausedByWrite(scope: SiteScope, tx: Tx, coilId: string, now: Date = new Date()): Promise<boolean> {
  const latest = await tx.clearance.findFirst({
    where: { coilId, ...recordOfSite(scope) },
    orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
    select: { id: true, decidedAt: true, validUntil: true, verdict: true, lapsedAt: true },
  });
  if (!latest || latest.verdict !== "cleared" || latest.lapsedAt !== null) return false;
  const [failures, components] = await Promise.all([
    tx.failure.findMany({ where: { coilId }, select: { occurredAt: true, mode: true } }),
    tx.component.findMany({ where: { coilId }, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  const state = describeClearanceState(latest, failures, findPartReplacements(components), now);
  if (state.kind !== "lapsed-failure" && state.kind !== "lapsed-part") return false;
  return writeLapse(tx, scope, latest.id, state);
}

function isLapse(state: ClearanceState): boolean {
  return (state.kind === "expired" || state.kind === "lapsed-failure" || state.kind === "lapsed-part") && state.endedAt !== null;
}

/** Writes the lapse of a decision of the scope's site (a decision of another site is left alone). */
async function writeLapse(tx: Tx, scope: SiteScope, clearanceId: string, state: ClearanceState): Promise<boolean> {
  if (!isLapse(state) || !state.endedAt) return false;
  const result = await tx.clearance.updateMany({
    where: { id: clearanceId, lapsedAt: null, verdict: "cleared", ...recordOfSite(scope) },
    data: { lapsedAt: state.endedAt, lapseReason: state.explanation },
  });
  if (result.count === 0) return false;
  await recordAudit(tx, { siteId: scope.siteId, actorId: scope.actorId, action: "lapse", entity: "Clearance", entityId: clearanceId, summary: `Clearance ${state.label.toLowerCase()}`, detail: { reason: state.kind, explanation: state.explanation } });
  return true;
}

/**
 * Every decision, newest first, each with where it stands now, worked out on read exactly as the dashboard
 * and the decision page do (describeClearanceState), so no view depends on a lapse having been stored.
 */
export async function listClearancesWithState(scope: SiteScope, now: Date = new Date(), take = 100) {
  const rows = await listClearances(scope, {}, take);
  const coilIds = [...new Set(rows.map((r) => r.coilId))];
  const [failures, components] = await Promise.all([
    prisma.failure.findMany({ where: { coilId: { in: coilIds }, ...recordOfSite(scope) }, select: { coilId: true, occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: { in: coilIds }, ...recordOfSite(scope) }, select: { id: true, coilId: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  const latestDecision = new Map<string, string>();
  for (const r of rows) if (!latestDecision.has(r.coilId)) latestDecision.set(r.coilId, r.id);
  return rows.map((r) => {
    const state = describeClearanceState(
      r,
      failures.filter((f) => f.coilId === r.coilId),
      findPartReplacements(components.filter((c) => c.coilId === r.coilId)),
      now,
    );
    return { ...r, state, superseded: latestDecision.get(r.coilId) !== r.id };
  });
}

/**
 * The coil's health verdict now, under the current policy: the one judgement the dashboard and the coil
 * page show (the stored summary, recomputed when stale), so a coil on watch is never cleared in silence.
 */
export async function getCoilHealthForClearance(scope: SiteScope, coilId: string, now: Date = new Date()): Promise<{ status: HealthStatus; reasons: string[] } | null> {
  const policy = await getCurrentPolicy(scope);
  const figures = (await getCoilFigures(scope, [coilId], policy, now)).get(coilId);
  return figures ? { status: figures.health, reasons: figures.reasons } : null;
}
