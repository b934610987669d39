/** Failures and post-mortems: reads and writes, each narrowed to the scope's site through the failure's coil. */
import { prisma } from "./client";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma } from "./generated/client";
import { textContains } from "./text-search";
import type { FailureMode } from "./generated/enums";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { serializableTransaction } from "./serializable";
import { RecordRefusedError } from "./record-refused";
import { recordLapseCausedByWrite } from "./clearances";
import type { FailureInput, PostMortemInput } from "../validation/failure";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";

export async function listFailures(
  scope: SiteScope,
  filter: { q?: string; status?: "open" | "closed"; mode?: FailureMode } = {},
  pageRequest: Partial<PageRequest> = {},
) {
  const request = normalizePage(pageRequest);
  const where: Prisma.FailureWhereInput = {
    ...recordOfSite(scope),
    status: filter.status,
    mode: filter.mode,
    ...(filter.q ? { OR: [{ symptoms: textContains(filter.q) }, { rootCause: textContains(filter.q) }, { coil: { tag: textContains(filter.q) } }] } : {}),
  };
  const [rows, total] = await Promise.all([
    prisma.failure.findMany({
      where,
      orderBy: [{ occurredAt: "desc" }],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, component: { select: { partNumber: true, kind: true } } },
    }),
    prisma.failure.count({ where }),
  ]);
  return toPage(rows, total, request);
}

/**
 * Records a failure with an audit entry. The session and the failed part must belong to the coil,
 * and the part must have been fitted when the failure occurred. A failure recorded from a session
 * sets that session's outcome to "failed" in the same transaction.
 */
export async function createFailure(scope: SiteScope, input: FailureInput) {
  const actorId = scope.actorId;
  return prisma.$transaction(async (tx) => {
    const coil = await tx.coil.findUnique({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { id: true, tag: true, siteId: true } });
    if (!coil) throw new RecordRefusedError("coilId", "Coil: that coil does not exist.");
    if (input.sessionId) {
      const session = await tx.runSession.findUnique({ where: { id: input.sessionId }, select: { coilId: true, startedAt: true } });
      if (!session || session.coilId !== coil.id) throw new RecordRefusedError("sessionId", `Session: choose one of ${coil.tag}'s sessions.`);
      if (session.startedAt.getTime() > input.occurredAt.getTime()) {
        throw new RecordRefusedError("occurredAt", "Occurred at: the failure cannot come before the session started.");
      }
    }
    if (input.componentId) {
      const part = await tx.component.findUnique({ where: { id: input.componentId }, select: { coilId: true, installedAt: true, removedAt: true } });
      const fitted = part && part.installedAt <= input.occurredAt && (part.removedAt === null || part.removedAt > input.occurredAt);
      if (!part || part.coilId !== coil.id || !fitted) throw new RecordRefusedError("componentId", `Component: choose a part fitted to ${coil.tag} when the failure occurred.`);
    }
    const failure = await tx.failure.create({ data: { ...input, reportedById: actorId, status: "open" } });
    await markCoilChanged(tx, coil.id);
    await recordLapseCausedByWrite(scope, tx, coil.id);
    await recordAudit(tx, { siteId: coil.siteId, actorId, action: "create", entity: "Failure", entityId: failure.id, summary: `Recorded a ${input.mode} failure on ${coil.tag}`, detail: input });
    if (input.sessionId) {
      await tx.runSession.update({ where: { id: input.sessionId }, data: { outcome: "failed" } });
      await recordAudit(tx, { siteId: coil.siteId, actorId, action: "update", entity: "RunSession", entityId: input.sessionId, summary: `Outcome set to failed by failure ${failure.id}` });
    }
    return { ...failure, coilTag: coil.tag };
  });
}

/** A failure with its coil's parts, the session it came from and the sessions before it (with samples, for their margins). */
export async function getFailureDetail(scope: SiteScope, id: string, sessionsBefore = 5) {
  const failure = await prisma.failure.findUnique({
    where: { id, ...recordOfSite(scope) },
    include: {
      coil: { include: { components: { orderBy: { installedAt: "asc" } } } },
      component: true,
      replacementComponent: true,
      session: { select: { id: true, startedAt: true } },
      reportedBy: { select: { name: true } },
      closedBy: { select: { name: true } },
    },
  });
  if (!failure) return null;
  const recentSessions = await prisma.runSession.findMany({
    where: { coilId: failure.coilId, startedAt: { lte: failure.occurredAt }, ...recordOfSite(scope) },
    orderBy: { startedAt: "desc" },
    take: sessionsBefore,
    include: { samples: { orderBy: { elapsedS: "asc" }, select: { elapsedS: true, temperatureC: true } } },
  });
  return { ...failure, recentSessions: recentSessions.reverse() };
}

