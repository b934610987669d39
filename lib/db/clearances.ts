/**
 * Clearance decisions. A decision is written once, with every rule result as evaluated on the server at
 * signing, the policy version and the checklist answers. There is deliberately no edit: a changed mind is a
 * new decision. The only later write is the lapse record (lapsedAt/lapseReason), made once when detected.
 */
import { prisma } from "./client";
import { recordAudit } from "./audit";
import { serializableTransaction } from "./serializable";
import { getCurrentPolicy } from "./policy";
import { computeClearanceExpiry, evaluateClearance, type ClearanceEvaluation, type ClearanceRuleResult } from "../calc/clearance-policy";
import { buildClearanceFacts, findPartReplacements, type ClearanceHistory } from "../analysis/clearance-facts";
import { describeClearanceState, type ClearanceState } from "../analysis/clearance-state";
import type { ClearanceDecisionInput } from "../validation/clearance";

export class ClearanceRefusedError extends Error {
  constructor(
    message: string,
    readonly failedRules: ClearanceRuleResult[] = [],
  ) {
    super(message);
  }
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
    throw new ClearanceRefusedError(`Cannot clear: ${failed.length} rule${failed.length === 1 ? "" : "s"} failed (${failed.map((r) => r.label).join("; ")}). You may record a refusal instead.`, failed);
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
    orderBy: { decidedAt: "desc" },
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
  if (state.kind !== "expired" && state.kind !== "lapsed-failure" && state.kind !== "lapsed-part") return false;
  if (!state.endedAt) return false;
  const endedAt = state.endedAt;
  return serializableTransaction(async (tx) => {
    const result = await tx.clearance.updateMany({ where: { id: clearanceId, lapsedAt: null, verdict: "cleared" }, data: { lapsedAt: endedAt, lapseReason: state.explanation } });
    if (result.count === 0) return false;
    await recordAudit(tx, { actorId: null, action: "lapse", entity: "Clearance", entityId: clearanceId, summary: `Clearance ${state.label.toLowerCase()}`, detail: { reason: state.kind, explanation: state.explanation } });
    return true;
  });
}
