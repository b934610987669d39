/**
 * Clearance decisions. A decision is written once, with every rule result as evaluated on the server at
 * signing, the policy version and the checklist answers. There is deliberately no edit: a changed mind is a
 * new decision. The only later write is the lapse record (lapsedAt/lapseReason), made once: by the failure or part
 * change that causes it, in that write's transaction, or (for an expiry) when the decision page first sees it.
 * No view depends on that record: each works the state out on read (describeClearanceState).
 */
import { prisma, type Tx } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import { getCurrentPolicy } from "./policy";
import { computeClearanceExpiry, evaluateClearance, type ClearanceEvaluation, type ClearanceRuleResult } from "../calc/clearance-policy";
import { buildClearanceFacts, findPartReplacements, type ClearanceHistory } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { ClearanceDecisionInput } from "../validation/clearance";
import type { HealthStatus } from "../calc/coil-health";
import { getCoilFigures } from "./coil-summary";

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

/** The coil's full history as buildClearanceFacts reads it. */
export async function loadClearanceHistory(coilId: string): Promise<ClearanceHistory | null> {
  const [coil, components, sessions, sweeps, failures] = await Promise.all([
    prisma.coil.findUnique({ where: { id: coilId } }),
    prisma.component.findMany({ where: { coilId }, orderBy: { installedAt: "asc" } }),
    prisma.runSession.findMany({ where: { coilId }, orderBy: { startedAt: "asc" }, omit: { notes: true, createdAt: true } }),
    prisma.sweep.findMany({ where: { coilId }, orderBy: { takenAt: "asc" }, select: { id: true, takenAt: true, topLoadId: true, firstSeriesResonanceHz: true } }),
    prisma.failure.findMany({ where: { coilId }, select: { occurredAt: true, status: true, mode: true } }),
  ]);
  if (!coil) return null;
  const latest = sessions.at(-1);
  const latestSessionSamples = latest
    ? await prisma.heatSinkSample.findMany({ where: { sessionId: latest.id }, orderBy: { elapsedS: "asc" }, select: { elapsedS: true, temperatureC: true } })
    : [];
  return { coil, components, sessions, sweeps, failures, latestSessionSamples };
}

/** The policy, the facts and the evaluation for the signing page (or for the server's re-check). */
export async function evaluateCoilForClearance(coilId: string, checklist: Readonly<Record<string, boolean>>, now: Date) {
  const [policy, history] = await Promise.all([getCurrentPolicy(), loadClearanceHistory(coilId)]);
  if (!history) return null;
  const built = buildClearanceFacts(history, checklist, policy.rules);
  const evaluation: ClearanceEvaluation = evaluateClearance({ policy: policy.rules, facts: built.facts, now });
  return { policy, history, ...built, evaluation };
}

/**
 * Signs a decision. The rules are evaluated here again from the stored history and the submitted
 * checklist; "cleared" is refused while any rule fails. A refusal may always be recorded, with its reasons.
 */