export type FailureDetail = NonNullable<Awaited<ReturnType<typeof getFailureDetail>>>;

/**
 * Completes a post-mortem in one transaction: closes the failure with its root cause and corrective
 * action and, when a replacement is given, creates it and marks the failed part removed and replaced
 * by it. Any refusal (already closed, part already replaced, replacement fitted before the failure)
 * rolls back everything, so nothing is half-written.
 */
export async function completePostMortem(scope: SiteScope, input: PostMortemInput) {
  const actorId = scope.actorId;
  return serializableTransaction(async (tx) => {
    const failure = await tx.failure.findUnique({ where: { id: input.failureId, ...recordOfSite(scope) }, include: { coil: { select: { tag: true, siteId: true } }, component: true } });
    if (!failure) throw new RecordRefusedError("failureId", "That failure does not exist.");
    if (failure.status === "closed") throw new RecordRefusedError("_form", "This post-mortem was already completed.", true);
    const closedAt = new Date();
    const mode = input.mode ?? failure.mode;
    const modeChanged = mode !== failure.mode;
    // Only while open: two stewards completing it at once must not both write a post-mortem (and a replacement).
    const closed = await tx.failure.updateMany({
      where: { id: failure.id, status: "open" },
      data: { mode, rootCause: input.rootCause, correctiveAction: input.correctiveAction, status: "closed", closedAt, closedById: actorId },
    });
    if (closed.count === 0) throw new RecordRefusedError("_form", "This post-mortem was completed by someone else just now.", true);
    await markCoilChanged(tx, failure.coilId);
    await recordAudit(tx, {
      siteId: failure.coil.siteId,
      actorId,
      action: "update",
      entity: "Failure",
      entityId: failure.id,
      summary: modeChanged
        ? `Completed the post-mortem of the failure on ${failure.coil.tag}; mode ${failure.mode.replace(/_/g, " ")} → ${mode.replace(/_/g, " ")}`
        : `Completed the post-mortem of the ${mode} failure on ${failure.coil.tag}`,
      detail: { rootCause: input.rootCause, correctiveAction: input.correctiveAction, ...(modeChanged ? { mode: { from: failure.mode, to: mode } } : {}) },
    });
    if (!input.replacement) return { failureId: failure.id, replacementId: null };

    const failed = failure.component;
    if (!failed) throw new RecordRefusedError("replacement.partNumber", "Replacement: this failure names no failed part to replace.");
    if (failed.removedAt !== null) throw new RecordRefusedError("replacement.partNumber", `Replacement: ${failed.partNumber} was already removed on ${failed.removedAt.toISOString().slice(0, 10)}.`, true);
    if (input.replacement.installedAt < failure.occurredAt) {
      throw new RecordRefusedError("replacement.installedAt", "Replacement fitted at: the replacement cannot be fitted before the failure occurred.");
    }
    const { installedAt, ...part } = input.replacement;
    const replacement = await tx.component.create({
      data: { ...part, coilId: failed.coilId, kind: failed.kind, switchType: failed.switchType, description: failed.description, installedAt },
    });
    const removed = await tx.component.updateMany({
      where: { id: failed.id, removedAt: null },
      data: { removedAt: installedAt, removalReason: `Failed (${mode.replace(/_/g, " ")}): ${input.rootCause}`.slice(0, 500), replacedById: replacement.id },
    });
    if (removed.count === 0) throw new RecordRefusedError("replacement.partNumber", `Replacement: ${failed.partNumber} was replaced by someone else just now.`, true);
    await tx.failure.update({ where: { id: failure.id }, data: { replacementComponentId: replacement.id } });
    await recordLapseCausedByWrite(scope, tx, failure.coilId);
    await recordAudit(tx, {
      siteId: failure.coil.siteId,
      actorId,
      action: "create",
      entity: "Component",
      entityId: replacement.id,
      summary: `${failure.coil.tag}: fitted ${replacement.partNumber} in place of failed ${failed.partNumber}`,
      detail: { replaces: failed.id, failureId: failure.id, ...part },
    });
    return { failureId: failure.id, replacementId: replacement.id };
  });
}