export async function signClearance(actorId: string, input: ClearanceDecisionInput, now: Date = new Date()) {
  const evaluated = await evaluateCoilForClearance(input.coilId, input.checklist, now);
  if (!evaluated) throw new ClearanceRefusedError("That coil does not exist.");
  const { policy, evaluation } = evaluated;
  // A planned coil is not yet in service: it is never cleared, whatever its records say.
  if (input.verdict === "cleared" && (await prisma.coil.findUnique({ where: { id: input.coilId }, select: { status: true } }))?.status === "planned") {
    throw new ClearanceRefusedError("Cannot clear: the coil is only planned. Set it to active once it is built; a refusal may still be recorded.");
  }
  if (input.verdict === "cleared" && evaluation.verdict !== "pass") {
    const failed = evaluation.rules.filter((r) => !r.pass);
    throw new ClearanceRefusedError(describeClearRefusal(failed), failed);
  }
  const checklistRecord = policy.rules.requiredChecklist.map((item) => ({ ...item, answer: input.checklist[item.id] === true }));
  return prisma.$transaction(async (tx) => {
    const coil = await tx.coil.findUniqueOrThrow({ where: { id: input.coilId }, select: { tag: true } });
    const clearance = await tx.clearance.create({
      data: {
        coilId: input.coilId,
        policyId: policy.id,
        decidedById: actorId,
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
      actorId,
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

export async function getClearance(id: string) {
  const row = await prisma.clearance.findUnique({
    where: { id },
    include: { coil: { select: { id: true, tag: true, name: true, builderName: true, topology: true } }, decidedBy: { select: { name: true } }, policy: { select: { version: true } } },
  });
  if (!row) return null;
  return {
    ...row,
    rules: JSON.parse(row.ruleResultsJson) as ClearanceRuleResult[],
    checklist: JSON.parse(row.checklistJson) as StoredChecklistAnswer[],
  };
}

export function listClearances(filter: { coilId?: string } = {}, take = 100) {
  return prisma.clearance.findMany({
    where: { coilId: filter.coilId },
    orderBy: [{ decidedAt: "desc" }, { id: "desc" }],
    take,
    include: { coil: { select: { tag: true, name: true } }, decidedBy: { select: { name: true } }, policy: { select: { version: true } } },
  });
}

/** Where a coil stands for lending now: its latest decision read against failures and part replacements since. */
export async function getCoilClearanceState(coilId: string, now: Date = new Date()): Promise<ClearanceState> {
  const [latest, failures, components] = await Promise.all([
    prisma.clearance.findFirst({ where: { coilId }, orderBy: { decidedAt: "desc" }, select: { id: true, decidedAt: true, validUntil: true, verdict: true } }),
    prisma.failure.findMany({ where: { coilId }, select: { occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId }, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  return describeClearanceState(latest, failures, findPartReplacements(components), now);
}

/** The state of one given clearance (which may not be the coil's latest). */
export async function getClearanceStateById(clearanceId: string, now: Date = new Date()): Promise<ClearanceState | null> {
  const c = await prisma.clearance.findUnique({ where: { id: clearanceId }, select: { id: true, coilId: true, decidedAt: true, validUntil: true, verdict: true } });
  if (!c) return null;
  const [failures, components] = await Promise.all([
    prisma.failure.findMany({ where: { coilId: c.coilId }, select: { occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: c.coilId }, select: { id: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
  ]);
  return describeClearanceState(c, failures, findPartReplacements(components), now);
}

/**
 * Records a detected lapse once (lapsedAt/lapseReason) with an audit entry, in one transaction. The
 * conditional update makes a second detection a no-op, so the first record is never overwritten.
 */
export async function recordClearanceLapse(clearanceId: string, state: ClearanceState): Promise<boolean> {
  if (!isLapse(state)) return false;
  return serializableTransaction((tx) => writeLapse(tx, clearanceId, state, null));
}

/**
 * Records, inside the write that causes it (a failure, a part fitted or replaced), the lapse it brings to the
 * coil's latest clearance, so no view waits for someone to open the decision page before the lapse is stored.
 * An expiry moves with the clock alone: every view works it out on read (describeClearanceState).
 */
export async function recordLapseCausedByWrite(tx: Tx, coilId: string, actorId: string | null, now: Date = new Date()): Promise<boolean> {
  const latest = await tx.clearance.findFirst({
    where: { coilId },
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
  return writeLapse(tx, latest.id, state, actorId);
}

function isLapse(state: ClearanceState): boolean {
  return (state.kind === "expired" || state.kind === "lapsed-failure" || state.kind === "lapsed-part") && state.endedAt !== null;
}

async function writeLapse(tx: Tx, clearanceId: string, state: ClearanceState, actorId: string | null): Promise<boolean> {
  if (!isLapse(state) || !state.endedAt) return false;
  const result = await tx.clearance.updateMany({ where: { id: clearanceId, lapsedAt: null, verdict: "cleared" }, data: { lapsedAt: state.endedAt, lapseReason: state.explanation } });
  if (result.count === 0) return false;
  await recordAudit(tx, { actorId, action: "lapse", entity: "Clearance", entityId: clearanceId, summary: `Clearance ${state.label.toLowerCase()}`, detail: { reason: state.kind, explanation: state.explanation } });
  return true;
}

/**
 * Every decision, newest first, each with where it stands now, worked out on read exactly as the dashboard
 * and the decision page do (describeClearanceState), so no view depends on a lapse having been stored.
 */
export async function listClearancesWithState(now: Date = new Date(), take = 100) {
  const rows = await listClearances({}, take);
  const coilIds = [...new Set(rows.map((r) => r.coilId))];
  const [failures, components] = await Promise.all([
    prisma.failure.findMany({ where: { coilId: { in: coilIds } }, select: { coilId: true, occurredAt: true, mode: true } }),
    prisma.component.findMany({ where: { coilId: { in: coilIds } }, select: { id: true, coilId: true, kind: true, partNumber: true, installedAt: true, removedAt: true } }),
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
export async function getCoilHealthForClearance(coilId: string, now: Date = new Date()): Promise<{ status: HealthStatus; reasons: string[] } | null> {
  const policy = await getCurrentPolicy();
  const figures = (await getCoilFigures([coilId], policy, now)).get(coilId);
  return figures ? { status: figures.health, reasons: figures.reasons } : null;
}
